#pragma once
// Reading back what a run wrote, for drawing (docs/report.md): one band of a GeoTIFF with its
// grid, and the geometries of one vector layer with one text attribute. Strict: a file or layer
// that is missing, or a band of another size than its grid, is an IoError naming the file.
//
//   const auto band = read_band_back(run / "pressure_change.tif", -1);   // the last band
//   const auto faults = read_layer_geometries(run / "screen.gpkg", "fault_segments", "segment_id");
#include <filesystem>
#include <string>
#include <vector>

#include "core/geometry/point.hpp"
#include "core/geometry/raster_grid.hpp"

namespace slipscreen::formats {

struct RasterBandRead {
  geometry::RasterGrid grid;    // north-up, square cells (IoError otherwise)
  std::vector<double> values;   // row-major, northern row first; nodata as NaN
  std::string description;      // the band's description (the ISO date of a run's band)
  int band = 0;                 // 1-based band number read
  int bands = 0;                // bands in the file
};

// Band `band` (1-based; −1: the last band). Throws IoError naming `path`.
RasterBandRead read_band_back(const std::filesystem::path& path, int band);

struct LayerGeometry {
  std::string attribute;                                // the named attribute as text
  std::vector<std::vector<geometry::Point2>> parts;     // one point list per line/point part
};

// Every feature of `layer` with its geometry's vertices (lines and multi-lines: one part per
// line; points: one part of one point). Throws IoError naming `path` and the layer.
std::vector<LayerGeometry> read_layer_geometries(const std::filesystem::path& path, const std::string& layer,
                                                const std::string& attribute);

}  // namespace slipscreen::formats
