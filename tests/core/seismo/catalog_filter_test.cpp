#include "core/seismo/catalog_filter.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"
#include "core/seismo/epicentral_distance.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
Catalog projected_catalog() {
  Catalog c;
  c.kind = CoordinateKind::projected;
  c.crs = "EPSG:32614";
  auto add = [&](const char* id, double t, double x, double y, std::optional<double> z, double m, const char* type) {
    c.events.push_back({id, t, x, y, z, m, type, std::string("test event ") + id});
  };
  add("a", 100.0, 0.0, 0.0, 3000.0, 1.0, "ML");
  add("b", 200.0, 500.0, 500.0, 4000.0, 2.0, "Mw");
  add("c", 300.0, 5000.0, 0.0, 9000.0, 1.5, "mb");
  add("d", 400.0, -200.0, 100.0, std::nullopt, 2.5, "mB");
  add("e", 500.0, 100.0, -100.0, 3500.0, 0.5, "");
  return c;
}
}  // namespace

TEST_CASE("time window, polygon, buffer, depth and magnitude filters count what they leave out") {
  const auto c = projected_catalog();
  CatalogFilter f;
  f.start = 150.0;
  f.end = 500.0;  // end exclusive: event e at 500 is out
  auto r = apply_filter(c, f);
  CHECK(r.counts.kept == 3);
  CHECK(r.counts.outside_time == 2);

  CatalogFilter poly;
  poly.polygon = {{-1000.0, -1000.0}, {1000.0, -1000.0}, {1000.0, 1000.0}, {-1000.0, 1000.0}};
  r = apply_filter(c, poly);
  CHECK(r.counts.outside_polygon == 1);  // c at x = 5 km
  CHECK(r.counts.kept == 4);

  CatalogFilter buf;
  buf.buffer_points = {{0.0, 0.0}, {5000.0, 100.0}};
  buf.buffer_radius = 300.0;  // a (0 m), c (100 m from the 2nd point), d (224 m), e (141 m) in; b (707 m) out
  r = apply_filter(c, buf);
  CHECK(r.counts.outside_buffer == 1);
  CHECK(r.catalog.events.size() == 4);

  CatalogFilter depth;
  depth.depth_min = 2500.0;
  depth.depth_max = 5000.0;
  r = apply_filter(c, depth);
  CHECK(r.counts.outside_depth == 1);  // c at 9 km
  CHECK(r.counts.missing_depth == 1);  // d unknown
  CHECK(r.counts.kept == 3);

  CatalogFilter mag;
  mag.min_magnitude = 1.5;
  CHECK(apply_filter(c, mag).counts.below_magnitude == 2);
}

TEST_CASE("magnitude-type filter, mb versus mB, and strict mode") {
  const auto c = projected_catalog();
  CatalogFilter f;
  f.magnitude_types = {"ml", "MB"};  // case-insensitive, except mb/mB are distinct magnitudes
  auto r = apply_filter(c, f);
  CHECK(r.counts.kept == 1);                   // a (ML)
  CHECK(r.counts.other_magnitude_type == 3);   // b Mw, c mb, d mB ("MB" matches neither exactly)
  CHECK(r.counts.unknown_magnitude_type == 1); // e has no type
  f.magnitude_types = {"mB"};
  CHECK(apply_filter(c, f).catalog.events.at(0).id == "d");
  f.strict = true;
  CHECK_THROWS_WITH_AS(apply_filter(c, f), doctest::Contains("test event e"), InputError);
  CHECK(is_known_magnitude_type("Mww"));
  CHECK_FALSE(is_known_magnitude_type("Mq"));
}

TEST_CASE("bad filter definitions are input errors") {
  const auto c = projected_catalog();
  CatalogFilter f;
  f.polygon = {{0.0, 0.0}, {1.0, 1.0}};
  CHECK_THROWS_AS(apply_filter(c, f), InputError);
  CatalogFilter t;
  t.start = 10.0;
  t.end = 5.0;
  CHECK_THROWS_AS(apply_filter(c, t), InputError);
}

TEST_CASE("epicentral distances") {
  // Planar: 3-4-5 triangle (arithmetic).
  CHECK(epicentral_distance(CoordinateKind::projected, 0, 0, 3000, 4000) == doctest::Approx(5000.0).epsilon(1e-15));
  // Haversine on R = 6371008.8 m: 1 degree of latitude = R π/180 = 111195.08 m (arithmetic).
  CHECK(epicentral_distance(CoordinateKind::geographic, -98.0, 35.0, -98.0, 36.0) ==
        doctest::Approx(111195.0802335).epsilon(1e-10));
  // One degree of longitude at 60° N: 55597.0109 m by the haversine formula evaluated with
  // /usr/bin/python3 math (slightly less than R π/180 · cos 60° = 55597.54 m along the parallel).
  CHECK(epicentral_distance(CoordinateKind::geographic, 10.0, 60.0, 11.0, 60.0) ==
        doctest::Approx(55597.0108649).epsilon(1e-10));
}

TEST_CASE("reprojection seam applies the caller's transform") {
  const auto c = projected_catalog();
  const auto moved = reprojected(c, [](double x, double y) { return std::array<double, 2>{x + 10.0, 2.0 * y}; },
                                 CoordinateKind::projected, "EPSG:3857");
  CHECK(moved.crs == "EPSG:3857");
  CHECK(moved.events[1].x == 510.0);
  CHECK(moved.events[1].y == 1000.0);
  CHECK(magnitudes(moved)[1] == 2.0);
}
