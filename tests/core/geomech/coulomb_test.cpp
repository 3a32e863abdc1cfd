#include "core/geomech/coulomb.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <random>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;

// The two optimally oriented planes for an Andersonian stress: they contain S2 and lie at
// β = ½·atan(1/μ) from S1 (Jaeger, Cook & Zimmerman 2007 ch. 4).
std::array<FaultPlane, 2> optimal_planes(const AndersonianStress& s, double mu) {
  const double beta = 0.5 * std::atan(1.0 / mu);
  const double az = s.shmax_azimuth;
  switch (classify_regime(s)) {
    case FaultingRegime::normal:  // S1 vertical, S2 = SHmax: strike along SHmax, dip 90° − β
      return {FaultPlane::from_strike_dip(az, std::numbers::pi / 2 - beta),
              FaultPlane::from_strike_dip(az + std::numbers::pi, std::numbers::pi / 2 - beta)};
    case FaultingRegime::reverse:  // S1 = SHmax, S2 = Shmin: strike along Shmin, dip β
      return {FaultPlane::from_strike_dip(az + std::numbers::pi / 2, beta),
              FaultPlane::from_strike_dip(az - std::numbers::pi / 2, beta)};
    case FaultingRegime::strike_slip:  // S2 vertical: vertical planes at ±β from SHmax
      return {FaultPlane::from_strike_dip(az + beta, std::numbers::pi / 2),
              FaultPlane::from_strike_dip(az - beta, std::numbers::pi / 2)};
  }
  throw std::logic_error("regime");
}

double angle_between_planes(const FaultPlane& a, const FaultPlane& b) {
  return std::acos(std::fmin(1.0, std::fabs(a.normal().dot(b.normal()))));
}
}  // namespace

TEST_CASE("Coulomb failure function and closed-form critical pressure") {
  // Arithmetic: τ = 10, σn = 40, p = 20, μ = 0.6, c = 1 (MPa): CFF = 10 − 12 − 1 = −3 MPa;
  // Δp_crit = (40 − 20) − (10 − 1)/0.6 = 5 MPa = −CFF/μ.
  CHECK_NEAR(coulomb_failure_function(10e6, 40e6, 20e6, 0.6, 1e6), -3e6, 1e-8);
  const auto c = critical_pressure(10e6, 40e6, 20e6, {0.6, 1e6});
  CHECK_NEAR(c.dp, 5e6, 1e-8);
  CHECK(c.status == CriticalStatus::below_failure);
  // A plane past failure is reported as already critical, with its (negative) margin.
  const auto past = critical_pressure(20e6, 40e6, 20e6, {0.6, 0.0});
  CHECK_NEAR(past.dp, 20e6 - 20e6 / 0.6, 1e-7);
  CHECK(past.status == CriticalStatus::already_critical);
  CHECK(critical_pressure(12e6, 40e6, 20e6, {0.6, 0.0}).status == CriticalStatus::already_critical);  // Δp = 0
}

TEST_CASE("optimal angle from S1 is half atan(1/mu)") {
  // Jaeger, Cook & Zimmerman (2007) ch. 4: CFF = τ − μ σn' is largest on the plane at
  // β = ½·atan(1/μ) from σ1 (29.52° for μ = 0.6). Scan planes containing σ2 in 0.01° steps.
  const Eigen::Matrix3d t = stress_tensor_ned({40e6, 80e6, 55e6, 0.0, 20e6});  // reverse, σ1 north
  for (double mu : {0.4, 0.6, 0.85}) {
    double best_cff = -INFINITY, best_dip = -1;
    for (int i = 0; i <= 9000; ++i) {
      const double dip = i * 0.01;  // plane at dip δ from the horizontal σ1 (strike east)
      const auto r = resolve_normal(t, FaultPlane::from_strike_dip(90 * kDeg, dip * kDeg).normal());
      const double cff = coulomb_failure_function(r.shear_stress, r.normal_stress, 20e6, mu, 0.0);
      if (cff > best_cff) { best_cff = cff; best_dip = dip; }
    }
    CHECK_NEAR(best_dip, 0.5 * std::atan(1.0 / mu) / kDeg, 0.011);
  }
  CHECK_NEAR(0.5 * std::atan(1.0 / 0.6) / kDeg, 29.52, 0.01);  // arithmetic
}

