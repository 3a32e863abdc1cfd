#include "core/hydro/image_wells.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

TheisParameters example_params() {
  Formation f;  // invented test formation: 20 mD, 30 m, 0.5 cP, 10 %, 1e-9 1/Pa
  f.permeability = 20 * units::kMilliDarcy;
  f.thickness = 30;
  f.viscosity = 0.5e-3;
  f.porosity = 0.1;
  f.total_compressibility = 1e-9;
  return theis_parameters(f);
}

WellSource injector(double x, double y) {
  return WellSource{"I", x, y, 0.1, RateHistory({0.0}, {0.02})};
}

double dp(const PressureField& f, const TheisParameters& p, double x, double y, double t) {
  return f.pressure_at(p, {x, y}, t);
}

}  // namespace

TEST_CASE("one boundary: mirror image, same sign for no-flow, opposite for constant pressure") {
  // Method of images (Ferris et al. 1962; Earlougher 1977 ch. 10.2).
  const Boundary nf[] = {{BoundaryKind::no_flow, 500, 0, 0, 1}};  // the line x = 500
  const auto s = image_wells(100, 40, nf);
  REQUIRE(s.size() == 2);
  CHECK(s[1].x == doctest::Approx(900).epsilon(1e-14));
  CHECK(s[1].y == doctest::Approx(40).epsilon(1e-14));
  CHECK(s[1].sign == 1.0);
  const Boundary cp[] = {{BoundaryKind::constant_pressure, 0, 0, 1, 1}};  // the line y = x
  const auto c = image_wells(100, 40, cp);
  REQUIRE(c.size() == 2);
  CHECK(c[1].x == doctest::Approx(40).epsilon(1e-14));
  CHECK(c[1].y == doctest::Approx(100).epsilon(1e-14));
  CHECK(c[1].sign == -1.0);
}

TEST_CASE("perpendicular boundaries close after two generations; oblique ones are refused") {
  const Boundary corner[] = {{BoundaryKind::no_flow, 500, 0, 0, 1},
                             {BoundaryKind::constant_pressure, 0, 300, 1, 0}};
  const auto s = image_wells(100, 100, corner);
  REQUIRE(s.size() == 4);
  double sign_sum = 0;
  for (const auto& i : s) sign_sum += i.sign;
  CHECK(sign_sum == 0.0);  // +1 real, +1 no-flow image, -1, -1 for the two crossing the other line
  const Boundary oblique[] = {{BoundaryKind::no_flow, 500, 0, 0, 1},
                              {BoundaryKind::no_flow, 0, 300, 1, 0.3}};
  CHECK_THROWS_WITH_AS(image_wells(100, 100, oblique), doctest::Contains("parallel or perpendicular"), InputError);
  const Boundary three[] = {{BoundaryKind::no_flow, 500, 0, 0, 1},
                            {BoundaryKind::no_flow, -500, 0, 0, 1},
                            {BoundaryKind::no_flow, 900, 0, 0, 1}};
  CHECK_THROWS_WITH_AS(validate_boundaries(three), doctest::Contains("at most two"), InputError);
  const Boundary zero[] = {{BoundaryKind::no_flow, 500, 0, 0, 0}};
  CHECK_THROWS_WITH_AS(validate_boundaries(zero), doctest::Contains("direction"), InputError);
  CHECK_THROWS_AS(image_wells(500, 7, corner), InputError);  // a well on a boundary
}

TEST_CASE("parallel boundaries: a truncated row of images with alternating spacing") {
  const Boundary strip[] = {{BoundaryKind::no_flow, 0, 0, 1, 0}, {BoundaryKind::no_flow, 0, 1000, 1, 0}};
  const auto s = image_wells(0, 200, strip, 10);
  CHECK(s.size() == 21);  // the real well and two images per generation
  for (const auto& i : s) {
    CHECK(i.x == doctest::Approx(0).epsilon(1e-12));
    // images of y0 = 200 across y = 0 and y = 1000 lie at 2000 n +- 200 (arithmetic)
    const double m = std::fmod(std::abs(i.y) + 200.0, 2000.0);
    const double m2 = std::fmod(std::abs(i.y) - 200.0 + 2000.0, 2000.0);
    CHECK((std::abs(m) < 1e-6 || std::abs(m - 2000) < 1e-6 || std::abs(m2) < 1e-6 || std::abs(m2 - 2000) < 1e-6));
  }
  CHECK(image_truncation_bound(40 * 1000, 1000, 1.0, (10000.0 * 10000.0) / 4.0) < 2e-8);
}

