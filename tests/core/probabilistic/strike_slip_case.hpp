#pragma once
// The fictional model shared by the probabilistic tests: strike-slip stress from gradients at
// 3 km (Sv 75, SHmax 90, Shmin 51, p0 30 MPa; SHmax at 45°) and a formation with
// k = 2e-14 m², h = 50 m, φ = 0.12, c_t = 1.5e-9 1/Pa, μ = 4e-4 Pa·s; every input fixed.
// Invented numbers, for tests only.
#include <numbers>
#include <vector>

#include "core/probabilistic/screen_inputs.hpp"

namespace slipscreen::probabilistic::test {

inline UncertainModel strike_slip_model() {
  using stats::Distribution;
  UncertainModel model;
  model.depth = 3000.0;
  model.vertical_gradient = Distribution::fixed(25e3);
  model.pore_pressure_gradient = Distribution::fixed(10e3);
  model.shmax_gradient = Distribution::fixed(30e3);
  model.shmin_gradient = Distribution::fixed(17e3);
  model.shmax_azimuth = Distribution::fixed(45 * std::numbers::pi / 180.0);
  model.permeability = Distribution::fixed(2e-14);
  model.thickness = Distribution::fixed(50.0);
  model.porosity = Distribution::fixed(0.12);
  model.total_compressibility = Distribution::fixed(1.5e-9);
  model.viscosity = Distribution::fixed(4e-4);
  return model;
}

// Fictional layout: one well injecting 0.05 m³/s for 6 years, then shut in; three fault segments
// at 1.5, 4 and 12 km (three check points each, strike 15°, dip 80°, near-optimal for SHmax at 45°
// and μ = 0.6); monthly (30-day) tracking for 10 years, outputs at years 1, 3, 6 and 10.
inline void three_segment_layout(std::vector<WellInput>& wells, std::vector<SegmentInput>& segments,
                                 RunSettings& settings) {
  constexpr double day = 86400.0, deg = std::numbers::pi / 180.0;
  WellInput w;
  w.id = "W1";
  w.steps.time = {0.0, 6 * 365 * day};
  w.steps.delta_rate = {0.05, -0.05};
  wells.push_back(w);
  for (double r : {1500.0, 4000.0, 12000.0}) {
    SegmentInput s;
    s.check_points = {{r, -200.0}, {r, 0.0}, {r, 200.0}};
    s.strike = 15 * deg;
    s.dip = 80 * deg;
    s.fault = segments.size();
    segments.push_back(s);
  }
  for (int m = 1; m <= 120; ++m) settings.tracking_times.push_back(m * 30 * day);
  settings.output_index = {11, 35, 71, 119};
}

}  // namespace slipscreen::probabilistic::test
