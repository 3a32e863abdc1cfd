#include "formats/gis/run_layers.hpp"

#include <gdal_alg.h>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cmath>
#include <limits>
#include <memory>

#include "core/errors.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {
namespace {

struct DatasetCloser {
  void operator()(GDALDataset* d) const { GDALClose(d); }
};
using Dataset = std::unique_ptr<GDALDataset, DatasetCloser>;

Dataset open(const std::filesystem::path& path, unsigned flags, GdalErrorScope& errors) {
  ensure_gdal_registered();
  Dataset ds(static_cast<GDALDataset*>(GDALOpenEx(path.c_str(), flags | GDAL_OF_READONLY, nullptr, nullptr, nullptr)));
  if (!ds) errors.throw_io("cannot open it");
  return ds;
}

void add_points(const OGRGeometry* g, std::vector<std::vector<std::pair<double, double>>>& parts) {
  if (!g) return;
  switch (wkbFlatten(g->getGeometryType())) {
    case wkbPoint: {
      const auto* p = g->toPoint();
      parts.push_back({{p->getX(), p->getY()}});
      break;
    }
    case wkbLineString: {
      const auto* l = g->toLineString();
      std::vector<std::pair<double, double>> part;
      for (int i = 0; i < l->getNumPoints(); ++i) part.emplace_back(l->getX(i), l->getY(i));
      parts.push_back(std::move(part));
      break;
    }
    case wkbMultiPoint:
    case wkbMultiLineString:
    case wkbGeometryCollection: {
      const auto* c = g->toGeometryCollection();
      for (int i = 0; i < c->getNumGeometries(); ++i) add_points(c->getGeometryRef(i), parts);
      break;
    }
    default: break;  // polygons are not drawn from run layers
  }
}

}  // namespace

namespace {

// Band `band` (1-based; 0: the last) of an open raster.
RasterBandData read_band(GDALDataset& ds, const std::filesystem::path& path, int band, GdalErrorScope& errors) {
  RasterBandData out;
  out.band_count = ds.GetRasterCount();
  if (band == 0) band = out.band_count;
  if (band < 1 || band > out.band_count)
    throw IoError(path.string() + ": has no band " + std::to_string(band) + " (it has " +
                  std::to_string(out.band_count) + ")");
  out.width = ds.GetRasterXSize();
  out.height = ds.GetRasterYSize();
  double gt[6];
  if (ds.GetGeoTransform(gt) != CE_None || gt[2] != 0 || gt[4] != 0)
    throw IoError(path.string() + ": has no north-up geotransform");
  out.x0 = gt[0];
  out.dx = gt[1];
  out.y0 = gt[3];
  out.dy = gt[5];
  if (const OGRSpatialReference* srs = ds.GetSpatialRef()) {
    if (const char* n = srs->GetName()) out.crs_name = n;
    const char* auth = srs->GetAuthorityName(nullptr);
    const char* code = srs->GetAuthorityCode(nullptr);
    if (auth && code) out.crs_authority = std::string(auth) + ":" + code;
  }
  GDALRasterBand* b = ds.GetRasterBand(band);
  out.description = b->GetDescription();
  int has_nodata = 0;
  const double nodata = b->GetNoDataValue(&has_nodata);
  out.values.resize(static_cast<std::size_t>(out.width) * static_cast<std::size_t>(out.height));
  if (b->RasterIO(GF_Read, 0, 0, out.width, out.height, out.values.data(), out.width, out.height, GDT_Float64, 0, 0,
                  nullptr) != CE_None)
    errors.throw_io("cannot read band " + std::to_string(band));
  if (has_nodata)
    for (double& v : out.values)
      if (v == nodata) v = std::numeric_limits<double>::quiet_NaN();
  return out;
}

}  // namespace

RasterBandData read_raster_band(const std::filesystem::path& path, int band) {
  GdalErrorScope errors(path.string());
  Dataset ds = open(path, GDAL_OF_RASTER, errors);
  return read_band(*ds, path, band, errors);
}

