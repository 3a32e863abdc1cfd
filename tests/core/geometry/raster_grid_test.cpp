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
