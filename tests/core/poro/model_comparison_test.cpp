// The three pressure models on one case (docs/physics.md, "The three models on one case"): a
// well injecting 10 000 bbl/d for 5 years into a 100 m layer, a basement fault 5 km away and
// 1 km below the layer. Invented numbers (those of the fictional regions/corran example).
// With SLIPSCREEN_COMPARISON_CSV=path the rows are written there (docs/physics/
// model_comparison.csv comes from this test).
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <numbers>
#include <vector>

#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/hydro/hantush.hpp"
#include "core/hydro/rate_history.hpp"
#include "core/hydro/theis.hpp"
#include "core/poro/fault_screen.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;

TEST_CASE("model comparison: Theis, leaky and the 3-D model at a fault 5 km away and 1 km below") {
  constexpr double kDeg = std::numbers::pi / 180.0, day = 86400.0, year = 365.25 * day;
  const double mD = 9.869233e-16;
  const double q = 10000.0 * 0.158987294928 / day;  // 10 000 bbl/d in m³/s (1 bbl = 0.158987294928 m³)
  const hydro::RateHistory history({0.0, 5.0 * year}, {q, 0.0});
  const std::vector<hydro::RateChange> changes = history.changes();
  // the solid (regions/corran/region.toml) and its layer
  poro::PoroelasticMedium m{6e9, 0.2, 0.33, 0.8, 10.0 * mD, 0.5e-3};
  const poro::RudnickiConstants k = poro::rudnicki_constants(m);
  const double h = 100.0, top = 1900.0, bottom = 2000.0, r = 5000.0, z = bottom + 1000.0;
  // Theis with the same storage (φ c_t = κ/c, so D = c) and the leaky layer with B from an
  // aquitard 20 m thick of 1e-4 mD (Hantush & Jacob 1955)
  hydro::TheisParameters theis{k.diffusivity, m.viscosity / (4.0 * std::numbers::pi * m.permeability * h), 0.0};
  const double B = hydro::leakage_factor(m.permeability, h, 20.0, 1e-4 * mD);
  hydro::TheisParameters leaky = theis;
  leaky.leakage_rate = theis.diffusivity / (B * B);
  // the fault: vertical, striking 30° from SHmax (well oriented for strike-slip), stress of the
  // example region's gradients at its depth
  const geomech::AndersonianStress st{25e3 * z, 31e3 * z, 17e3 * z, 60.0 * kDeg, 10e3 * z};
  const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(90.0 * kDeg, 90.0 * kDeg);
  const geomech::ResolvedStress res = geomech::resolve(geomech::stress_tensor_ned(st), st.pore_pressure, plane);
  const double mu = 0.6;
  poro::InjectionSource well;
  well.points = poro::open_interval_points(0.0, 0.0, top, bottom, 6);
  well.changes = changes;
  // 5 km to the north-east (so the line from the well is oblique to the plane: a fault in line
  // with the well or facing it would carry no shear change from the radial field), 1 km below
  const Eigen::Vector3d fault(r * std::sqrt(0.5), r * std::sqrt(0.5), z);

  std::ofstream csv;
  if (const char* path = std::getenv("SLIPSCREEN_COMPARISON_CSV")) {
    csv.open(path);
    REQUIRE(csv.good());
    csv << "# FICTIONAL case (docs/physics.md): 10000 bbl/d for 5 years into a 100 m layer at 1900-2000 m; "
           "a vertical fault striking east 5 km north-east at 3000 m; MPa\n";
    csv << "time_days,dp_theis,dp_leaky,dp_3d,dcff_theis,dcff_leaky,dcff_3d,dtau_3d,dsigma_n_3d\n";
    csv.precision(6);
  }
  std::vector<double> times;
  for (double lt = std::log10(10.0); lt <= std::log10(20.0 * 365.25) + 1e-9; lt += 0.125)
    times.push_back(std::pow(10.0, lt) * day);
  bool stress_first = false;
  double dp3_max = 0.0, dp_theis_max = 0.0;
  for (double t : times) {
    const auto theis_at = [&](const hydro::TheisParameters& p) {
      return hydro::superpose_in_time(changes, t, [&](double tau) { return hydro::theis_unit_response(p, r, tau); });
    };
    const double dp_t = theis_at(theis), dp_l = theis_at(leaky);
    const poro::PointResponse pr = poro::superposed_response(k, std::span(&well, 1), fault, t);
    const poro::CoulombChange c = poro::coulomb_change(pr.dstress, pr.dp, plane.normal(), res.slip_direction, mu);
    CAPTURE(t / day);
    CHECK(dp_l <= dp_t * (1.0 + 1e-12));  // W(u, r/B) ≤ E1(u) (Hantush & Jacob 1955)
    CHECK(std::fabs(c.dcff - (c.dtau - mu * (c.dsigma_n - c.dp))) <= 1e-9 * (std::fabs(c.dtau) + std::fabs(c.dp)));
    if (t < 60.0 * day && std::fabs(c.dcff) > 1e3 * std::fabs(mu * c.dp)) stress_first = true;
    dp3_max = std::max(dp3_max, c.dp);
    dp_theis_max = std::max(dp_theis_max, dp_t);
    if (csv.is_open())
      csv << t / day << "," << dp_t / 1e6 << "," << dp_l / 1e6 << "," << c.dp / 1e6 << "," << mu * dp_t / 1e6 << ","
          << mu * dp_l / 1e6 << "," << c.dcff / 1e6 << "," << c.dtau / 1e6 << "," << c.dsigma_n / 1e6 << "\n";
  }
  // what the comparison shows, each a check that can fail: the 3-D model loads the fault by stress
  // before the pressure arrives, and spreads the fluid in three dimensions, so its Δp below the
  // layer is far below the confined layer's
  CHECK(stress_first);
  CHECK(dp3_max < 0.1 * dp_theis_max);
  if (csv.is_open()) CHECK(csv.good());
}
