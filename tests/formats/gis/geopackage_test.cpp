#include "formats/gis/geopackage.hpp"

#include <doctest/doctest.h>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cmath>
#include <fstream>
#include <limits>

#include "core/errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {

std::vector<formats::VectorLayer> sample_layers() {
  formats::VectorLayer segs{"fault_segments", formats::GeometryType::line_string,
                       {{"segment_id", formats::FieldType::string},
                        {"dip_deg", formats::FieldType::real},
                        {"n_check_points", formats::FieldType::integer},
                        {"first_exceedance", formats::FieldType::date}},
                       "fault segments with screening results"};
  segs.features.push_back({{{630000, 3980000}, {631000, 3981000}}, {std::string("F1:0"), 60.0, std::int64_t{3}, std::string("2031-06-30")}});
  segs.features.push_back({{{631000, 3981000}, {632000, 3981500}, {633000, 3981600}},
                           {std::string("F1:1"), std::numeric_limits<double>::quiet_NaN(), std::int64_t{3}, std::monostate{}}});
  formats::VectorLayer wells{"wells", formats::GeometryType::point,
                        {{"well_id", formats::FieldType::string}, {"volume_to_date_m3", formats::FieldType::real}}};
  wells.features.push_back({{{634500.5, 3982500.25}}, {std::string("W-01"), 1.5e6}});
  wells.features.push_back({{{635500, 3983500}}, {std::string("W-02"), std::int64_t{42}}});
  wells.features.push_back({{{636500, 3984500}}, {std::string("W-03"), 0.0}});
  formats::VectorLayer area{"grid_extent", formats::GeometryType::polygon, {{"name", formats::FieldType::string}}};
  area.features.push_back({{{630000, 3980000}, {640000, 3980000}, {640000, 3990000}, {630000, 3990000}}, {std::string("grid")}});
  return {segs, wells, area};
}

struct Closer {
  void operator()(GDALDataset* d) const { GDALClose(GDALDataset::ToHandle(d)); }
};

std::string read_bytes(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), {});
}

}  // namespace

TEST_CASE("GeoPackage reads back with OGR: layers, counts, values, CRS, spatial index") {
  test::TempDir dir("gpkg");
  const auto path = dir / "screen.gpkg";
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  formats::write_geopackage(path, utm, sample_layers());

  std::unique_ptr<GDALDataset, Closer> ds(
      GDALDataset::Open(path.string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, nullptr, nullptr, nullptr));
  REQUIRE(ds);
  CHECK(std::string(ds->GetDriver()->GetDescription()) == "GPKG");
  REQUIRE(ds->GetLayerCount() == 3);
  OGRLayer* segs = ds->GetLayerByName("fault_segments");
  OGRLayer* wells = ds->GetLayerByName("wells");
  OGRLayer* area = ds->GetLayerByName("grid_extent");
  REQUIRE(segs);
  REQUIRE(wells);
  REQUIRE(area);
  CHECK(segs->GetFeatureCount() == 2);
  CHECK(wells->GetFeatureCount() == 3);
  CHECK(area->GetFeatureCount() == 1);
  CHECK(wkbFlatten(segs->GetGeomType()) == wkbLineString);
  CHECK(wkbFlatten(wells->GetGeomType()) == wkbPoint);
  CHECK(wkbFlatten(area->GetGeomType()) == wkbPolygon);
  for (OGRLayer* l : {segs, wells, area}) {
    REQUIRE(l->GetSpatialRef() != nullptr);
    CHECK(l->GetSpatialRef()->IsSame(&utm.osr()));
    CHECK(std::string(l->GetFIDColumn()) == "fid");
    CHECK(std::string(l->GetGeometryColumn()) == "geom");
  }
  // Field definitions in the order given, with their types.
  OGRFeatureDefn* d = segs->GetLayerDefn();
  REQUIRE(d->GetFieldCount() == 4);
  CHECK(std::string(d->GetFieldDefn(0)->GetNameRef()) == "segment_id");
  CHECK(d->GetFieldDefn(1)->GetType() == OFTReal);
  CHECK(d->GetFieldDefn(2)->GetType() == OFTInteger64);
  CHECK(d->GetFieldDefn(3)->GetType() == OFTDate);

  std::unique_ptr<OGRFeature> f(segs->GetFeature(1));
  REQUIRE(f);
  CHECK(std::string(f->GetFieldAsString("segment_id")) == "F1:0");
  CHECK(f->GetFieldAsDouble("dip_deg") == 60.0);
  CHECK(f->GetFieldAsInteger64("n_check_points") == 3);
  int y = 0, m = 0, day = 0, h = 0, mi = 0, tz = 0;
  float s = 0;
  REQUIRE(f->GetFieldAsDateTime(3, &y, &m, &day, &h, &mi, &s, &tz));
  CHECK(y == 2031);
  CHECK(m == 6);
  CHECK(day == 30);
  const OGRLineString* line = f->GetGeometryRef()->toLineString();
  CHECK(line->getNumPoints() == 2);
  CHECK(line->getX(1) == 631000.0);
  f.reset(segs->GetFeature(2));
  REQUIRE(f);
  CHECK(f->IsFieldNull(f->GetFieldIndex("dip_deg")));           // NaN -> NULL
  CHECK(f->IsFieldNull(f->GetFieldIndex("first_exceedance")));  // monostate -> NULL
  CHECK(f->GetGeometryRef()->toLineString()->getNumPoints() == 3);

  f.reset(wells->GetFeature(1));
  REQUIRE(f);
  CHECK(std::string(f->GetFieldAsString("well_id")) == "W-01");
  CHECK(f->GetFieldAsDouble("volume_to_date_m3") == 1.5e6);
  CHECK(f->GetGeometryRef()->toPoint()->getX() == 634500.5);
  CHECK(f->GetGeometryRef()->toPoint()->getY() == 3982500.25);
  f.reset(wells->GetFeature(2));
  CHECK(f->GetFieldAsDouble("volume_to_date_m3") == 42.0);  // integer accepted for a real field

  f.reset(area->GetFeature(1));
  REQUIRE(f);
  const OGRPolygon* poly = f->GetGeometryRef()->toPolygon();
  CHECK(poly->getExteriorRing()->getNumPoints() == 5);  // closed
  CHECK(std::abs(poly->get_Area() - 1e8) < 1e-6);       // 10 km x 10 km (plain geometry)

  // Spatial index: the GeoPackage SQL function HasSpatialIndex (GDAL GPKG driver).
  OGRLayer* sql = ds->ExecuteSQL("SELECT HasSpatialIndex('wells', 'geom')", nullptr, nullptr);
  REQUIRE(sql);
  std::unique_ptr<OGRFeature> r(sql->GetNextFeature());
  REQUIRE(r);
  CHECK(r->GetFieldAsInteger(0) == 1);
  r.reset();
  ds->ReleaseResultSet(sql);
}

