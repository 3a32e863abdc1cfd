#include "core/geomech/orientation_search.hpp"

#include <doctest/doctest.h>

#include <numbers>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;

// Difference of two strikes as undirected lines (mod 180°), in degrees.
double strike_diff_mod180(double a, double b) {
  double d = std::fmod(std::fabs(a - b) / kDeg, 180.0);
  return std::fmin(d, 180.0 - d);
}
}  // namespace

TEST_CASE("most dangerous orientation in the three regimes") {
  // Jaeger, Cook & Zimmerman (2007) ch. 4: the optimal plane contains S2 at β = ½·atan(1/μ)
  // from S1; for μ = 0.6, β = 29.518°.
  const double mu = 0.6, beta = 0.5 * std::atan(1.0 / mu) / kDeg;
  const double az = 25.0;
  struct Case { AndersonianStress s; double dip; double strike_offset; };
  const Case cases[] = {
      {{70e6, 50e6, 42e6, az * kDeg, 30e6}, 90.0 - beta, 0.0},  // normal: strike ∥ SHmax
      {{55e6, 75e6, 40e6, az * kDeg, 30e6}, 90.0, beta},        // strike-slip: vertical, ±β from SHmax
      {{45e6, 85e6, 60e6, az * kDeg, 30e6}, beta, 90.0},        // reverse: strike ∥ Shmin
  };
  for (const auto& c : cases) {
    CAPTURE(to_string(classify_regime(c.s)));
    const Eigen::Matrix3d t = stress_tensor_ned(c.s);
    const Friction f{mu, 0.0};
    const auto d = most_dangerous_orientation(t, c.s.pore_pressure, f);
    CHECK_NEAR(d.plane.dip() / kDeg, c.dip, 0.01);
    const double off = strike_diff_mod180(d.plane.strike(), (az + c.strike_offset) * kDeg);
    const double off2 = strike_diff_mod180(d.plane.strike(), (az - c.strike_offset) * kDeg);
    CHECK(std::fmin(off, off2) < 0.01);
    // Its Δp_crit equals the value at the analytic optimum within 1 Pa.
    const auto exact = FaultPlane::from_strike_dip(d.plane.strike() + 0.0, c.dip * kDeg);
    const auto r = resolve_normal(t, FaultPlane::from_strike_dip((az + (off <= off2 ? 1 : -1) * c.strike_offset) * kDeg, c.dip * kDeg).normal());
    CHECK_NEAR(d.dp_crit, critical_pressure(r.shear_stress, r.normal_stress, c.s.pore_pressure, f).dp, 1.0);
    (void)exact;
  }
}

TEST_CASE("tabulated dp_crit matches the one-plane code for several states") {
  const auto grid = make_orientation_grid(10 * kDeg, 10 * kDeg);
  CHECK(grid.strikes.size() == 36);
  CHECK(grid.dips.size() == 10);
  CHECK(grid.planes.size() == 360);
  StressBatch states;
  const AndersonianStress s1{70e6, 50e6, 42e6, 0.3, 30e6}, s2{55e6, 75e6, 40e6, 1.1, 28e6};
  states.push_back(stress_tensor_ned(s1), s1.pore_pressure, {0.6, 0.0});
  states.push_back(stress_tensor_ned(s2), s2.pore_pressure, {0.8, 1e6});
  const auto table = tabulate_critical_pressure(grid, states);
  REQUIRE(table.size() == 720);
  const AndersonianStress* ss[] = {&s1, &s2};
  const Friction fs[] = {{0.6, 0.0}, {0.8, 1e6}};
  for (std::size_t k = 0; k < 2; ++k) {
    const Eigen::Matrix3d t = stress_tensor_ned(*ss[k]);
    for (std::size_t i = 0; i < grid.strikes.size(); ++i)
      for (std::size_t j = 0; j < grid.dips.size(); ++j) {
        const auto r = resolve_normal(t, FaultPlane::from_strike_dip(grid.strikes[i], grid.dips[j]).normal());
        const double dp = critical_pressure(r.shear_stress, r.normal_stress, ss[k]->pore_pressure, fs[k]).dp;
        CHECK_NEAR(table[k * grid.planes.size() + grid.index(i, j)], dp, 1e-6);
      }
  }
  CHECK_THROWS_WITH_AS(make_orientation_grid(0.0, 1 * kDeg), doctest::Contains("field 'strike step'"), InputError);
}
