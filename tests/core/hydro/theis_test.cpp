#include "core/hydro/theis.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <numbers>

#include "core/errors.hpp"
#include "core/hydro/well_function.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

double rel_err(double got, double want) { return std::abs(got / want - 1.0); }

// An invented formation (test input only): 10 mD, 50 ft, 0.5 cP, 15 %, 1e-5 1/psi.
Formation example_formation() {
  Formation f;
  f.permeability = 10 * units::kMilliDarcy;
  f.thickness = 50 * units::kFoot;
  f.viscosity = 0.5 * units::kCentiPoise;
  f.porosity = 0.15;
  f.total_compressibility = 1e-5 / units::kPsi;
  return f;
}

}  // namespace

TEST_CASE("D and the prefactor follow from (k, h, mu, phi, c_t)") {
  const Formation f = example_formation();
  const TheisParameters p = theis_parameters(f);
  // Definitions (Theis 1935 in the petroleum form, Earlougher 1977 eq. 2.2), by arithmetic.
  CHECK(rel_err(p.diffusivity, f.permeability / (f.viscosity * f.porosity * f.total_compressibility)) <= 1e-15);
  CHECK(rel_err(p.pressure_per_rate, f.viscosity / (4 * std::numbers::pi * f.permeability * f.thickness)) <= 1e-15);
}

TEST_CASE("the hydrogeologists' (T, S, rho) form is the same solution") {
  // T = k rho g h / mu and S = rho g phi c_t h (common practice conversion).
  const Formation f = example_formation();
  Aquifer a;
  a.fluid_density = 1050.0;
  a.transmissivity = f.permeability * a.fluid_density * a.gravity * f.thickness / f.viscosity;
  a.storativity = a.fluid_density * a.gravity * f.porosity * f.total_compressibility * f.thickness;
  const TheisParameters pf = theis_parameters(f), pa = theis_parameters(a);
  CHECK(rel_err(pa.diffusivity, pf.diffusivity) <= 1e-14);
  CHECK(rel_err(pa.pressure_per_rate, pf.pressure_per_rate) <= 1e-14);
  // Drawdown form s = Q/(4 pi T) W(r^2 S/(4 T t)) and dp = rho g s (Theis 1935).
  const double Q = 0.01, r = 300.0, t = 86400.0 * 10;
  const double s = Q / (4 * std::numbers::pi * a.transmissivity) *
                   well_function(r * r * a.storativity / (4 * a.transmissivity * t));
  CHECK(rel_err(theis_pressure(pa, Q, r, 0.1, t), a.fluid_density * a.gravity * s) <= 1e-14);
}

TEST_CASE("Cooper-Jacob small-u limit") {
  // Cooper & Jacob (1946): for small u, W(u) ~ -gamma - ln u = ln(2.2458 D t / r^2), and the
  // next term of the series is +u (A&S 1964, eq. 5.1.11).
  const TheisParameters p = theis_parameters(example_formation());
  const double q = 0.02, r = 50.0;
  for (double u_target : {1e-2, 1e-3, 1e-4, 1e-6}) {
    const double t = r * r / (4 * p.diffusivity * u_target);
    const double u = theis_argument(p, r, t);
    CHECK(rel_err(u, u_target) <= 1e-14);
    const double theis = theis_pressure(p, q, r, 0.1, t);
    const double cooper_jacob = q * p.pressure_per_rate * std::log(4 * p.diffusivity * t / (std::exp(std::numbers::egamma) * r * r));
    CAPTURE(u);
    // Theis exceeds Cooper-Jacob by q * prefactor * (u - u^2/4 + ...): checked to 1 % of u.
    const double diff = (theis - cooper_jacob) / (q * p.pressure_per_rate);
    // remaining terms u^3/18 - ... are < 1e-5 of (u - u^2/4) for u <= 0.01; rounding adds < 1e-7.
    CHECK(std::abs(diff / (u - u * u / 4) - 1) <= 1e-5);
    // and the relative difference is below u / W(u), the usual "u < 0.01" accuracy statement.
    CHECK(std::abs(theis - cooper_jacob) / theis <= u / well_function(u) * 1.01);
  }
}