TEST_CASE("no-flow boundary: zero normal gradient on the boundary (finite difference)") {
  const TheisParameters p = example_params();
  const Boundary b[] = {{BoundaryKind::no_flow, 500, 0, 0, 1}};  // x = 500
  const PressureField bounded({injector(0, 0)}, {b[0]});
  const PressureField free({injector(0, 0)});
  const double h = 0.01, t = 86400.0 * 30;
  for (double y : {0.0, 300.0, -800.0}) {
    // second-order one-sided difference from inside the region (common practice)
    const auto ddx = [&](const PressureField& f) {
      return (3 * dp(f, p, 500, y, t) - 4 * dp(f, p, 500 - h, y, t) + dp(f, p, 500 - 2 * h, y, t)) / (2 * h);
    };
    const double g_free = ddx(free);
    CAPTURE(y);
    CHECK(std::abs(g_free) > 0.0);
    CHECK(std::abs(ddx(bounded)) <= 1e-5 * std::abs(g_free));
  }
  // The boundary doubles the pressure on itself relative to the free case (image at equal distance).
  CHECK(dp(bounded, p, 500, 0, t) == doctest::Approx(2 * dp(free, p, 500, 0, t)).epsilon(1e-14));
}

TEST_CASE("constant-pressure boundary: zero pressure change on the boundary") {
  const TheisParameters p = example_params();
  const Boundary b[] = {{BoundaryKind::constant_pressure, 0, 0, 3, 4}};  // through the origin, slope 4/3
  const PressureField field({injector(600, -100)}, {b[0]});
  const PressureField free({injector(600, -100)});
  const double t = 86400.0 * 100;
  for (double s : {-500.0, 0.0, 250.0, 1000.0}) {
    const double x = 0.6 * s, y = 0.8 * s;  // points on the line
    CAPTURE(s);
    CHECK(std::abs(dp(field, p, x, y, t)) <= 1e-12 * dp(free, p, x, y, t));
  }
}

TEST_CASE("a corner and a strip keep their boundary conditions") {
  const TheisParameters p = example_params();
  const double t = 86400.0 * 200, h = 0.01;
  // corner: no-flow x = 500, constant pressure y = 300
  const Boundary corner[] = {{BoundaryKind::no_flow, 500, 0, 0, 1}, {BoundaryKind::constant_pressure, 0, 300, 1, 0}};
  const PressureField c({injector(0, 0)}, {corner[0], corner[1]});
  const PressureField free({injector(0, 0)});
  for (double x : {-400.0, 0.0, 450.0}) CHECK(std::abs(dp(c, p, x, 300, t)) <= 1e-12 * dp(free, p, x, 300, t));
  for (double y : {-400.0, 0.0, 250.0}) {
    const double g = (3 * dp(c, p, 500, y, t) - 4 * dp(c, p, 500 - h, y, t) + dp(c, p, 500 - 2 * h, y, t)) / (2 * h);
    const double g_free = (3 * dp(free, p, 500, y, t) - 4 * dp(free, p, 500 - h, y, t) + dp(free, p, 500 - 2 * h, y, t)) / (2 * h);
    CHECK(std::abs(g) <= 1e-5 * std::abs(g_free));
  }
  // strip between constant-pressure lines y = 0 and y = 1000, with sqrt(4 D t) < 10 W
  const Boundary strip[] = {{BoundaryKind::constant_pressure, 0, 0, 1, 0}, {BoundaryKind::constant_pressure, 0, 1000, 1, 0}};
  const PressureField s({injector(0, 200)}, {strip[0], strip[1]});
  CHECK(std::sqrt(4 * p.diffusivity * t) < 10 * 1000);
  for (double x : {0.0, 700.0})
    for (double y : {0.0, 1000.0}) CHECK(std::abs(dp(s, p, x, y, t)) <= 1e-9 * dp(free, p, x, 200, t));
  // a point across a boundary is outside the modelled region
  CHECK_THROWS_WITH_AS(dp(s, p, 0, -10, t), doctest::Contains("inside the region"), InputError);
}
