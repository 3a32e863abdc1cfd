#include "core/geometry/raster_grid.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen::geometry;

TEST_CASE("grid from extent anchors at the north-west corner, pixel-is-area") {
  // GDAL raster data model: geotransform origin is the top-left corner of the top-left pixel.
  const RasterGrid g = grid_from_extent(600000, 3980000, 610000, 3986000, 1000);
  CHECK(g.columns == 10);  // exact multiple: no extra cell
  CHECK(g.rows == 6);
  CHECK(g.x_origin == 600000.0);
  CHECK(g.y_origin == 3986000.0);
  const auto gt = g.geotransform();
  CHECK(gt[0] == 600000.0);
  CHECK(gt[1] == 1000.0);
  CHECK(gt[2] == 0.0);
  CHECK(gt[3] == 3986000.0);
  CHECK(gt[4] == 0.0);
  CHECK(gt[5] == -1000.0);
  // Centre of the top-left cell is half a cell in from the corner; row grows south.
  CHECK(g.cell_centre(0, 0) == Point2{600500.0, 3985500.0});
  CHECK(g.cell_centre(9, 5) == Point2{609500.0, 3980500.0});
  CHECK(g.index(3, 2) == 23u);
  CHECK(g.cell_count() == 60u);
}

TEST_CASE("a partial last cell is covered") {
  const RasterGrid g = grid_from_extent(0, 0, 2500, 1001, 1000);
  CHECK(g.columns == 3);
  CHECK(g.rows == 2);
}

TEST_CASE("bad grids are refused") {
  CHECK_THROWS_WITH_AS(grid_from_extent(0, 0, 10, 10, 0), doctest::Contains("cell_size"), slipscreen::InputError);
  CHECK_THROWS_AS(grid_from_extent(10, 0, 0, 10, 1), slipscreen::InputError);
  CHECK_THROWS_AS(grid_from_extent(0, 10, 10, 10, 1), slipscreen::InputError);
  CHECK_THROWS_AS(grid_from_extent(0, 0, 1e300, 10, 1e-300), slipscreen::InputError);
}

TEST_CASE("a coarsened grid keeps the corner and covers the fine grid") {
  // 100 x 60 cells of 500 m. Wanted 2 km: factor 4 -> 25 x 15 cells (exact division).
  RasterGrid g{1000.0, 9000.0, 500.0, 100, 60};
  const RasterGrid c = coarsened(g, 2000.0, 10000);
  CHECK(c.x_origin == 1000.0);
  CHECK(c.y_origin == 9000.0);
  CHECK(c.cell_size == 2000.0);
  CHECK(c.columns == 25);
  CHECK(c.rows == 15);
  // A cap of 100 cells: factor 4 gives 375 cells; the first factor with <= 100 is 8
  // (ceil(100/8) * ceil(60/8) = 13 * 8 = 104 > 100), 9 (12 * 7 = 84).
  const RasterGrid d = coarsened(g, 2000.0, 100);
  CHECK(d.cell_size == 4500.0);
  CHECK(d.columns == 12);
  CHECK(d.rows == 7);
  CHECK(d.columns * d.cell_size >= g.columns * g.cell_size);
  CHECK(d.rows * d.cell_size >= g.rows * g.cell_size);
  // A wanted cell below the fine one keeps the fine grid.
  CHECK(coarsened(g, 100.0, 1000000).cell_size == 500.0);
}