TEST_CASE("a fixed timestamp makes reruns byte-identical") {
  test::TempDir dir("gpkg-repro");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  const formats::GeoPackageOptions fixed{.timestamp = "2031-01-01T00:00:00Z"};
  formats::write_geopackage(dir / "a.gpkg", utm, sample_layers(), fixed);
  formats::write_geopackage(dir / "b.gpkg", utm, sample_layers(), fixed);
  const std::string a = read_bytes(dir / "a.gpkg"), b = read_bytes(dir / "b.gpkg");
  CHECK(a.size() > 0);
  CHECK(a == b);
}

TEST_CASE("GeoPackage input errors name layer, feature and field") {
  test::TempDir dir("gpkg-bad");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  auto layers = sample_layers();
  SUBCASE("wrong value type") {
    layers[1].features[2].values[1] = std::string("lots");
    CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers),
                         doctest::Contains("layer 'wells' feature 2: field 'volume_to_date_m3'"), InputError);
  }
  SUBCASE("bad date") {
    layers[0].features[0].values[3] = std::string("2031-02-30");
    CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers),
                         doctest::Contains("field 'first_exceedance' = '2031-02-30'"), InputError);
  }
  SUBCASE("wrong number of values") {
    layers[1].features[0].values.pop_back();
    CHECK_THROWS_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers), InputError);
  }
  SUBCASE("bad geometry") {
    layers[0].features[1].geometry.resize(1);
    CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers),
                         doctest::Contains("feature 1: field 'geometry' = '1 vertices'"), InputError);
  }
  SUBCASE("duplicate field or layer names") {
    layers[1].fields[1].name = "WELL_ID";
    CHECK_THROWS_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers), InputError);
    layers = sample_layers();
    layers[2].name = "wells";
    CHECK_THROWS_AS(formats::write_geopackage(dir / "y.gpkg", utm, layers), InputError);
  }
  SUBCASE("an existing file is not overwritten") {
    std::ofstream(dir / "x.gpkg") << "x";
    CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "x.gpkg", utm, layers), doctest::Contains("already exists"),
                         IoError);
  }
}

