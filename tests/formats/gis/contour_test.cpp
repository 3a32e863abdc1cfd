#include "formats/gis/contour.hpp"

#include <doctest/doctest.h>
#include <ogr_geometry.h>

#include <boost/math/special_functions/expint.hpp>
#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;

namespace {

// Area of the polygons by GDAL's own geometry (OGRPolygon::get_Area: the exterior ring's area
// minus the holes'), the reference library for the check below.
double gdal_area(const std::vector<formats::PolygonRings>& polygons) {
  double a = 0;
  for (const auto& p : polygons) {
    OGRPolygon poly;
    for (const auto& ring : p.rings) {
      auto* r = new OGRLinearRing;
      for (const auto& v : ring) r->addPoint(v.x, v.y);
      r->closeRings();
      poly.addRingDirectly(r);
    }
    a += poly.get_Area();
  }
  return a;
}

// The Theis exponential integral W(u) = E1(u) (Theis 1935) from Boost.Math, the reference.
double theis_w(double u) { return boost::math::expint(1, u); }

// The u where W(u) = w, by bisection on the decreasing W.
double u_where_w(double w) {
  double lo = 1e-12, hi = 50;
  for (int i = 0; i < 200; ++i) {
    const double mid = std::sqrt(lo * hi);
    (theis_w(mid) > w ? lo : hi) = mid;
  }
  return std::sqrt(lo * hi);
}

}  // namespace

TEST_CASE("the area at or above a Theis level matches pi r^2 where dp(r) = level") {
  // One well at (x0, y0), dp(r) = A W(r^2 / (4 D t)) (Theis 1935) with A = 1 MPa and
  // 4 D t = 1e7 m^2; the level 0.5 MPa is reached at r* = sqrt(4 D t u*) with W(u*) = 0.5
  // (u* ~ 0.56, r* ~ 2,370 m). Grid: 50 m cells over 12 km, the well off the cell centres.
  const double a = 1e6, four_dt = 1e7, level = 0.5e6;
  const geometry::RasterGrid grid{0.0, 12000.0, 50.0, 240, 240};
  const double x0 = 6010.0, y0 = 5985.0;
  std::vector<double> dp(grid.cell_count());
  for (int r = 0; r < grid.rows; ++r)
    for (int c = 0; c < grid.columns; ++c) {
      const auto p = grid.cell_centre(c, r);
      const double r2 = (p.x - x0) * (p.x - x0) + (p.y - y0) * (p.y - y0);
      dp[grid.index(c, r)] = a * theis_w(r2 / four_dt);
    }
  const double r_star = std::sqrt(four_dt * u_where_w(level / a));
  const double expected = M_PI * r_star * r_star;
  const auto polygons = formats::area_at_or_above(grid, dp, level);
  REQUIRE(polygons.size() == 1);
  CHECK(polygons[0].rings.size() == 1);  // a disc: no hole
  const double area = gdal_area(polygons);
  // Tolerance 0.1 % of the area. The contour is a polygon through points placed by linear
  // interpolation between cell centres 50 m apart on a circle of r* ~ 2.4 km: the chords cut
  // off ~ (2 pi^2 / 3) / N^2 of the area with N ~ 2 pi r* / h ~ 300 vertices (~7e-5), and the
  // interpolation misplaces the crossing by ~ h^2 |dp''| / (8 |dp'|) ~ h^2 / (8 r*) (< 0.2 m),
  // ~2e-4 of the area. 1e-3 holds both with room, and fails for a contour one cell off
  // (2 h / r* ~ 4 %).
  INFO("Theis disc: contour area " << area << " m2, pi r*^2 " << expected << " m2");
  CHECK(std::abs(area - expected) / expected < 1e-3);  // 2.7e-5 seen
  // The centre of the area is the well (the disc is symmetric), within a cell.
  OGRPolygon poly;
  auto* ring = new OGRLinearRing;
  for (const auto& v : polygons[0].rings[0]) ring->addPoint(v.x, v.y);
  ring->closeRings();
  poly.addRingDirectly(ring);
  OGRPoint centroid;
  REQUIRE(poly.Centroid(&centroid) == OGRERR_NONE);
  CHECK(std::abs(centroid.getX() - x0) < 5.0);
  CHECK(std::abs(centroid.getY() - y0) < 5.0);
}

TEST_CASE("the area at or above a level: a ring with a hole, nothing above, NaN cells, bad input") {
  // A square annulus: values 1 on a ring of cells, 0 inside and outside it.
  const geometry::RasterGrid grid{0.0, 100.0, 10.0, 10, 10};
  std::vector<double> v(grid.cell_count(), 0.0);
  for (int r = 2; r <= 7; ++r)
    for (int c = 2; c <= 7; ++c)
      if (r == 2 || r == 7 || c == 2 || c == 7) v[grid.index(c, r)] = 1.0;
  const auto ring = formats::area_at_or_above(grid, v, 0.5);
  REQUIRE(ring.size() == 1);
  CHECK(ring[0].rings.size() == 2);  // exterior and the hole
  // With linear interpolation the 0.5 level lies half-way between centres: the outer square
  // spans 60 m with its four corners cut by a 5 m x 5 m triangle (3600 - 4 x 12.5), the hole
  // 40 m with its corners cut the same way (1600 - 4 x 12.5): 3550 - 1550 = 2000 m^2 (by hand).
  // Within 0.01 m^2: GDAL places the crossings in its own floating-point arithmetic (4e-3 m^2 seen).
  CHECK(std::abs(gdal_area(ring) - 2000.0) < 1e-2);

  CHECK(formats::area_at_or_above(grid, std::vector<double>(grid.cell_count(), 0.1), 0.5).empty());
  std::vector<double> with_nan = v;
  with_nan[0] = std::nan("");
  CHECK(formats::area_at_or_above(grid, with_nan, 0.5).size() == 1);
  CHECK_THROWS_AS(formats::area_at_or_above(grid, std::vector<double>(3, 0.0), 0.5), InputError);
  CHECK_THROWS_AS(formats::area_at_or_above(grid, v, std::nan("")), InputError);
}
