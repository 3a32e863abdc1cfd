#include "formats/gis/geotiff.hpp"

#include <gdal_priv.h>
#include <ogr_spatialref.h>

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
  }
  errors.throw_if_error("could not write the GeoTIFF");
}

}  // namespace

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
  if (!options.cloud_optimized) {
    GDALDriver* gtiff = GetGDALDriverManager()->GetDriverByName("GTiff");
    if (!gtiff) errors.throw_io("GDAL has no GTiff driver");
    const char* const create_options[] = {"TILED=YES",       "BLOCKXSIZE=256", "BLOCKYSIZE=256",
                                          "COMPRESS=DEFLATE", "PREDICTOR=3",    nullptr};
    DatasetPtr ds(gtiff->Create(where.c_str(), grid.columns, grid.rows, nbands, GDT_Float32,
                                const_cast<char**>(create_options)));
    if (!ds) errors.throw_io("cannot create the GeoTIFF");
    fill(*ds, grid, crs, bands, options, errors);
    close_checked(ds, errors);
    return;
  }

  GDALDriver* mem = GetGDALDriverManager()->GetDriverByName("MEM");
  GDALDriver* cog = GetGDALDriverManager()->GetDriverByName("COG");
  if (!mem || !cog) errors.throw_io("GDAL has no MEM or COG driver (GDAL 3.1 or later is needed)");
  DatasetPtr staging(mem->Create("", grid.columns, grid.rows, nbands, GDT_Float32, nullptr));
  if (!staging) errors.throw_io("cannot create the in-memory raster");
  fill(*staging, grid, crs, bands, options, errors);
  const char* const cog_options[] = {"COMPRESS=DEFLATE", "PREDICTOR=YES", "BLOCKSIZE=256",
                                     "RESAMPLING=AVERAGE", "OVERVIEWS=AUTO", nullptr};
  DatasetPtr out(cog->CreateCopy(where.c_str(), staging.get(), FALSE, const_cast<char**>(cog_options),
                                 nullptr, nullptr));
  if (!out) errors.throw_io("cannot write the Cloud-Optimized GeoTIFF");
  close_checked(out, errors);
}

}  // namespace slipscreen::formats