std::vector<RasterBandData> read_raster_bands(const std::filesystem::path& path) {
  GdalErrorScope errors(path.string());
  Dataset ds = open(path, GDAL_OF_RASTER, errors);
  std::vector<RasterBandData> out;
  for (int b = 1; b <= ds->GetRasterCount(); ++b) out.push_back(read_band(*ds, path, b, errors));
  return out;
}

std::vector<std::vector<std::pair<double, double>>> contour_lines(const RasterBandData& band, double level) {
  std::vector<std::vector<std::pair<double, double>>> lines;
  if (band.width < 2 || band.height < 2) return lines;
  GdalErrorScope errors("contour of a raster band at " + std::to_string(level));
  ensure_gdal_registered();
  GDALDriver* mem = GetGDALDriverManager()->GetDriverByName("MEM");
  if (!mem) errors.throw_io("GDAL has no MEM driver");
  Dataset raster(mem->Create("", band.width, band.height, 1, GDT_Float64, nullptr));
  if (!raster) errors.throw_io("cannot hold the raster in memory");
  double gt[6] = {band.x0, band.dx, 0, band.y0, 0, band.dy};
  raster->SetGeoTransform(gt);
  constexpr double kNodata = -1e300;
  std::vector<double> values = band.values;
  for (double& v : values)
    if (std::isnan(v)) v = kNodata;
  GDALRasterBand* b = raster->GetRasterBand(1);
  b->SetNoDataValue(kNodata);
  if (b->RasterIO(GF_Write, 0, 0, band.width, band.height, values.data(), band.width, band.height, GDT_Float64, 0, 0,
                  nullptr) != CE_None)
    errors.throw_io("cannot fill the raster in memory");
  GDALDriver* vmem = GetGDALDriverManager()->GetDriverByName("Memory");
  if (!vmem) errors.throw_io("GDAL has no Memory vector driver");
  Dataset vec(vmem->Create("", 0, 0, 0, GDT_Unknown, nullptr));
  if (!vec) errors.throw_io("cannot create a vector layer in memory");
  OGRLayer* layer = vec->CreateLayer("contour", nullptr, wkbLineString, nullptr);
  if (!layer) errors.throw_io("cannot create a vector layer in memory");
  const std::string fixed = "FIXED_LEVELS=" + std::to_string(level);
  const char* options[] = {fixed.c_str(), "NODATA=-1e300", nullptr};
  if (GDALContourGenerateEx(b, layer, const_cast<char**>(options), nullptr, nullptr) != CE_None)
    errors.throw_io("contour generation failed");
  layer->ResetReading();
  for (auto& f : *layer) add_points(f->GetGeometryRef(), lines);
  return lines;
}

bool has_layer(const std::filesystem::path& path, const std::string& layer) {
  std::error_code ec;
  if (!std::filesystem::is_regular_file(path, ec)) return false;
  GdalErrorScope errors(path.string());
  Dataset ds = open(path, GDAL_OF_VECTOR, errors);
  return ds->GetLayerByName(layer.c_str()) != nullptr;
}

std::vector<LayerFeature> read_layer(const std::filesystem::path& path, const std::string& name) {
  GdalErrorScope errors(path.string());
  Dataset ds = open(path, GDAL_OF_VECTOR, errors);
  OGRLayer* layer = ds->GetLayerByName(name.c_str());
  if (!layer) throw IoError(path.string() + ": has no layer '" + name + "'");
  std::vector<LayerFeature> out;
  layer->ResetReading();
  for (auto& f : *layer) {
    LayerFeature lf;
    add_points(f->GetGeometryRef(), lf.parts);
    const OGRFeatureDefn* defn = f->GetDefnRef();
    for (int i = 0; i < defn->GetFieldCount(); ++i)
      lf.fields[defn->GetFieldDefn(i)->GetNameRef()] = f->IsFieldSetAndNotNull(i) ? f->GetFieldAsString(i) : "";
    out.push_back(std::move(lf));
  }
  errors.throw_if_error("cannot read layer '" + name + "'");
  return out;
}

}  // namespace slipscreen::formats
