#include "core/geometry/trace_segments.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "core/errors.hpp"

using namespace slipscreen::geometry;

namespace {
constexpr double kTolM = 1e-9;   // m; rounding only at 1e5..1e6 m coordinates
constexpr double kTolRad = 1e-12;
constexpr double kDeg = std::numbers::pi / 180.0;
bool near(const Point2& a, const Point2& b, double tol = kTolM) {
  return std::abs(a.x - b.x) <= tol && std::abs(a.y - b.y) <= tol;
}
}  // namespace

TEST_CASE("a straight 10 km trace splits into equal pieces no longer than the maximum") {
  // Plain geometry: 10 000 m / 3 000 m -> ceil = 4 pieces of 2 500 m.
  const std::vector<Point2> line{{400000, 4000000}, {400000, 4010000}};
  const auto segs = split_trace(line, 3000.0, 3);
  REQUIRE(segs.size() == 4);
  for (std::size_t i = 0; i < segs.size(); ++i) {
    CHECK(segs[i].index == i);
    CHECK(std::abs(segs[i].length_m - 2500.0) < kTolM);
    CHECK(std::abs(segs[i].chord_azimuth_rad - 0.0) < kTolRad);
    CHECK(near(segs[i].start, {400000, 4000000 + 2500.0 * static_cast<double>(i)}));
    CHECK(near(segs[i].centre, {400000, 4000000 + 2500.0 * (static_cast<double>(i) + 0.5)}));
    REQUIRE(segs[i].check_points.size() == 3);
    CHECK(near(segs[i].check_points[0], segs[i].start, 0.0));
    CHECK(near(segs[i].check_points[1], segs[i].centre));
    CHECK(near(segs[i].check_points[2], segs[i].end, 0.0));
  }
  // Neighbours share their cut points exactly; the trace ends are kept exactly.
  for (std::size_t i = 1; i < segs.size(); ++i) CHECK(segs[i].start == segs[i - 1].end);
  CHECK(segs.front().start == line.front());
  CHECK(segs.back().end == line.back());
}

TEST_CASE("a length that is an exact multiple of the maximum gives no sliver") {
  const auto segs = split_trace({{0, 0}, {0, 3000}}, 1000.0, 1);
  CHECK(segs.size() == 3);
  const auto one = split_trace({{0, 0}, {0, 800}}, 1000.0, 1);
  REQUIRE(one.size() == 1);
  REQUIRE(one[0].check_points.size() == 1);
  CHECK(near(one[0].check_points[0], {0, 400}));  // k = 1: the arc-length midpoint
}

TEST_CASE("a bent trace keeps its interior vertex and takes the chord strike") {
  // An L: 3 km east then 4 km north (L = 7 km), one piece: chord from (0,0) to (3000,4000)
  // has azimuth atan2(3, 4) = 36.8699° (plain trigonometry).
  const std::vector<Point2> ell{{0, 0}, {3000, 0}, {3000, 4000}};
  const auto one = split_trace(ell, 10000.0, 2);
  REQUIRE(one.size() == 1);
  CHECK(one[0].vertices.size() == 3);
  CHECK(std::abs(one[0].length_m - 7000.0) < kTolM);
  CHECK(std::abs(one[0].chord_azimuth_rad - std::atan2(3.0, 4.0)) < kTolRad);
  CHECK(near(one[0].centre, {3000, 500}));  // 3.5 km along: 0.5 km up the second leg

  // Two pieces of 3.5 km: the first ends 500 m up the second leg and keeps the corner.
  const auto two = split_trace(ell, 3500.0, 5);
  REQUIRE(two.size() == 2);
  CHECK(two[0].vertices.size() == 3);
  CHECK(near(two[0].vertices[1], {3000, 0}, 0.0));
  CHECK(near(two[0].end, {3000, 500}));
  CHECK(two[1].vertices.size() == 2);
  CHECK(std::abs(two[1].chord_azimuth_rad - 0.0) < kTolRad);
  CHECK(std::abs(two[0].length_m + two[1].length_m - 7000.0) < kTolM);
  // Five check points at 0, 875, 1750, 2625, 3500 m along the first piece.
  REQUIRE(two[0].check_points.size() == 5);
  CHECK(near(two[0].check_points[1], {875, 0}));
  CHECK(near(two[0].check_points[3], {2625, 0}));
  CHECK(near(two[0].check_points[4], {3000, 500}));
}

