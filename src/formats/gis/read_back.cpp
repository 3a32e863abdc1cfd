#include "formats/gis/read_back.hpp"

#include <cmath>
#include <memory>

#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include "core/errors.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {
namespace {

struct DatasetCloser {
  void operator()(GDALDataset* d) const { GDALClose(d); }
};
using Dataset = std::unique_ptr<GDALDataset, DatasetCloser>;

Dataset open(const std::filesystem::path& path, unsigned flags, const GdalErrorScope& errors) {
  ensure_gdal_registered();
  Dataset ds(static_cast<GDALDataset*>(GDALOpenEx(path.c_str(), flags | GDAL_OF_READONLY, nullptr, nullptr, nullptr)));
  if (!ds) errors.throw_io("cannot open");
  return ds;
}

void add_parts(const OGRGeometry* g, std::vector<std::vector<geometry::Point2>>& parts) {
  if (!g) return;
  switch (wkbFlatten(g->getGeometryType())) {
    case wkbPoint: {
      const auto* p = g->toPoint();
      parts.push_back({{p->getX(), p->getY()}});
      break;
    }
    case wkbLineString: {
      const auto* l = g->toLineString();
      std::vector<geometry::Point2> pts;
      for (int i = 0; i < l->getNumPoints(); ++i) pts.push_back({l->getX(i), l->getY(i)});
      parts.push_back(std::move(pts));
      break;
    }
    case wkbMultiPoint:
    case wkbMultiLineString:
    case wkbGeometryCollection: {
      for (const auto* sub : *g->toGeometryCollection()) add_parts(sub, parts);
      break;
    }
    default: break;  // polygons are not drawn from run layers
  }
}

}  // namespace

RasterBandRead read_band_back(const std::filesystem::path& path, int band) {
  GdalErrorScope errors(path.string());
  Dataset ds = open(path, GDAL_OF_RASTER, errors);
  RasterBandRead out;
  out.bands = ds->GetRasterCount();
  out.band = band < 0 ? out.bands : band;
  if (out.band < 1 || out.band > out.bands)
    errors.throw_io("has no band " + std::to_string(band) + " (it has " + std::to_string(out.bands) + ")");
  double gt[6];
  if (ds->GetGeoTransform(gt) != CE_None) errors.throw_io("has no geotransform");
  if (gt[2] != 0.0 || gt[4] != 0.0 || !(gt[1] > 0.0) || std::abs(gt[5] + gt[1]) > 1e-9 * gt[1])
    errors.throw_io("is not a north-up grid of square cells");
  out.grid = {gt[0], gt[3], gt[1], ds->GetRasterXSize(), ds->GetRasterYSize()};
  GDALRasterBand* b = ds->GetRasterBand(out.band);
  out.description = b->GetDescription();
  int has_nodata = 0;
  const double nodata = b->GetNoDataValue(&has_nodata);
  out.values.resize(out.grid.cell_count());
  if (b->RasterIO(GF_Read, 0, 0, out.grid.columns, out.grid.rows, out.values.data(), out.grid.columns,
                  out.grid.rows, GDT_Float64, 0, 0, nullptr) != CE_None)
    errors.throw_io("cannot read band " + std::to_string(out.band));
  if (has_nodata)
    for (double& v : out.values)
      if (v == nodata) v = std::nan("");
  return out;
}

std::vector<LayerGeometry> read_layer_geometries(const std::filesystem::path& path, const std::string& layer,
                                                const std::string& attribute) {
  GdalErrorScope errors(path.string() + " layer " + layer);
  Dataset ds = open(path, GDAL_OF_VECTOR, errors);
  OGRLayer* l = ds->GetLayerByName(layer.c_str());
  if (!l) errors.throw_io("no such layer");
  const int field = l->GetLayerDefn()->GetFieldIndex(attribute.c_str());
  if (field < 0) errors.throw_io("no field '" + attribute + "'");
  std::vector<LayerGeometry> out;
  l->ResetReading();
  for (auto& f : *l) {
    LayerGeometry lf;
    lf.attribute = f->GetFieldAsString(field);
    add_parts(f->GetGeometryRef(), lf.parts);
    out.push_back(std::move(lf));
  }
  errors.throw_if_error("cannot read the features");
  return out;
}

}  // namespace slipscreen::formats
