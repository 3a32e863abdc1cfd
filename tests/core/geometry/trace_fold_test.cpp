// Folds of a fault trace; expected angles and crossing points by plain plane geometry.
#include "core/geometry/trace_fold.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <string>

using namespace slipscreen::geometry;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;
constexpr double kTolRad = 1e-12;
}  // namespace

TEST_CASE("straight, bent and zig-zag traces do not fold") {
  CHECK(!find_fold({{0, 0}, {1000, 0}}));
  CHECK(!find_fold({{0, 0}, {1000, 0}, {2000, 500}, {3000, 0}}));                // turns of 26.6 and 53.1 deg
  CHECK(!find_fold({{0, 0}, {0, 1000}, {100, 1000}, {100, 2000}}));              // two right angles
  CHECK(!find_fold({{0, 0}, {0, 0}, {0, 1000}, {0, 1000}, {0, 2000}}));          // repeats are no edges
  CHECK(!find_fold({{500000, 6e6}, {500010, 6e6 + 1}}));
  CHECK(!find_fold({}));
  CHECK(!find_fold({{1, 1}}));
}

TEST_CASE("a turn of more than 150 degrees is found at its vertex") {
  // 1 km east, then back towards the west-north-west: the turn is 180 - atan2(1, 4) = 165.96 deg.
  const auto f = find_fold({{0, 0}, {1000, 0}, {600, 100}});
  REQUIRE(f);
  CHECK(f->kind == TraceFold::Kind::turns_back);
  CHECK(f->vertex == 1);
  CHECK(std::abs(f->turn_rad - (std::numbers::pi - std::atan2(1.0, 4.0))) < kTolRad);
  CHECK(f->at == Point2{1000, 0});
  CHECK(describe(*f, 3) == "turns back by 166 deg at vertex 2 of 3 (1000, 0)");

  // Exactly back along itself: 180 deg; a repeated vertex before the turn keeps the given index.
  const auto back = find_fold({{0, 0}, {0, 500}, {0, 500}, {0, 100}});
  REQUIRE(back);
  CHECK(back->vertex == 1);
  CHECK(std::abs(back->turn_rad - std::numbers::pi) < kTolRad);

  // 149 deg passes the default limit, and is a fold under a stricter one.
  const std::vector<Point2> t{{0, 0}, {1000, 0}, {1000 + 1000 * std::cos(149 * kDeg), 1000 * std::sin(149 * kDeg)}};
  CHECK(!find_fold(t));
  CHECK(find_fold(t, 140 * kDeg));
}

TEST_CASE("a trace that crosses or touches itself is found at the later edge") {
  // A loop made of gentle turns (90 deg each) whose fourth edge crosses the first at (0.5, 0).
  const auto f = find_fold({{0, 0}, {2, 0}, {2, 1}, {0.5, 1}, {0.5, -1}});
  REQUIRE(f);
  CHECK(f->kind == TraceFold::Kind::crosses_itself);
  CHECK(f->vertex == 3);
  CHECK(f->other_vertex == 0);
  CHECK(f->at == Point2{0.5, 0});
  CHECK(describe(*f, 5) == "crosses itself: the edge from vertex 4 of 5 meets the edge from vertex 1 at (0.5, 0)");

  // A closed ring touches its own start.
  const auto ring = find_fold({{0, 0}, {10, 0}, {10, 10}, {0, 10}, {0, 0}});
  REQUIRE(ring);
  CHECK(ring->kind == TraceFold::Kind::crosses_itself);
  CHECK(ring->vertex == 3);
  CHECK(ring->other_vertex == 0);

  // Of two crossings the one reached first along the trace is reported: the first edge, on the
  // y axis, is crossed by the 4th edge (at y = 5.5) and, later, by the 6th (at y = 2.5); every
  // turn is 90 or 63.4 deg.
  const auto two = find_fold({{0, 0}, {0, 10}, {1, 10}, {1, 6}, {-1, 5}, {-1, 3}, {1, 2}, {1, 1}});
  REQUIRE(two);
  CHECK(two->vertex == 3);
  CHECK(two->other_vertex == 0);
}

TEST_CASE("folds are found on a north-south trace with many vertices") {
  // 20 001 vertices 1 m apart along y (sorted along the longer side, y), then a hook back
  // across the line at y = 10 000.
  std::vector<Point2> v;
  for (int i = 0; i <= 20000; ++i) v.push_back({0, static_cast<double>(i)});
  CHECK(!find_fold(v));
  v.push_back({5, 20000});
  v.push_back({5, 10000});
  v.push_back({-5, 9000});
  const auto f = find_fold(v);
  REQUIRE(f);
  CHECK(f->kind == TraceFold::Kind::crosses_itself);
  CHECK(f->vertex == 20002);
}
