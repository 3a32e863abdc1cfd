#pragma once
// The fictional model shared by the probabilistic tests: strike-slip stress from gradients at
// 3 km (Sv 75, SHmax 90, Shmin 51, p0 30 MPa; SHmax at 45°) and a formation with
// k = 2e-14 m², h = 50 m, φ = 0.12, c_t = 1.5e-9 1/Pa, μ = 4e-4 Pa·s; every input fixed.
// Invented numbers, for tests only.
#include <numbers>

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

}  // namespace slipscreen::probabilistic::test
