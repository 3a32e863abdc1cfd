#include "core/geometry/azimuth.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "core/errors.hpp"

using namespace slipscreen::geometry;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;
constexpr double kTol = 1e-12;  // rad; rounding of atan2 and fmod only
}  // namespace

TEST_CASE("grid azimuth is clockwise from +y (north)") {
  // Compass directions by definition of azimuth (common practice).
  const Point2 o{500000.0, 4000000.0};
  CHECK(std::abs(azimuth(o, {o.x, o.y + 10}) - 0.0) < kTol);
  CHECK(std::abs(azimuth(o, {o.x + 10, o.y}) - 90 * kDeg) < kTol);
  CHECK(std::abs(azimuth(o, {o.x, o.y - 10}) - 180 * kDeg) < kTol);
  CHECK(std::abs(azimuth(o, {o.x - 10, o.y}) - 270 * kDeg) < kTol);
  CHECK(std::abs(azimuth(o, {o.x + 10, o.y + 10}) - 45 * kDeg) < kTol);
  // N30E: dx = sin 30°, dy = cos 30° (definition of azimuth).
  CHECK(std::abs(azimuth({0, 0}, {0.5, std::sqrt(3.0) / 2}) - 30 * kDeg) < kTol);
  // Just west of north stays near 2π, never negative.
  const double a = azimuth(o, {o.x - 1e-6, o.y + 1.0});
  CHECK(a > 359.9 * kDeg);
  CHECK(a < 2 * std::numbers::pi);
}

TEST_CASE("coincident points have no azimuth") {
  CHECK_THROWS_AS(azimuth({1, 2}, {1, 2}), slipscreen::InputError);
}

TEST_CASE("normalize_azimuth and azimuth_difference") {
  CHECK(std::abs(normalize_azimuth(-90 * kDeg) - 270 * kDeg) < kTol);
  CHECK(std::abs(normalize_azimuth(450 * kDeg) - 90 * kDeg) < kTol);
  CHECK(normalize_azimuth(-1e-300) < 2 * std::numbers::pi);
  CHECK(std::abs(azimuth_difference(350 * kDeg, 10 * kDeg) - 20 * kDeg) < kTol);
  CHECK(std::abs(azimuth_difference(10 * kDeg, 190 * kDeg) - 180 * kDeg) < kTol);
}

TEST_CASE("strike from dip direction follows the right-hand rule") {
  // Right-hand rule: dip direction = strike + 90° (common practice).
  // Trace digitised towards the north; fault dips east -> strike 0°.
  CHECK(std::abs(strike_for_dip_direction(0.0, 90 * kDeg) - 0.0) < kTol);
  // Same trace, fault dips west -> strike 180°.
  CHECK(std::abs(strike_for_dip_direction(0.0, 270 * kDeg) - 180 * kDeg) < kTol);
  // Trace towards N60E, dip direction S (180°): 60+90 = 150 is within 90° of 180 -> strike 60°.
  CHECK(std::abs(strike_for_dip_direction(60 * kDeg, 180 * kDeg) - 60 * kDeg) < kTol);
  // Dip direction N (0°) on that trace: right side is 150°, 150° away -> strike 240°.
  CHECK(std::abs(strike_for_dip_direction(60 * kDeg, 0.0) - 240 * kDeg) < kTol);
  // A dip direction along the trace is ambiguous.
  CHECK_THROWS_WITH_AS(strike_for_dip_direction(0.0, 0.0, "dip_dir"), doctest::Contains("dip_dir"),
                       slipscreen::InputError);
}
