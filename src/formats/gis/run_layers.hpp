#pragma once
// Reading back the GIS files of a finished run for drawing (docs/report.md): one band of a
// GeoTIFF, the lines of equal value through it (GDAL's contour generator, GDALContourGenerateEx),
// and the features of a vector layer with their attributes as text. Strict: a file or layer that
// cannot be read is an IoError naming it; nothing is guessed.
#include <filesystem>
#include <map>
#include <string>
#include <vector>

namespace slipscreen::formats {

struct RasterBandData {
  int width = 0, height = 0;
  double x0 = 0, dx = 1, y0 = 0, dy = -1;  // geotransform (north-up: dy < 0); x = x0 + (col + ½) dx at cell centres
  std::vector<double> values;              // row-major, top row first; NaN where nodata
  std::string description;                 // the band's description (the ISO date for the run's rasters)
  std::string crs_name;                    // the CRS's name as GDAL gives it ("WGS 84 / UTM zone 8S")
  std::string crs_authority;               // "EPSG:32708" when known, else ""
  int band_count = 0;
};

// Band `band` (1-based; 0: the last band) of a raster file.
RasterBandData read_raster_band(const std::filesystem::path& path, int band = 0);
// Every band of a raster file, in band order (the file opened once).
std::vector<RasterBandData> read_raster_bands(const std::filesystem::path& path);

// Lines where the band equals `level` (each a polyline of (x, y) in the raster's CRS).
std::vector<std::vector<std::pair<double, double>>> contour_lines(const RasterBandData& band, double level);

struct LayerFeature {
  std::vector<std::vector<std::pair<double, double>>> parts;  // points: one part of one point; lines: their vertices
  std::map<std::string, std::string> fields;                  // every attribute as text ("" when null)
};

// Whether `path` holds a vector layer named `layer`.
bool has_layer(const std::filesystem::path& path, const std::string& layer);
// The features of `layer` in the file's order.
std::vector<LayerFeature> read_layer(const std::filesystem::path& path, const std::string& layer);

}  // namespace slipscreen::formats
