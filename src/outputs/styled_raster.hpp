#pragma once
// A GeoTIFF with its default style beside it: <name>.qml next to <name>.tif, the file QGIS loads
// as a raster's default style (a Float32 raster cannot carry a colour table), drawing band 1 in
// pseudocolour instead of three dates blended as red, green and blue (docs/gis.md). GDAL writes
// <name>.tif.aux.xml beside a raster of several bands (formats/gis/geotiff.hpp).
#include <string>
#include <string_view>
#include <vector>

#include "formats/files/run_folder.hpp"
#include "formats/gis/geotiff.hpp"
#include "outputs/run_readme.hpp"

namespace slipscreen::outputs {

// "maps/dp.tif" -> "maps/dp.qml".
std::string style_sidecar(const std::string& raster_file);

// Writes `raster_file` (named by scenario key `key`) and its sidecar style `qml`.
void write_styled_geotiff(const formats::RunFolder& folder, std::string_view key, const std::string& raster_file,
                          const geometry::RasterGrid& grid, const formats::Crs& crs,
                          const std::vector<formats::RasterBand>& bands, const formats::GeoTiffOptions& options,
                          const std::string& qml);

// The sidecars' lines in README.txt: the style, and GDAL's <raster>.aux.xml.
std::vector<ReadmeFile> style_sidecar_readme(const std::string& raster_file);

}  // namespace slipscreen::outputs