TEST_CASE("at frictional equilibrium the optimal plane has dp_crit = 0 and every other plane is positive") {
  const double sv = 70e6, p0 = 30e6, mu = 0.6;
  for (double a : {0.5, 1.5, 2.5}) {  // normal, strike-slip, reverse (Simpson 1997)
    CAPTURE(a);
    const auto h = horizontal_stresses_from_a_phi(a, sv, p0, mu);
    const AndersonianStress s{sv, h.shmax, h.shmin, 35 * kDeg, p0};
    const Eigen::Matrix3d t = stress_tensor_ned(s);
    const Friction f{mu, 0.0};
    const auto opt = optimal_planes(s, mu);
    for (const auto& plane : opt) {
      const auto r = resolve_normal(t, plane.normal());
      CHECK_NEAR(critical_pressure(r.shear_stress, r.normal_stress, p0, f).dp, 0.0, 1e-3);  // Pa
    }
    double min_dp = INFINITY;
    for (int si = 0; si < 360; si += 1) {
      for (int di = 0; di <= 90; di += 1) {
        const auto plane = FaultPlane::from_strike_dip(si * kDeg, di * kDeg);
        const auto r = resolve_normal(t, plane.normal());
        const double dp = critical_pressure(r.shear_stress, r.normal_stress, p0, f).dp;
        min_dp = std::fmin(min_dp, dp);
        CHECK(dp >= -1e-3);
        const double away = std::fmin(angle_between_planes(plane, opt[0]), angle_between_planes(plane, opt[1]));
        if (away > 1.0 * kDeg) CHECK(dp > 0.0);
      }
    }
    CHECK(min_dp < 0.03e6);  // the 1° grid comes within 0.03 MPa of the optimum (0.5° off)
  }
}

TEST_CASE("poroelastic path: dp_crit is a root of the recomputed CFF") {
  std::mt19937_64 rng(42);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  int checked = 0;
  for (int k = 0; k < 400; ++k) {
    const double sv = 50e6 + 40e6 * u(rng);
    const double p0 = 0.4 * sv;
    const double a = 3.0 * u(rng);
    const double mu = 0.4 + 0.6 * u(rng);
    const auto h = horizontal_stresses_from_a_phi(a, sv, p0, mu * (0.5 + 0.45 * u(rng))); // inside the limit for μ
    const Eigen::Matrix3d t = stress_tensor_ned({sv, h.shmax, h.shmin, u(rng) * 2 * std::numbers::pi, p0});
    const Friction f{mu, 2e6 * u(rng)};
    const double kappa = stress_path_coefficient({0.5 + 0.5 * u(rng), 0.1 + 0.35 * u(rng)});
    const auto plane = FaultPlane::from_strike_dip(u(rng) * 2 * std::numbers::pi, u(rng) * std::numbers::pi / 2);
    const auto c = critical_pressure_poroelastic(t, p0, plane.normal(), f, kappa);
    CAPTURE(k);
    CHECK(std::isfinite(c.dp));
    if (!std::isfinite(c.dp)) continue;
    CHECK_NEAR(coulomb_failure_function_after(t, p0, plane.normal(), f, kappa, c.dp), 0.0, 20.0);  // Pa
    // Just below Δp_crit the plane is still stable; just above it has failed (a crossing, not a touch).
    const double d = 1e4 + 1e-3 * std::fabs(c.dp);
    if (c.status == CriticalStatus::below_failure) {
      CHECK(coulomb_failure_function_after(t, p0, plane.normal(), f, kappa, 0.5 * c.dp) < 0.0);
      CHECK(coulomb_failure_function_after(t, p0, plane.normal(), f, kappa, c.dp + d) > 0.0);
    }
    // The opposite normal gives the same answer.
    CHECK_NEAR(critical_pressure_poroelastic(t, p0, -plane.normal(), f, kappa).dp, c.dp, 1e-6);
    ++checked;
  }
  CHECK(checked > 300);
}

