#include "core/geometry/raster_grid.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geometry {

namespace {
int cells_along(double span, double cell, const char* field) {
  const double n = std::ceil(span / cell * (1.0 - 1e-9));
  if (!(n >= 1.0) || n > static_cast<double>(std::numeric_limits<int>::max()))
    throw InputError(field, std::to_string(span) + " m / " + std::to_string(cell) + " m",
                     "an extent of at least one cell and at most 2^31-1 cells");
  return static_cast<int>(n);
}
}  // namespace

RasterGrid grid_from_extent(double x_min, double y_min, double x_max, double y_max, double cell_size) {
  if (!(cell_size > 0.0) || !std::isfinite(cell_size))
    throw InputError("cell_size", std::to_string(cell_size), "a positive cell size in metres");
  for (double v : {x_min, y_min, x_max, y_max})
    if (!std::isfinite(v)) throw InputError("extent", std::to_string(v), "finite coordinates");
  if (!(x_max > x_min)) throw InputError("extent", "x_max " + std::to_string(x_max), "x_max > x_min");
  if (!(y_max > y_min)) throw InputError("extent", "y_max " + std::to_string(y_max), "y_max > y_min");
  RasterGrid g;
  g.x_origin = x_min;
  g.y_origin = y_max;
  g.cell_size = cell_size;
  g.columns = cells_along(x_max - x_min, cell_size, "extent");
  g.rows = cells_along(y_max - y_min, cell_size, "extent");
  return g;
}

RasterGrid coarsened(const RasterGrid& g, double wanted_cell, std::size_t max_cells) {
  int factor = std::max(1, static_cast<int>(std::round(wanted_cell / g.cell_size)));
  const auto cells = [&](int f) {
    return static_cast<std::size_t>((g.columns + f - 1) / f) * static_cast<std::size_t>((g.rows + f - 1) / f);
  };
  while (cells(factor) > std::max<std::size_t>(max_cells, 1)) ++factor;
  RasterGrid c = g;
  c.cell_size = g.cell_size * factor;
  c.columns = (g.columns + factor - 1) / factor;
  c.rows = (g.rows + factor - 1) / factor;
  return c;
}

}  // namespace slipscreen::geometry