TEST_CASE("GeoPackage: aliases, DateTime and boolean fields, multi-polygons and layer_styles rows") {
  test::TempDir dir("gpkg-styled");
  const auto path = dir / "styled.gpkg";
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  formats::VectorLayer events{"events", formats::GeometryType::point,
                              {{"time_utc", formats::FieldType::datetime, "time (UTC)"},
                               {"felt", formats::FieldType::boolean, "felt"},
                               {"depth_m", formats::FieldType::real, "depth (m)"}}};
  // 2031-06-30T12:34:56.5Z = 22,460 days (Python's datetime.date difference) and 45,296.5 s
  // after 1970-01-01.
  const double t = 22460.0 * 86400.0 + 45296.5;
  events.features.emplace_back(std::vector<geometry::Point2>{{630000, 3980000}},
                               std::vector<formats::FieldValue>{t, std::int64_t{1}, 4200.0});
  events.features.emplace_back(std::vector<geometry::Point2>{{631000, 3981000}},
                               std::vector<formats::FieldValue>{std::monostate{}, std::int64_t{0}, 10.0});
  events.styles.push_back({"by time", "<qgis>one</qgis>", "the default"});
  events.styles.push_back({"other", "<qgis>two</qgis>", "an alternative"});
  formats::VectorLayer areas{"areas", formats::GeometryType::multi_polygon, {{"name", formats::FieldType::string}}};
  formats::VectorFeature donut;
  donut.values = {std::string("donut")};
  donut.polygons.push_back({{{{0, 0}, {10, 0}, {10, 10}, {0, 10}}, {{4, 4}, {6, 4}, {6, 6}, {4, 6}}}});
  donut.polygons.push_back({{{{20, 0}, {21, 0}, {21, 1}}}});
  areas.features.push_back(donut);
  formats::VectorFeature nothing;  // no polygon: NULL geometry
  nothing.values = {std::string("none")};
  areas.features.push_back(nothing);
  formats::write_geopackage(path, utm, {events, areas}, {.timestamp = "2031-01-01T00:00:00Z"});

  std::unique_ptr<GDALDataset, Closer> ds(
      GDALDataset::Open(path.string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, nullptr, nullptr, nullptr));
  REQUIRE(ds);
  OGRLayer* ev = ds->GetLayerByName("events");
  REQUIRE(ev);
  OGRFeatureDefn* d = ev->GetLayerDefn();
  CHECK(d->GetFieldDefn(0)->GetType() == OFTDateTime);
  CHECK(d->GetFieldDefn(1)->GetType() == OFTInteger);
  CHECK(d->GetFieldDefn(1)->GetSubType() == OFSTBoolean);
#if GDAL_VERSION_NUM >= GDAL_COMPUTE_VERSION(3, 7, 0)  // GDAL reads gpkg_data_columns.name from 3.7
  CHECK(std::string(d->GetFieldDefn(0)->GetAlternativeNameRef()) == "time (UTC)");
  CHECK(std::string(d->GetFieldDefn(2)->GetAlternativeNameRef()) == "depth (m)");
#endif
  std::unique_ptr<OGRFeature> f(ev->GetFeature(1));
  REQUIRE(f);
  int y = 0, m = 0, day = 0, h = 0, mi = 0, tz = 0;
  float s = 0;
  REQUIRE(f->GetFieldAsDateTime(0, &y, &m, &day, &h, &mi, &s, &tz));
  CHECK(y == 2031);
  CHECK(m == 6);
  CHECK(day == 30);
  CHECK(h == 12);
  CHECK(mi == 34);
  CHECK(s == 56.5f);
  CHECK(tz == 100);  // UTC
  CHECK(f->GetFieldAsInteger(1) == 1);
  f.reset(ev->GetFeature(2));
  CHECK(f->IsFieldNull(0));
  CHECK(f->GetFieldAsInteger(1) == 0);

  OGRLayer* ar = ds->GetLayerByName("areas");
  REQUIRE(ar);
  CHECK(wkbFlatten(ar->GetGeomType()) == wkbMultiPolygon);
  f.reset(ar->GetFeature(1));
  REQUIRE(f);
  const OGRGeometry* g = f->GetGeometryRef();
  REQUIRE(g);
  CHECK(g->toMultiPolygon()->getNumGeometries() == 2);
  CHECK(std::abs(g->toMultiPolygon()->get_Area() - (100.0 - 4.0 + 0.5)) < 1e-9);  // hole subtracted (GDAL)
  f.reset(ar->GetFeature(2));
  CHECK(f->GetGeometryRef() == nullptr);

  // The aliases are stored where GeoPackage keeps them (gpkg_data_columns, the GPKG spec's table).
  OGRLayer* sql = ds->ExecuteSQL("SELECT name FROM gpkg_data_columns WHERE table_name = 'events' AND column_name = 'depth_m'",
                                 nullptr, nullptr);
  REQUIRE(sql);
  std::unique_ptr<OGRFeature> row(sql->GetNextFeature());
  REQUIRE(row);
  CHECK(std::string(row->GetFieldAsString(0)) == "depth (m)");
  row.reset();
  ds->ReleaseResultSet(sql);
  sql = ds->ExecuteSQL("SELECT count(*) FROM gpkg_extensions WHERE table_name = 'gpkg_data_columns' AND "
                       "extension_name = 'gpkg_schema'", nullptr, nullptr);
  REQUIRE(sql);
  row.reset(sql->GetNextFeature());
  REQUIRE(row);
  CHECK(row->GetFieldAsInteger(0) == 1);
  row.reset();
  ds->ReleaseResultSet(sql);

  // layer_styles: QGIS's columns, one row per style, the first the default.
  OGRLayer* styles = ds->GetLayerByName("layer_styles");
  REQUIRE(styles);
  CHECK(wkbFlatten(styles->GetGeomType()) == wkbNone);
  CHECK(styles->GetFeatureCount() == 2);
  for (const char* col : {"f_table_catalog", "f_table_schema", "f_table_name", "f_geometry_column", "styleName",
                          "styleQML", "styleSLD", "useAsDefault", "description", "owner", "ui", "update_time"})
    CHECK_MESSAGE(styles->GetLayerDefn()->GetFieldIndex(col) >= 0, col);
  CHECK(styles->GetLayerDefn()->GetFieldDefn(styles->GetLayerDefn()->GetFieldIndex("useAsDefault"))->GetSubType() ==
        OFSTBoolean);
  std::unique_ptr<OGRFeature> first(styles->GetFeature(1)), second(styles->GetFeature(2));
  REQUIRE(first);
  REQUIRE(second);
  CHECK(std::string(first->GetFieldAsString("f_table_name")) == "events");
  CHECK(std::string(first->GetFieldAsString("f_geometry_column")) == "geom");
  CHECK(std::string(first->GetFieldAsString("styleName")) == "by time");
  CHECK(std::string(first->GetFieldAsString("styleQML")) == "<qgis>one</qgis>");
  CHECK(first->GetFieldAsInteger("useAsDefault") == 1);
  CHECK(second->GetFieldAsInteger("useAsDefault") == 0);
  CHECK(std::string(first->GetFieldAsString("update_time")).rfind("2031/01/01", 0) == 0);
  CHECK(ds->GetLayerByName("areas") != nullptr);
}

