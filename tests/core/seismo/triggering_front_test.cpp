#include "core/seismo/triggering_front.hpp"

#include <doctest/doctest.h>

#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("triggering front radius and its inverse") {
  // Shapiro et al. (1997): r = sqrt(4π · 1 m2/s · 86400 s) = 1041.98581 m (arithmetic).
  CHECK(front_radius(1.0, 86400.0) == doctest::Approx(1041.9858065639).epsilon(1e-12));
  CHECK(front_radius(0.1, 0.0) == 0.0);
  CHECK(front_diffusivity(front_radius(0.37, 1e7), 1e7) == doctest::Approx(0.37).epsilon(1e-13));
  CHECK_THROWS_AS(front_radius(0.0, 1.0), InputError);
  CHECK_THROWS_AS(front_radius(1.0, -1.0), InputError);
}

TEST_CASE("r-t points and the fraction inside a front") {
  const std::vector<double> t = {-10.0, 0.0, 100.0, 1000.0, 1e4};
  const std::vector<double> r = {5.0, 1.0, 40.0, 300.0, 100.0};
  const auto pts = rt_points(t, r, 0.0);
  REQUIRE(pts.size() == 4);  // the event before the start is left out
  CHECK(pts[0].event == 1);
  CHECK(pts[1].d_fit == doctest::Approx(1600.0 / (4.0 * 3.14159265358979 * 100.0)).epsilon(1e-12));
  // With D = 1 m2/s fronts at t = 100, 1000, 1e4 s are 35.4, 112.1, 354.5 m: inside are the
  // t = 1e4 point (100 < 354.5) only; the t = 0 point at r = 1 m is outside (front 0 m).
  CHECK(fraction_inside_front(pts, 1.0) == doctest::Approx(0.25).epsilon(1e-15));
  CHECK(fraction_inside_front({}, 1.0) == 0.0);
}
