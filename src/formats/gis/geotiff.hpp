#pragma once
// Multi-band Float32 GeoTIFF output (one band per output time).
//
// Layout of the file written by write_geotiff():
// - Float32, one band per entry of `bands`, band description = the caller's string (the ISO
//   date of the output time, e.g. "2031-06-30"), optional unit (band unit type, e.g. "Pa").
// - Georeferencing: the CRS (full WKT from the Crs) and the geotransform of the RasterGrid,
//   whose origin is the top-left corner of the top-left pixel (GDAL "pixel is area"); see
//   core/geometry/raster_grid.hpp. Row 0 is the northern row.
// - Nodata: options.nodata is set on every band; NaN values in the input are written as it.
// - Every band: colour interpretation gray index (a GIS does not read three dates as red, green
//   and blue) and exact statistics (STATISTICS_MINIMUM, _MAXIMUM, _MEAN, _STDDEV: GDAL's
//   ComputeStatistics over the valid cells, stored in the file's GDAL metadata; none for a band
//   without a valid cell). TIFF can say "gray" only of the first band (PHOTOMETRIC=MINISBLACK);
//   GDAL (3.6) keeps the gray index of bands 2, 3, ... in its sidecar `<path>.aux.xml`
//   (band_sidecar(path)), which every GDAL reader (QGIS too) reads with the file. A one-band
//   raster has no sidecar.
// - Plain GeoTIFF: tiled 256×256, DEFLATE with the floating-point predictor (PREDICTOR=3).
// - Cloud-Optimized GeoTIFF (options.cloud_optimized): written with GDAL's COG driver
//   (CreateCopy from an in-memory dataset), DEFLATE + predictor, 256×256 tiles, overviews by
//   averaging when the raster is larger than one tile; gdalinfo then reports LAYOUT=COG.
// - Dataset metadata items (options.metadata) are written as GDAL metadata (e.g. the quantity
//   and the screening caution).
// The file is written in place at `path` (run_folder provides the all-or-nothing rename).
#include <filesystem>
#include <map>
#include <string>
#include <vector>

#include "core/geometry/raster_grid.hpp"
#include "formats/gis/crs.hpp"

namespace slipscreen::formats {

struct RasterBand {
  std::string description;   // ISO date of the output time (any string is kept as given)
  std::vector<float> values;  // grid.cell_count() values, row-major, northern row first
};

// Set members by name (GeoTiffOptions o; o.cloud_optimized = true;): a designated initializer
// that leaves out trailing members trips -Wmissing-field-initializers under -Wextra.
struct GeoTiffOptions {
  bool cloud_optimized = false;
  float nodata = -9999.0f;
  std::string unit;                               // band unit type, e.g. "Pa"; empty = none
  std::map<std::string, std::string> metadata;    // dataset metadata items
};

// "<path>.aux.xml": where GDAL keeps the colour interpretation of bands 2, 3, ...
std::filesystem::path band_sidecar(const std::filesystem::path& path);

// Throws InputError when a band has the wrong number of values or there are no bands, and
// IoError naming `path` when GDAL cannot create or write the file.
void write_geotiff(const std::filesystem::path& path, const geometry::RasterGrid& grid, const Crs& crs,
                   const std::vector<RasterBand>& bands, const GeoTiffOptions& options = {});

}  // namespace slipscreen::formats