TEST_CASE("poroelastic path: kappa = 0 is the closed form; dip-slip planes give the linear dCFF") {
  const AndersonianStress s{70e6, 50e6, 42e6, 20 * kDeg, 30e6};
  const Eigen::Matrix3d t = stress_tensor_ned(s);
  const Friction f{0.6, 0.5e6};
  const auto plane = FaultPlane::from_strike_dip(20 * kDeg, 55 * kDeg);  // strikes along SHmax: pure dip-slip
  const auto r = resolve_normal(t, plane.normal());
  CHECK_NEAR(critical_pressure_poroelastic(t, 30e6, plane.normal(), f, 0.0).dp,
             critical_pressure(r.shear_stress, r.normal_stress, 30e6, f).dp, 1e-7);
  // Brief §2.3: ΔCFF = Δτ − μ (Δσn − Δp) with Δσh = κ Δp. For this dip-slip plane
  // (arithmetic): Δσn = κ sin²δ Δp; the shear change along the dip is −κ sinδ cosδ Δp in the
  // normal-fault sense, so Δτ = −κ sinδ cosδ Δp and Δp_crit = −CFF0 / (−κ sinδ cosδ − μ (κ sin²δ − 1)).
  const double kappa = stress_path_coefficient({1.0, 0.25});  // 1 × 0.5/0.75 = 2/3
  CHECK_NEAR(kappa, 2.0 / 3.0, 1e-15);
  const double sd = std::sin(55 * kDeg), cd = std::cos(55 * kDeg);
  const double cff0 = coulomb_failure_function(r.shear_stress, r.normal_stress, 30e6, f.mu, f.cohesion);
  const double rate = -kappa * sd * cd - f.mu * (kappa * sd * sd - 1.0);
  const auto c = critical_pressure_poroelastic(t, 30e6, plane.normal(), f, kappa);
  CHECK_NEAR(c.dp, -cff0 / rate, 1e-4);
  CHECK(c.dp > critical_pressure(r.shear_stress, r.normal_stress, 30e6, f).dp);  // the path stabilises normal faults
}

TEST_CASE("poroelastic path: 'never' and 'already critical'") {
  // κ = 1 (α = 1, ν = 0) on a vertical plane: Δσn = Δp and Δτ = 0, so CFF never changes.
  const AndersonianStress s{50e6, 70e6, 40e6, 0.0, 30e6};
  const Eigen::Matrix3d t = stress_tensor_ned(s);
  const auto vertical = FaultPlane::from_strike_dip(60 * kDeg, 90 * kDeg);
  const auto c = critical_pressure_poroelastic(t, 30e6, vertical.normal(), {0.6, 0.0}, 1.0);
  CHECK(std::isinf(c.dp));
  CHECK(c.dp > 0);
  CHECK(c.status == CriticalStatus::never);
  CHECK(std::string(to_string(c.status)) == "never");
  // A plane past failure: Δp_crit ≤ 0, status already critical, and still a root.
  const auto plane = FaultPlane::from_strike_dip(30 * kDeg, 90 * kDeg);
  // Arithmetic: σn = 47.5 MPa, τ = 15 sin 60° = 12.990 MPa, CFF0 = 12.990 − 0.5 × 17.5 = 4.240 MPa;
  // the vertical plane's shear does not change, σn' changes by (κ − 1) Δp ⇒ Δp = −4.240/0.25.
  const auto past = critical_pressure_poroelastic(t, 30e6, plane.normal(), {0.5, 0.0}, 0.5);
  CHECK(past.dp <= 0.0);
  CHECK(past.status == CriticalStatus::already_critical);
  CHECK_NEAR(past.dp, -(15e6 * std::sqrt(3.0) / 2.0 - 0.5 * 17.5e6) / 0.25, 1e-6);
  CHECK_NEAR(coulomb_failure_function_after(t, 30e6, plane.normal(), {0.5, 0.0}, 0.5, past.dp), 0.0, 20.0);
}

