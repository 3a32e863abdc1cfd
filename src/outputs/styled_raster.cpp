#include "outputs/styled_raster.hpp"

#include <filesystem>

#include "formats/files/text_file.hpp"

namespace slipscreen::outputs {

std::string style_sidecar(const std::string& raster_file) {
  return std::filesystem::path(raster_file).replace_extension(".qml").generic_string();
}

void write_styled_geotiff(const formats::RunFolder& folder, std::string_view key, const std::string& raster_file,
                          const geometry::RasterGrid& grid, const formats::Crs& crs,
                          const std::vector<formats::RasterBand>& bands, const formats::GeoTiffOptions& options,
                          const std::string& qml) {
  const auto tif = folder.output(key, raster_file);
  folder.output(key, formats::band_sidecar(raster_file).generic_string());  // GDAL writes it: checked as an output
  formats::write_geotiff(tif, grid, crs, bands, options);
  formats::write_text_file(folder.output(key, style_sidecar(raster_file)), qml);
}

std::vector<ReadmeFile> style_sidecar_readme(const std::string& raster_file) {
  return {{style_sidecar(raster_file),
           "QGIS default style of " + raster_file +
               " (the last output time's band in pseudocolour; another band is picked in the layer's properties)"},
          {formats::band_sidecar(raster_file).generic_string(),
           "GDAL's sidecar of " + raster_file + ": the gray-index colour interpretation of its bands after the first"}};
}

}  // namespace slipscreen::outputs
