#pragma once
// The area of a raster at or above a level, as polygons, by GDAL's contour generator
// (GDALContourGenerateEx with POLYGONIZE=YES and one fixed level; GDAL's marching squares over
// the cell centres, with the contour placed by linear interpolation between them).
//
// - The values are on `grid` (row-major, northern row first, value at each cell centre;
//   core/geometry/raster_grid.hpp). NaN is no value: GDAL leaves cells without a value out.
// - The polygons are those GDAL makes for the interval from `level` to the raster's maximum:
//   each an exterior ring and its holes, in the grid's coordinates (metres). They follow the
//   cell centres, so a region reaching the raster's edge is closed along the outermost cell
//   centres (half a cell inside the raster's edge).
// - No polygon when no value reaches the level.
// Accuracy: the contour lies where linear interpolation between neighbouring cell centres
// crosses the level, so the error in its position is of the order of the cell size times the
// relative curvature of the field over one cell (checked against a Theis well in the test).
#include <vector>

#include "core/geometry/raster_grid.hpp"
#include "formats/gis/geopackage.hpp"

namespace slipscreen::formats {

// Throws InputError for a values count that does not match the grid or a non-finite level, and
// IoError when GDAL fails.
std::vector<PolygonRings> area_at_or_above(const geometry::RasterGrid& grid, const std::vector<double>& values,
                                           double level);

}  // namespace slipscreen::formats