TEST_CASE("a trace towards the south-west has azimuth 225°") {
  const auto segs = split_trace({{1000, 1000}, {0, 0}}, 5000.0, 1);
  REQUIRE(segs.size() == 1);
  CHECK(std::abs(segs[0].chord_azimuth_rad - 225 * kDeg) < kTolRad);
}

TEST_CASE("repeated vertices are dropped; degenerate input is refused") {
  const auto segs = split_trace({{0, 0}, {0, 0}, {0, 100}, {0, 100}}, 1000.0, 1);
  REQUIRE(segs.size() == 1);
  CHECK(segs[0].vertices.size() == 2);
  CHECK_THROWS_AS(split_trace({{5, 5}, {5, 5}}, 1000.0, 1), slipscreen::InputError);
  CHECK_THROWS_AS(split_trace({{0, 0}}, 1000.0, 1), slipscreen::InputError);
  CHECK_THROWS_AS(split_trace({{0, 0}, {0, NAN}}, 1000.0, 1), slipscreen::InputError);
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {0, 1}}, 0.0, 1), doctest::Contains("max_segment_length"),
                       slipscreen::InputError);
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {0, 1}}, 10.0, 0), doctest::Contains("check_points"),
                       slipscreen::InputError);
}

TEST_CASE("a straight trace from centre, strike and length") {
  // Strike N30E, 2 km long, centred at (1000, 1000): ends 1 km either way along (sin 30°, cos 30°).
  const auto t = straight_trace({1000, 1000}, 30 * kDeg, 2000.0);
  REQUIRE(t.size() == 2);
  CHECK(near(t[0], {1000 - 500.0, 1000 - 1000 * std::sqrt(3.0) / 2}));
  CHECK(near(t[1], {1000 + 500.0, 1000 + 1000 * std::sqrt(3.0) / 2}));
  const auto segs = split_trace(t, 1000.0, 1);
  REQUIRE(segs.size() == 2);
  CHECK(std::abs(segs[0].chord_azimuth_rad - 30 * kDeg) < kTolRad);
  CHECK(near(segs[0].end, {1000, 1000}));
  CHECK_THROWS_AS(straight_trace({0, 0}, 0.0, 0.0), slipscreen::InputError);
}

TEST_CASE("implausible traces are refused before anything is allocated, naming the vertex") {
  // 1e12 m: the trace a coordinate typo makes; it would be 5e8 segments at 2 km.
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {0, 9e7}, {9e7, 9e7}}, 2000.0, 1),
                       doctest::Contains("field 'trace length' = '1.8e+08 m': expected a fault trace of at most 1000 km"),
                       slipscreen::InputError);
  CHECK_THROWS_WITH_AS(segment_count({{0, 0}, {1e12, 0}}, 2000.0), doctest::Contains("trace vertex 2"),
                       slipscreen::InputError);
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {0, 1}, {-1e308, 1e308}}, 2000.0, 1),
                       doctest::Contains("field 'trace vertex 3' = '(-1e+308, 1e+308)': expected projected coordinates"),
                       slipscreen::InputError);
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {INFINITY, 1}}, 2000.0, 1),
                       doctest::Contains("field 'trace vertex 2' = '(inf, 1)': expected finite x and y"),
                       slipscreen::InputError);
  // 1000 km at 1 m segments would be 1e6 segments: more than 100 000 per trace.
  CHECK_THROWS_WITH_AS(split_trace({{0, 0}, {0, 1e6}}, 1.0, 1),
                       doctest::Contains("field 'max_segment_length' = '1 m': expected a segment length giving at most "
                                         "100000 segments on a trace of 1e+06 m (it gives 1e+06)"),
                       slipscreen::InputError);
  // The limits themselves are accepted: 1000 km in 100 000 segments of 10 m.
  CHECK(segment_count({{0, 0}, {0, 1e6}}, 10.0) == 100000);
  CHECK(segment_count({{0, 0}, {0, 1e6}, {0, 1e6}}, 2000.0) == 500);
  CHECK(segment_count({{-1e8, 0}, {-1e8 + 10, 0}}, 2000.0) == 1);
}
