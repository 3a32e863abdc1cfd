#include "core/geomech/fault_plane.hpp"

#include <doctest/doctest.h>

#include <numbers>

#include "check_near.hpp"
#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;
}

TEST_CASE("normal vector in NED") {
  // n = (−sinδ sinφs, sinδ cosφs, −cosδ) (upward normal; common practice, right-hand rule).
  auto n = FaultPlane::from_strike_dip(0.0, 90 * kDeg).normal();  // N-striking vertical plane
  CHECK_NEAR(n(0), 0.0, 1e-15);
  CHECK_NEAR(n(1), 1.0, 1e-15);
  CHECK_NEAR(n(2), 0.0, 1e-15);
  n = FaultPlane::from_strike_dip(123 * kDeg, 0.0).normal();  // horizontal plane
  CHECK_NEAR(n(2), -1.0, 1e-15);
  const auto p = FaultPlane::from_strike_dip(90 * kDeg, 45 * kDeg);  // E-striking, dips south
  n = p.normal();
  CHECK_NEAR(n(0), -std::sqrt(0.5), 1e-15);
  CHECK_NEAR(n(1), 0.0, 1e-15);
  CHECK_NEAR(n(2), -std::sqrt(0.5), 1e-15);
  // Right-hand rule: dip direction = strike + 90° = 180° (south); the dip vector goes down-south.
  CHECK_NEAR(p.dip_direction(), 180 * kDeg, 1e-15);
  const Eigen::Vector3d d = p.dip_vector();
  CHECK_NEAR(d(0), -std::sqrt(0.5), 1e-15);
  CHECK_NEAR(d(2), std::sqrt(0.5), 1e-15);
  // s, d, n orthonormal and s × d = −n (n points up, into the hanging wall).
  for (double strike = 0; strike < 360; strike += 37) {
    for (double dip = 0; dip <= 90; dip += 15) {
      const auto q = FaultPlane::from_strike_dip(strike * kDeg, dip * kDeg);
      CHECK_NEAR(q.normal().norm(), 1.0, 1e-15);
      CHECK_NEAR(q.normal().dot(q.strike_vector()), 0.0, 1e-15);
      CHECK_NEAR(q.normal().dot(q.dip_vector()), 0.0, 1e-15);
      CHECK_NEAR((q.strike_vector().cross(q.dip_vector()) + q.normal()).norm(), 0.0, 1e-15);
      CHECK(q.normal()(2) <= 0.0);
    }
  }
}

TEST_CASE("strike/dip <-> dip direction/dip round trip, and from the normal") {
  for (double strike = 0; strike < 360; strike += 7.5) {
    for (double dip = 1; dip <= 90; dip += 11) {
      const auto p = FaultPlane::from_strike_dip(strike * kDeg, dip * kDeg);
      const auto q = FaultPlane::from_dip_direction(p.dip_direction(), p.dip());
      CHECK_NEAR(q.strike(), p.strike(), 1e-12);
      CHECK_NEAR(q.dip(), p.dip(), 1e-15);
      for (double sign : {1.0, -1.0}) {
        const auto r = FaultPlane::from_normal(sign * p.normal());
        CHECK_NEAR(r.dip(), p.dip(), 1e-12);
        if (dip < 90) CHECK_NEAR(r.strike(), p.strike(), 1e-12);
        CHECK_NEAR((r.normal() - p.normal()).norm() * (dip < 90 ? 1.0 : 0.0), 0.0, 1e-12);
      }
    }
  }
  // Strike wraps to [0°, 360°); dip direction 10° is strike 280°.
  CHECK_NEAR(FaultPlane::from_strike_dip(-10 * kDeg, 30 * kDeg).strike(), 350 * kDeg, 1e-12);
  CHECK_NEAR(FaultPlane::from_strike_dip(370 * kDeg, 30 * kDeg).strike(), 10 * kDeg, 1e-12);
  CHECK_NEAR(FaultPlane::from_dip_direction(10 * kDeg, 30 * kDeg).strike(), 280 * kDeg, 1e-12);
}

TEST_CASE("dip outside [0, 90] degrees is refused, naming the field") {
  CHECK_THROWS_WITH_AS(FaultPlane::from_strike_dip(0.0, 91 * kDeg), doctest::Contains("field 'dip' = '91"), InputError);
  CHECK_THROWS_WITH_AS(FaultPlane::from_strike_dip(0.0, -1 * kDeg), doctest::Contains("[0, 90] deg"), InputError);
  CHECK_THROWS_AS(FaultPlane::from_strike_dip(0.0, std::nan("")), InputError);
  CHECK_THROWS_WITH_AS(FaultPlane::from_strike_dip(INFINITY, 10 * kDeg), doctest::Contains("field 'strike'"), InputError);
  CHECK_THROWS_AS(FaultPlane::from_normal(Eigen::Vector3d::Zero()), InputError);
  CHECK_NOTHROW(FaultPlane::from_strike_dip(0.0, 90 * kDeg));
  CHECK_NOTHROW(FaultPlane::from_strike_dip(0.0, 0.0));
}
