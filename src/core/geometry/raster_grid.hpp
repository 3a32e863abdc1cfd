#pragma once
// A north-up regular grid of square cells in the working CRS (metres), as used for output
// rasters. Pure geometry: the physics evaluates fields at cell centres; io/geotiff_writer
// writes them.
//
// Pixel convention (the GDAL "pixel is area" convention):
// - (x_origin, y_origin) is the top-left corner of the top-left cell (column 0, row 0), i.e. the
//   north-west corner of the grid. It is the GDAL geotransform origin.
// - Column c grows east, row r grows south. Cell (c, r) covers
//   [x_origin + c·cell, x_origin + (c+1)·cell] × [y_origin − (r+1)·cell, y_origin − r·cell];
//   its centre is (x_origin + (c + ½)·cell, y_origin − (r + ½)·cell).
// - Values are stored row-major, northern row first: index = r·columns + c.
// - Geotransform = (x_origin, cell, 0, y_origin, 0, −cell).
#include <array>
#include <cstddef>

#include "core/geometry/point.hpp"

namespace slipscreen::geometry {

struct RasterGrid {
  double x_origin = 0.0;   // m, west edge of column 0
  double y_origin = 0.0;   // m, north edge of row 0
  double cell_size = 1.0;  // m, square cells
  int columns = 0;
  int rows = 0;

  std::size_t cell_count() const { return static_cast<std::size_t>(columns) * static_cast<std::size_t>(rows); }
  std::size_t index(int column, int row) const {
    return static_cast<std::size_t>(row) * static_cast<std::size_t>(columns) + static_cast<std::size_t>(column);
  }
  Point2 cell_centre(int column, int row) const {
    return {x_origin + (column + 0.5) * cell_size, y_origin - (row + 0.5) * cell_size};
  }
  // GDAL geotransform (x_origin, cell, 0, y_origin, 0, −cell).
  std::array<double, 6> geotransform() const { return {x_origin, cell_size, 0.0, y_origin, 0.0, -cell_size}; }
};

// The grid covering the extent [x_min, x_max] × [y_min, y_max] with cells of `cell_size`,
// anchored at the north-west corner (x_min, y_max); the last column/row reaches at or past
// x_max / y_min (columns = ceil((x_max − x_min)/cell), with a 1e-9 relative allowance so an
// exact multiple adds no extra cell). Throws InputError for a non-positive cell size, an empty
// or inverted extent, or more than 2^31−1 cells per side.
RasterGrid grid_from_extent(double x_min, double y_min, double x_max, double y_max, double cell_size);

// The grid with the same north-west corner and cells a whole factor larger: the factor nearest
// wanted_cell / cell_size (at least 1), raised until the grid has at most max_cells cells. The
// coarse grid covers the fine one (its last column/row may reach past it).
RasterGrid coarsened(const RasterGrid& g, double wanted_cell, std::size_t max_cells);

}  // namespace slipscreen::geometry
