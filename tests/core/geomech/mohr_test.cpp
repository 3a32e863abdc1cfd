#include "core/geomech/mohr.hpp"

#include <doctest/doctest.h>

#include <numbers>
#include <random>
#include <vector>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

TEST_CASE("Mohr circles and plane points") {
  // Jaeger, Cook & Zimmerman (2007) ch. 2: circles through (Si, Sj); every plane's point lies in
  // the large circle and outside both small ones.
  const double p = 25e6;
  const Eigen::Matrix3d t = stress_tensor_ned({70e6, 55e6, 40e6, 0.4, p});
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<FaultPlane> planes;
  for (int i = 0; i < 500; ++i)
    planes.push_back(FaultPlane::from_strike_dip(u(rng) * 2 * std::numbers::pi, u(rng) * std::numbers::pi / 2));
  const auto d = mohr_diagram(t, p, planes, {0.6, 1e6});
  CHECK_NEAR(d.circles[0].centre, 0.5 * (70e6 + 40e6) - p, 1e-6);
  CHECK_NEAR(d.circles[0].radius, 15e6, 1e-6);
  CHECK_NEAR(d.circles[1].centre, 0.5 * (70e6 + 55e6) - p, 1e-6);
  CHECK_NEAR(d.circles[2].radius, 7.5e6, 1e-6);
  CHECK(d.points.size() == planes.size());
  const auto dist2 = [](const MohrCircle& c, const MohrPoint& q) {
    const double x = q.effective_normal_stress - c.centre;
    return x * x + q.shear_stress * q.shear_stress;
  };
  const double tol = 1e-9 * 15e6 * 15e6;  // Pa²
  for (const auto& q : d.points) {
    CHECK(dist2(d.circles[0], q) <= d.circles[0].radius * d.circles[0].radius + tol);
    CHECK(dist2(d.circles[1], q) >= d.circles[1].radius * d.circles[1].radius - tol);
    CHECK(dist2(d.circles[2], q) >= d.circles[2].radius * d.circles[2].radius - tol);
  }
  CHECK(d.mu == 0.6);
  CHECK(d.cohesion == 1e6);
  CHECK_THROWS_WITH_AS(mohr_diagram(t, p, planes, {0.0, 0.0}), doctest::Contains("field 'friction'"), InputError);
}