TEST_CASE("GeoPackage: bad booleans and times, and the style table's name, are refused") {
  test::TempDir dir("gpkg-bad2");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  formats::VectorLayer l{"l", formats::GeometryType::point,
                         {{"b", formats::FieldType::boolean}, {"t", formats::FieldType::datetime}}};
  const auto one = [&](formats::FieldValue b, formats::FieldValue t) {
    l.features.clear();
    l.features.emplace_back(std::vector<geometry::Point2>{{0, 0}}, std::vector<formats::FieldValue>{});
    l.features[0].values.push_back(std::move(b));
    l.features[0].values.push_back(std::move(t));
  };
  one(std::int64_t{2}, 0.0);
  CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "a.gpkg", utm, {l}), doctest::Contains("field 'b' = '2'"),
                       InputError);
  one(std::int64_t{1}, std::string("2031-01-01"));
  CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "b.gpkg", utm, {l}), doctest::Contains("field 't'"), InputError);
  one(std::int64_t{1}, 1e300);
  CHECK_THROWS_AS(formats::write_geopackage(dir / "c.gpkg", utm, {l}), InputError);
  one(std::int64_t{1}, 0.0);
  l.name = "layer_styles";
  CHECK_THROWS_AS(formats::write_geopackage(dir / "d.gpkg", utm, {l}), InputError);
  l.name = "l";
  l.fields[0].alias = l.fields[1].alias = "the same";  // gpkg_data_columns: names unique per table
  CHECK_THROWS_WITH_AS(formats::write_geopackage(dir / "e.gpkg", utm, {l}), doctest::Contains("the same"), InputError);
}
