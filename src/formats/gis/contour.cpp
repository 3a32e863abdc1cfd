#include "formats/gis/contour.hpp"

#include <gdal_alg.h>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cmath>
#include <limits>
#include <memory>
#include <string>

#include "core/errors.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {

namespace {

struct DatasetCloser {
  void operator()(GDALDataset* ds) const { GDALClose(GDALDataset::ToHandle(ds)); }
};

std::vector<geometry::Point2> ring_points(const OGRLinearRing& ring) {
  std::vector<geometry::Point2> v;
  v.reserve(static_cast<std::size_t>(ring.getNumPoints()));
  for (int i = 0; i < ring.getNumPoints(); ++i) v.push_back({ring.getX(i), ring.getY(i)});
  return v;
}

void add_polygon(const OGRPolygon& poly, std::vector<PolygonRings>& out) {
  if (poly.IsEmpty()) return;
  PolygonRings p;
  p.rings.push_back(ring_points(*poly.getExteriorRing()));
  for (int i = 0; i < poly.getNumInteriorRings(); ++i) p.rings.push_back(ring_points(*poly.getInteriorRing(i)));
  out.push_back(std::move(p));
}

}  // namespace

std::vector<PolygonRings> area_at_or_above(const geometry::RasterGrid& grid, const std::vector<double>& values,
                                           double level) {
  if (values.size() != grid.cell_count())
    throw InputError("values", std::to_string(values.size()), std::to_string(grid.cell_count()) + " (one per cell)");
  if (!std::isfinite(level)) throw InputError("contour level", std::to_string(level), "a finite level");
  ensure_gdal_registered();
  GdalErrorScope errors("contour at " + std::to_string(level));
  GDALDriver* mem = GetGDALDriverManager()->GetDriverByName("MEM");
  GDALDriver* vmem = GetGDALDriverManager()->GetDriverByName("Memory");
  if (!mem || !vmem) errors.throw_io("GDAL has no MEM or Memory driver");

  // A value below every other stands for "no value" (GDAL's nodata for the contour generator).
  constexpr double kNoData = -1e300;
  std::unique_ptr<GDALDataset, DatasetCloser> raster(mem->Create("", grid.columns, grid.rows, 1, GDT_Float64, nullptr));
  if (!raster) errors.throw_io("cannot create the in-memory raster");
  auto gt = grid.geotransform();
  raster->SetGeoTransform(gt.data());
  std::vector<double> buffer(values);
  bool any = false;
  for (double& v : buffer) {
    if (std::isnan(v)) v = kNoData;
    else any = any || v >= level;
  }
  if (!any) return {};
  GDALRasterBand* band = raster->GetRasterBand(1);
  band->SetNoDataValue(kNoData);
  if (band->RasterIO(GF_Write, 0, 0, grid.columns, grid.rows, buffer.data(), grid.columns, grid.rows, GDT_Float64, 0, 0,
                     nullptr) != CE_None)
    errors.throw_io("cannot fill the in-memory raster");

  std::unique_ptr<GDALDataset, DatasetCloser> vectors(vmem->Create("", 0, 0, 0, GDT_Unknown, nullptr));
  if (!vectors) errors.throw_io("cannot create the in-memory layer");
  OGRLayer* layer = vectors->CreateLayer("contour", nullptr, wkbMultiPolygon, nullptr);
  if (!layer) errors.throw_io("cannot create the in-memory layer");
  OGRFieldDefn id("id", OFTInteger), lo("elev_min", OFTReal), hi("elev_max", OFTReal);
  if (layer->CreateField(&id) != OGRERR_NONE || layer->CreateField(&lo) != OGRERR_NONE ||
      layer->CreateField(&hi) != OGRERR_NONE)
    errors.throw_io("cannot create the contour fields");

  char level_text[64];
  std::snprintf(level_text, sizeof level_text, "FIXED_LEVELS=%.17g", level);
  const char* const options[] = {level_text, "POLYGONIZE=YES", "ID_FIELD=0", "ELEV_FIELD_MIN=1", "ELEV_FIELD_MAX=2",
                                 "NODATA=-1e300", nullptr};
  if (GDALContourGenerateEx(GDALRasterBand::ToHandle(band), OGRLayer::ToHandle(layer), const_cast<char**>(options),
                            nullptr, nullptr) != CE_None)
    errors.throw_io("GDAL's contour generator failed");

  // POLYGONIZE makes one feature per interval between consecutive levels (the raster's minimum
  // and maximum close the list); the area at or above `level` is the interval starting there.
  std::vector<PolygonRings> out;
  layer->ResetReading();
  for (auto& feature : *layer) {
    if (!(feature->GetFieldAsDouble(1) >= level)) continue;
    const OGRGeometry* g = feature->GetGeometryRef();
    if (!g) continue;
    switch (wkbFlatten(g->getGeometryType())) {
      case wkbPolygon: add_polygon(*g->toPolygon(), out); break;
      case wkbMultiPolygon:
        for (const auto* part : *g->toMultiPolygon()) add_polygon(*part, out);
        break;
      default: break;
    }
  }
  errors.throw_if_error("GDAL's contour generator failed");
  return out;
}

}  // namespace slipscreen::formats
