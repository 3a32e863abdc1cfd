#include "formats/gis/geotiff.hpp"

#include <gdal_priv.h>
#include <ogr_spatialref.h>

#include <algorithm>
#include <cmath>
#include <memory>

#include "core/errors.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {

namespace {

struct DatasetCloser {
  void operator()(GDALDataset* ds) const { GDALClose(GDALDataset::ToHandle(ds)); }
};
using DatasetPtr = std::unique_ptr<GDALDataset, DatasetCloser>;

// Closes the dataset now (flushing it) and reports a failure seen while flushing.
void close_checked(DatasetPtr& ds, GdalErrorScope& errors) {
  ds.reset();
  errors.throw_if_error("could not finish writing the GeoTIFF");
}

void fill(GDALDataset& ds, const geometry::RasterGrid& grid, const Crs& crs,
          const std::vector<RasterBand>& bands, const GeoTiffOptions& options, GdalErrorScope& errors) {
  auto gt = grid.geotransform();
  if (ds.SetGeoTransform(gt.data()) != CE_None) errors.throw_io("cannot set the geotransform");
  if (ds.SetSpatialRef(&crs.osr()) != CE_None) errors.throw_io("cannot set the CRS");
  for (const auto& [key, value] : options.metadata) ds.SetMetadataItem(key.c_str(), value.c_str());
  std::vector<float> buffer(grid.cell_count());
  for (std::size_t b = 0; b < bands.size(); ++b) {
    GDALRasterBand* band = ds.GetRasterBand(static_cast<int>(b) + 1);
    band->SetDescription(bands[b].description.c_str());
    band->SetNoDataValue(options.nodata);
    if (!options.unit.empty()) band->SetUnitType(options.unit.c_str());
    for (std::size_t i = 0; i < buffer.size(); ++i)
      buffer[i] = std::isnan(bands[b].values[i]) ? options.nodata : bands[b].values[i];
    if (band->RasterIO(GF_Write, 0, 0, grid.columns, grid.rows, buffer.data(), grid.columns, grid.rows,
                       GDT_Float32, 0, 0, nullptr) != CE_None)
      errors.throw_io("cannot write band " + std::to_string(b + 1));
    if (band->SetColorInterpretation(GCI_GrayIndex) != CE_None)
      errors.throw_io("cannot set the colour interpretation of band " + std::to_string(b + 1));
    // Exact statistics (GDAL's own, over every valid cell), kept as the band's STATISTICS_*
    // metadata, which the copy below writes into the file. A band with no valid cell has none.
    const bool any = std::any_of(buffer.begin(), buffer.end(), [&](float v) { return v != options.nodata; });
    double mn = 0, mx = 0, mean = 0, sd = 0;
    if (any && band->ComputeStatistics(FALSE, &mn, &mx, &mean, &sd, nullptr, nullptr) != CE_None)
      errors.throw_io("cannot compute the statistics of band " + std::to_string(b + 1));
  }
  errors.throw_if_error("could not write the GeoTIFF");
}

}  // namespace

std::filesystem::path band_sidecar(const std::filesystem::path& path) {
  std::filesystem::path p = path;
  p += ".aux.xml";
  return p;
}

void write_geotiff(const std::filesystem::path& path, const geometry::RasterGrid& grid, const Crs& crs,
                   const std::vector<RasterBand>& bands, const GeoTiffOptions& options) {
  const std::string where = path.string();
  if (bands.empty()) throw InputError("bands", "0", "at least one band", where);
  if (grid.columns < 1 || grid.rows < 1)
    throw InputError("grid", std::to_string(grid.columns) + " x " + std::to_string(grid.rows),
                     "at least one column and one row", where);
  for (std::size_t b = 0; b < bands.size(); ++b)
    if (bands[b].values.size() != grid.cell_count())
      throw InputError("band " + std::to_string(b + 1) + " (" + bands[b].description + ")",
                       std::to_string(bands[b].values.size()) + " values",
                       std::to_string(grid.cell_count()) + " values (columns x rows)", where);

  GdalErrorScope errors(where);
  const int nbands = static_cast<int>(bands.size());
  // Both layouts are staged in memory (where the statistics are computed) and copied out.
  GDALDriver* mem = GetGDALDriverManager()->GetDriverByName("MEM");
  GDALDriver* out_driver = GetGDALDriverManager()->GetDriverByName(options.cloud_optimized ? "COG" : "GTiff");
  if (!mem || !out_driver)
    errors.throw_io(options.cloud_optimized ? "GDAL has no MEM or COG driver (GDAL 3.1 or later is needed)"
                                            : "GDAL has no MEM or GTiff driver");
  DatasetPtr staging(mem->Create("", grid.columns, grid.rows, nbands, GDT_Float32, nullptr));
  if (!staging) errors.throw_io("cannot create the in-memory raster");
  fill(*staging, grid, crs, bands, options, errors);
  const char* const gtiff_options[] = {"TILED=YES",   "BLOCKXSIZE=256",        "BLOCKYSIZE=256", "COMPRESS=DEFLATE",
                                       "PREDICTOR=3", "PHOTOMETRIC=MINISBLACK", nullptr};
  const char* const cog_options[] = {"COMPRESS=DEFLATE", "PREDICTOR=YES", "BLOCKSIZE=256",
                                     "RESAMPLING=AVERAGE", "OVERVIEWS=AUTO", nullptr};
  DatasetPtr out(out_driver->CreateCopy(where.c_str(), staging.get(), FALSE,
                                        const_cast<char**>(options.cloud_optimized ? cog_options : gtiff_options),
                                        nullptr, nullptr));
  if (!out) errors.throw_io(options.cloud_optimized ? "cannot write the Cloud-Optimized GeoTIFF" : "cannot create the GeoTIFF");
  close_checked(out, errors);
}

}  // namespace slipscreen::formats