TEST_CASE("oilfield form (Earlougher 1977; Lee 1982) agrees with the SI form to ~4e-5") {
  // dp[psi] = 70.6 q[bbl/d] B mu[cP] / (k[mD] h[ft]) * E1(948 phi mu[cP] c_t[1/psi] r[ft]^2 / (k[mD] t[h])).
  // The constants 70.6 and 948 are rounded (exact: 70.6013 and 948.07 with the NIST factors),
  // so the forms differ by about 2e-5 in the prefactor plus 8e-5 / W(u) through the argument.
  const double q_bbl_d = 1000, B = 1.0, mu_cp = 0.5, k_md = 10, h_ft = 50, phi = 0.15,
               ct_psi = 1e-5;
  const TheisParameters p = theis_parameters(example_formation());
  for (double r_ft : {100.0, 1000.0, 5000.0}) {
    for (double t_h : {24.0, 240.0, 24.0 * 365}) {
      const double u_field = 948 * phi * mu_cp * ct_psi * r_ft * r_ft / (k_md * t_h);
      if (u_field > 5) continue;  // negligible pressure: relative comparisons are meaningless
      const double dp_field_psi = 70.6 * q_bbl_d * B * mu_cp / (k_md * h_ft) * well_function(u_field);
      const double q_si = q_bbl_d * units::kBarrel / units::kDay;
      const double dp_si = theis_pressure(p, q_si, r_ft * units::kFoot, 0.1, t_h * units::kHour);
      const double dp_si_psi = dp_si / units::kPsi;
      CAPTURE(r_ft);
      CAPTURE(t_h);
      const double bound = 2.5e-5 + 9e-5 / well_function(u_field);
      CHECK(std::abs(dp_field_psi / dp_si_psi - 1) <= bound);
      CHECK(std::abs(dp_field_psi / dp_si_psi - 1) <= 1e-3);
    }
  }
  // At a typical point (u small, W ~ 5) the agreement is the brief's "about 4e-5".
  const double u = 948 * phi * mu_cp * ct_psi * 100.0 * 100.0 / (k_md * 240.0);
  const double field = 70.6 * q_bbl_d * B * mu_cp / (k_md * h_ft) * well_function(u);
  const double si = theis_pressure(p, q_bbl_d * units::kBarrel / units::kDay, 100 * units::kFoot, 0.1, 240 * units::kHour) / units::kPsi;
  CHECK(std::abs(field / si - 1) <= 6e-5);
}

TEST_CASE("clamping to the well radius and times before the start") {
  const TheisParameters p = theis_parameters(example_formation());
  const auto c = clamp_to_well_radius(0.05, 0.1);
  CHECK(c.clamped);
  CHECK(c.r == 0.1);
  CHECK_FALSE(clamp_to_well_radius(0.1, 0.1).clamped);
  CHECK(theis_pressure(p, 0.01, 0.0, 0.1, 1e5) == theis_pressure(p, 0.01, 0.1, 0.1, 1e5));
  CHECK(theis_pressure(p, 0.01, 100, 0.1, 0.0) == 0.0);   // documented: no pressure before start
  CHECK(theis_pressure(p, 0.01, 100, 0.1, -5.0) == 0.0);
  CHECK_THROWS_AS(clamp_to_well_radius(-1.0, 0.1), InputError);
  CHECK_THROWS_WITH_AS(clamp_to_well_radius(1.0, 0.0), doctest::Contains("well_radius"), InputError);
}

TEST_CASE("bad formation properties are clear errors naming the field") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  struct Bad {
    double Formation::*member;
    const char* field;
  };
  const Bad fields[] = {{&Formation::permeability, "permeability"},
                        {&Formation::thickness, "thickness"},
                        {&Formation::viscosity, "viscosity"},
                        {&Formation::porosity, "porosity"},
                        {&Formation::total_compressibility, "total_compressibility"}};
  for (const Bad& b : fields) {
    for (double v : {0.0, -1.0, nan, inf}) {
      Formation f = example_formation();
      f.*b.member = v;
      CAPTURE(b.field);
      CAPTURE(v);
      CHECK_THROWS_WITH_AS(theis_parameters(f), doctest::Contains((std::string("'") + b.field + "'").c_str()), InputError);
    }
  }
  Formation f = example_formation();
  f.porosity = 1.5;
  CHECK_THROWS_WITH_AS(theis_parameters(f), doctest::Contains("porosity"), InputError);
  Aquifer a;
  a.transmissivity = 1e-3;
  a.storativity = -1e-4;
  a.fluid_density = 1000;
  CHECK_THROWS_WITH_AS(theis_parameters(a), doctest::Contains("storativity"), InputError);
}