TEST_CASE("opening pressure: the least effective stress reaches zero") {
  // Arithmetic: Sv − p0 = 40 MPa, Shmin − p0 = 15 MPa; with κ = 2/3 the horizontal limit is 15/(1/3) = 45 MPa.
  const AndersonianStress s{70e6, 60e6, 45e6, 0.0, 30e6};
  CHECK_NEAR(opening_pressure(s, 0.0), 15e6, 1e-6);
  CHECK_NEAR(opening_pressure(s, 2.0 / 3.0), 40e6, 1e-6);
  CHECK_NEAR(opening_pressure(s, 0.5), 30e6, 1e-6);
  CHECK_NEAR(opening_pressure(s, 1.0), 40e6, 1e-6);
}

TEST_CASE("Coulomb bad input") {
  CHECK_THROWS_WITH_AS(critical_pressure(10e6, 40e6, 20e6, {0.0, 0.0}), doctest::Contains("field 'friction' = '0"), InputError);
  CHECK_THROWS_WITH_AS(critical_pressure(10e6, 40e6, 20e6, {-0.2, 0.0}), doctest::Contains("friction coefficient > 0"), InputError);
  CHECK_THROWS_WITH_AS(critical_pressure(10e6, 40e6, 20e6, {0.6, -1e6}), doctest::Contains("field 'cohesion'"), InputError);
  CHECK_THROWS_WITH_AS(stress_path_coefficient({1.5, 0.25}), doctest::Contains("field 'Biot coefficient'"), InputError);
  CHECK_THROWS_WITH_AS(stress_path_coefficient({1.0, 0.5}), doctest::Contains("field 'Poisson's ratio'"), InputError);
}

TEST_CASE("poroelastic path: dCFF(dp) equals the CFF recomputed from scratch; kappa = 0 is mu dp exactly") {
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (int k = 0; k < 200; ++k) {
    const double sv = 50e6 + 40e6 * u(rng), p0 = 0.4 * sv, mu = 0.4 + 0.6 * u(rng);
    const auto h = horizontal_stresses_from_a_phi(3.0 * u(rng), sv, p0, mu * 0.9);
    const Eigen::Matrix3d t = stress_tensor_ned({sv, h.shmax, h.shmin, u(rng) * 2 * std::numbers::pi, p0});
    const double kappa = stress_path_coefficient({0.3 + 0.7 * u(rng), 0.45 * u(rng)});
    const auto n = FaultPlane::from_strike_dip(u(rng) * 2 * std::numbers::pi, u(rng) * std::numbers::pi / 2).normal();
    const Friction f{mu, 1e6 * u(rng)};
    const CoulombPathChange c = coulomb_path_change(t, n, mu, kappa);
    const double cff0 = coulomb_failure_function_after(t, p0, n, f, kappa, 0.0);
    CAPTURE(k);
    for (double dp : {-3e6, 1.0, 1e3, 1e5, 2e6, 2e7}) {
      // Reference: the Coulomb function recomputed from the changed tensor (independent path).
      const double ref = coulomb_failure_function_after(t, p0, n, f, kappa, dp) - cff0;
      CHECK(std::fabs(c.at(dp) - ref) <= 1e-8 * sv);  // Pa: rounding of the 1e7-Pa recomputation
    }
    // Relative accuracy for tiny Δp, where the recomputation cancels: the linear term.
    const double slope = c.tau0 > 0 ? c.ab / c.tau0 + c.normal_rate : c.normal_rate;
    CHECK(std::fabs(c.at(1e-3) - slope * 1e-3) <= 1e-9 * std::fabs(slope * 1e-3) + 1e-18);
    const CoulombPathChange none = coulomb_path_change(t, n, mu, 0.0);
    CHECK(none.at(1234.5) == mu * 1234.5);  // bit-identical to μΔp
  }
}
