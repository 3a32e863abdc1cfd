#include "formats/gis/fault_map.hpp"

#include <doctest/doctest.h>
#include <gdal_utils.h>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cmath>
#include <fstream>
#include <numbers>

#include "core/errors.hpp"
#include "core/geometry/azimuth.hpp"
#include "formats/gis/gdal_errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {

constexpr double kDeg = std::numbers::pi / 180.0;
constexpr double kTolM = 1e-6;  // m: agreement with the printed gdaltransform values

// Two faults in geographic WGS 84 (lon, lat). F1: a bent line dipping SE. F2: two parts,
// dipping to the left of the digitising direction, with its own friction.
const char* kFaultsGeoJson = R"({"type": "FeatureCollection", "features": [
 {"type": "Feature", "properties": {"fault_id": "F1", "dip": 60, "dip_dir": "SE"},
  "geometry": {"type": "LineString", "coordinates": [[-97.60, 35.90], [-97.55, 35.95], [-97.50, 36.00]]}},
 {"type": "Feature", "properties": {"fault_id": "F2", "dip": "75 deg", "dips_to": "left", "friction": 0.55},
  "geometry": {"type": "MultiLineString", "coordinates": [[[-97.70, 35.80], [-97.70, 35.85]],
                                                           [[-97.40, 35.80], [-97.35, 35.80]]]}}
]})";

// The same vertices in WGS 84 / UTM 14N, from PROJ 9.1.1 via GDAL 3.6.2:
//   printf -- "-97.60 35.90\n-97.55 35.95\n-97.50 36.00\n-97.70 35.80\n-97.70 35.85\n-97.40 35.80\n-97.35 35.80\n" |
//     gdaltransform -s_srs EPSG:4326 -t_srs EPSG:32614 -output_xy
const std::vector<geometry::Point2> kF1 = {
    {626341.739839839, 3973762.28760366}, {630771.872761642, 3979374.3295591}, {635196.249318616, 3984988.80398431}};
const std::vector<geometry::Point2> kF2a = {{617464.243832589, 3962545.48686673}, {617390.57825925, 3968091.50918291}};
const std::vector<geometry::Point2> kF2b = {{644573.410471001, 3962946.89007701}, {649091.721192766, 3963021.87065723}};

void write_text(const fs::path& p, const std::string& s) { std::ofstream(p) << s; }

// ogr2ogr as a library call (GDALVectorTranslate): convert a fixture to another format.
void translate(const fs::path& src, const fs::path& dst, const char* format) {
  formats::ensure_gdal_registered();
  GDALDatasetH in = GDALOpenEx(src.string().c_str(), GDAL_OF_VECTOR, nullptr, nullptr, nullptr);
  REQUIRE(in != nullptr);
  const char* argv[] = {"-f", format, nullptr};
  GDALVectorTranslateOptions* o = GDALVectorTranslateOptionsNew(const_cast<char**>(argv), nullptr);
  GDALDatasetH out = GDALVectorTranslate(dst.string().c_str(), nullptr, 1, &in, o, nullptr);
  GDALVectorTranslateOptionsFree(o);
  REQUIRE(out != nullptr);
  GDALClose(out);
  GDALClose(in);
}

bool near(const geometry::Point2& a, const geometry::Point2& b, double tol) {
  return std::abs(a.x - b.x) <= tol && std::abs(a.y - b.y) <= tol;
}

void check_same(const geometry::TraceSegment& got, const geometry::TraceSegment& want, double tol) {
  CHECK(near(got.start, want.start, tol));
  CHECK(near(got.end, want.end, tol));
  CHECK(near(got.centre, want.centre, tol));
  CHECK(std::abs(got.length_m - want.length_m) <= 2 * tol);
  REQUIRE(got.check_points.size() == want.check_points.size());
  for (std::size_t i = 0; i < got.check_points.size(); ++i) CHECK(near(got.check_points[i], want.check_points[i], tol));
}

formats::FaultFileOptions options() {
  formats::FaultFileOptions o;
  o.max_segment_length_m = 5000.0;
  o.check_points = 3;
  return o;
}

// The segments expected from the fixture: the gdaltransform vertices split by split_trace.
void check_fixture_segments(const std::vector<formats::FaultSegment>& segs) {
  const auto f1 = geometry::split_trace(kF1, 5000.0, 3);
  const auto f2a = geometry::split_trace(kF2a, 5000.0, 3);
  const auto f2b = geometry::split_trace(kF2b, 5000.0, 3);
  REQUIRE(f1.size() == 3);   // 14.3 km / 5 km
  REQUIRE(f2a.size() == 2);  // 5.5 km
  REQUIRE(f2b.size() == 1);  // 4.5 km
  REQUIRE(segs.size() == 6);
  for (std::size_t i = 0; i < 3; ++i) {
    CAPTURE(i);
    CHECK(segs[i].fault_id == "F1");
    CHECK(segs[i].index == i);
    CHECK(segs[i].segment_id == "F1:" + std::to_string(i));
    check_same(segs[i].trace, f1[i], kTolM);
    // Dip direction SE (135°) is to the right of the north-east digitising direction, so the
    // right-hand-rule strike is the chord azimuth itself.
    CHECK(std::abs(segs[i].strike_rad - f1[i].chord_azimuth_rad) < 1e-9);
    CHECK(segs[i].strike_rad > 30 * kDeg);
    CHECK(segs[i].strike_rad < 45 * kDeg);
    CHECK(std::abs(segs[i].dip_rad - 60 * kDeg) < 1e-12);
    CHECK_FALSE(segs[i].friction.has_value());
  }
  const geometry::TraceSegment* f2[] = {&f2a[0], &f2a[1], &f2b[0]};
  for (std::size_t i = 0; i < 3; ++i) {
    CAPTURE(i);
    const auto& s = segs[3 + i];
    CHECK(s.fault_id == "F2");
    CHECK(s.index == i);  // continuous across the two parts
    check_same(s.trace, *f2[i], kTolM);
    // dips_to = left: strike is the digitising direction reversed.
    CHECK(std::abs(s.strike_rad - geometry::normalize_azimuth(f2[i]->chord_azimuth_rad + std::numbers::pi)) < 1e-9);
    CHECK(std::abs(s.dip_rad - 75 * kDeg) < 1e-12);
    REQUIRE(s.friction.has_value());
    CHECK(*s.friction == 0.55);
  }
  // Part 1 of F2 runs north (strike ~180°), part 2 runs east (strike ~270°).
  CHECK(std::abs(segs[3].strike_rad - 180 * kDeg) < 1 * kDeg);
  CHECK(std::abs(segs[5].strike_rad - 270 * kDeg) < 1 * kDeg);
}

}  // namespace

TEST_CASE("faults in WGS 84 GeoJSON come back as the same segments in UTM 14N") {
  test::TempDir dir("faults");
  write_text(dir / "faults.geojson", kFaultsGeoJson);
  const auto segs = formats::read_fault_segments(dir / "faults.geojson", formats::working_crs("EPSG:32614"), options());
  check_fixture_segments(segs);
  CHECK(segs[0].fid == 0);
  CHECK(segs[3].fid == 1);
}

TEST_CASE("GeoPackage, FlatGeobuf and Shapefile copies give the same segments") {
  test::TempDir dir("faults-fmt");
  write_text(dir / "faults.geojson", kFaultsGeoJson);
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  for (const auto& [file, format] : {std::pair{"faults.gpkg", "GPKG"}, std::pair{"faults.fgb", "FlatGeobuf"},
                                     std::pair{"faults.shp", "ESRI Shapefile"}}) {
    CAPTURE(file);
    translate(dir / "faults.geojson", dir / file, format);
    check_fixture_segments(formats::read_fault_segments(dir / file, utm, options()));
  }
}

TEST_CASE("a file without a CRS needs one named; an unknown one is an input error") {
  test::TempDir dir("faults-nocrs");
  write_text(dir / "faults.geojson", kFaultsGeoJson);
  translate(dir / "faults.geojson", dir / "faults.shp", "ESRI Shapefile");
  fs::remove(dir / "faults.prj");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "faults.shp", utm, options()),
                       doctest::Contains("field 'crs' = 'none declared in the file'"), InputError);
  auto o = options();
  o.source_crs = "EPSG:999999";
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "faults.shp", utm, o), doctest::Contains("EPSG:999999"),
                       InputError);
  o.source_crs = "EPSG:4326";
  check_fixture_segments(formats::read_fault_segments(dir / "faults.shp", utm, o));
}

TEST_CASE("bad fault files get one clear message") {
  test::TempDir dir("faults-bad");
  const formats::Crs utm = formats::working_crs("EPSG:32614");

  SUBCASE("missing file") {
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "nope.gpkg", utm),
                         doctest::Contains("nope.gpkg: cannot open the fault map (no such file)"), IoError);
  }
  SUBCASE("network path") {
    CHECK_THROWS_WITH_AS(formats::read_fault_segments("/vsicurl/https://example.org/faults.fgb", utm),
                         doctest::Contains("network"), RefusedError);
  }
  SUBCASE("not a vector file") {
    write_text(dir / "faults.geojson", "this is not json");
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "faults.geojson", utm),
                         doctest::Contains("faults.geojson: cannot open as a fault map"), IoError);
  }
  SUBCASE("only points") {
    write_text(dir / "wells.geojson", R"({"type": "FeatureCollection", "features": [
      {"type": "Feature", "properties": {"fault_id": "W1", "dip": 60},
       "geometry": {"type": "Point", "coordinates": [-97.5, 36.0]}}]})");
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "wells.geojson", utm),
                         doctest::Contains("wells.geojson: field 'geometry' = 'no line features (layers: wells (Point))'"),
                         InputError);
    auto o = options();
    o.layer = "wells";
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "wells.geojson", utm, o),
                         doctest::Contains("layer 'wells': field 'geometry' = 'Point'"), InputError);
    o.layer = "wels";
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "wells.geojson", utm, o),
                         doctest::Contains("did you mean 'wells'"), InputError);
  }
  SUBCASE("a point among lines names its FID") {
    write_text(dir / "mixed.geojson", R"({"type": "FeatureCollection", "features": [
      {"type": "Feature", "properties": {"fault_id": "A", "dip": 60},
       "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}},
      {"type": "Feature", "properties": {"fault_id": "B", "dip": 60},
       "geometry": {"type": "Point", "coordinates": [-97.5, 36.0]}}]})");
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "mixed.geojson", utm),
                         doctest::Contains("layer 'mixed' feature FID 1: field 'geometry' = 'Point'"), InputError);
  }
  SUBCASE("a non-numeric dip names the FID, field and value") {
    write_text(dir / "f.geojson", R"({"type": "FeatureCollection", "features": [
      {"type": "Feature", "properties": {"fault_id": "A", "dip": "60"},
       "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}},
      {"type": "Feature", "properties": {"fault_id": "B", "dip": "steep"},
       "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.8], [-97.5, 35.9]]}}]})");
    CHECK_THROWS_WITH_AS(
        formats::read_fault_segments(dir / "f.geojson", utm),
        doctest::Contains("f.geojson layer 'f' feature FID 1: field 'dip' = 'steep': expected a dip in degrees"),
        InputError);
  }
  SUBCASE("dip out of range, bad dip direction, bad side, bad friction") {
    auto one = [&](const std::string& props) {
      write_text(dir / "g.geojson", R"({"type": "FeatureCollection", "features": [
        {"type": "Feature", "properties": {"fault_id": "A", )" + props + R"(},
         "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}}]})");
      return formats::read_fault_segments(dir / "g.geojson", utm);
    };
    CHECK_THROWS_WITH_AS(one(R"("dip": 95)"), doctest::Contains("field 'dip' = '95'"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("dip": 60, "dip_dir": "NX")"), doctest::Contains("field 'dip_dir' = 'NX'"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("dip": 60, "dips_to": "up")"), doctest::Contains("field 'dips_to' = 'up'"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("dip": 60, "friction": -1)"), doctest::Contains("field 'friction' = '-1'"), InputError);
    CHECK_NOTHROW(one(R"("dip": 60, "dip_dir": 130, "friction": "0.6")"));
  }
  SUBCASE("a fault's own depth range: top and bottom, metres or with a unit, checked") {
    auto one = [&](const std::string& props) {
      write_text(dir / "d.geojson", R"({"type": "FeatureCollection", "features": [
        {"type": "Feature", "properties": {"fault_id": "A", "dip": 60, )" + props + R"(},
         "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}}]})");
      return formats::read_fault_segments(dir / "d.geojson", utm);
    };
    const auto segs = one(R"("top": "2.1 km", "bottom": 4500)");
    REQUIRE(!segs.empty());
    for (const auto& g : segs) {
      REQUIRE(g.top_m.has_value());
      REQUIRE(g.bottom_m.has_value());
      CHECK(*g.top_m == 2100.0);  // 2.1 km (units: 1 km = 1000 m)
      CHECK(*g.bottom_m == 4500.0);
    }
    const auto plain = one(R"("friction": 0.6)");
    CHECK_FALSE(plain.front().top_m.has_value());  // absent: the region's range applies
    CHECK_THROWS_WITH_AS(one(R"("top": 3000, "bottom": "2 km")"),
                         doctest::Contains("feature FID 0: field 'bottom' = '2 km': expected a depth below the fault's top"),
                         InputError);
    CHECK_THROWS_WITH_AS(one(R"("top": 3000)"), doctest::Contains("field 'bottom' = '(empty)'"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("top": 0, "bottom": "16 km")"),
                         doctest::Contains("field 'bottom' = '16 km': expected a depth from 0 to 15 km"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("top": -5, "bottom": 100)"), doctest::Contains("field 'top' = '-5'"), InputError);
    CHECK_THROWS_WITH_AS(one(R"("top": "deep", "bottom": 100)"), doctest::Contains("field 'top' = 'deep'"), InputError);
    // an empty field name switches the attribute off
    formats::FaultFileOptions off;
    off.attributes.top = off.attributes.bottom = "";
    write_text(dir / "d.geojson", R"({"type": "FeatureCollection", "features": [
        {"type": "Feature", "properties": {"fault_id": "A", "dip": 60, "top": 3000},
         "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}}]})");
    CHECK_FALSE(formats::read_fault_segments(dir / "d.geojson", utm, off).front().top_m.has_value());
  }
  SUBCASE("a missing id field suggests the nearest field name") {
    write_text(dir / "h.geojson", R"({"type": "FeatureCollection", "features": [
      {"type": "Feature", "properties": {"faultid": "A", "dip": 60},
       "geometry": {"type": "LineString", "coordinates": [[-97.6, 35.9], [-97.5, 36.0]]}}]})");
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "h.geojson", utm),
                         doctest::Contains("field 'fault id field' = 'fault_id': expected a field of the layer "
                                           "(fields: faultid, dip) (did you mean 'faultid'?)"),
                         InputError);
  }
}

TEST_CASE("default dip and the right-hand rule when no sense is given") {
  test::TempDir dir("faults-default");
  write_text(dir / "d.geojson", R"({"type": "FeatureCollection", "features": [
    {"type": "Feature", "properties": {"fault_id": 7},
     "geometry": {"type": "LineString", "coordinates": [[-97.60, 35.90], [-97.55, 35.95], [-97.50, 36.00]]}}]})");
  auto o = options();
  o.attributes.default_dip_rad = 70 * kDeg;
  const auto segs = formats::read_fault_segments(dir / "d.geojson", formats::working_crs("EPSG:32614"), o);
  REQUIRE(segs.size() == 3);
  CHECK(segs[0].fault_id == "7");
  CHECK(std::abs(segs[0].dip_rad - 70 * kDeg) < 1e-12);
  CHECK(std::abs(segs[0].strike_rad - segs[0].trace.chord_azimuth_rad) < 1e-12);
}

TEST_CASE("dip direction parsing") {
  // 16-point compass, 22.5° apart (common practice).
  CHECK(std::abs(formats::parse_dip_direction("N", "d") - 0.0) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction("ene", "d") - 67.5 * kDeg) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction("SW", "d") - 225 * kDeg) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction("NNW", "d") - 337.5 * kDeg) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction(" 135 ", "d") - 135 * kDeg) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction("135 deg", "d") - 135 * kDeg) < 1e-12);
  CHECK(std::abs(formats::parse_dip_direction("360", "d") - 0.0) < 1e-12);
  CHECK_THROWS_AS(formats::parse_dip_direction("400", "d"), InputError);
  CHECK_THROWS_AS(formats::parse_dip_direction("north", "d"), InputError);
  CHECK_THROWS_AS(formats::parse_dip_direction("", "d"), InputError);
}

namespace {

// A one-layer GeoPackage in UTM 14N written through OGR, for content GeoJSON cannot carry
// (NaN coordinates, bytes that are not UTF-8).
void write_gpkg(const fs::path& path, const std::string& id, const std::vector<geometry::Point2>& points) {
  formats::ensure_gdal_registered();
  GDALDriver* driver = GetGDALDriverManager()->GetDriverByName("GPKG");
  REQUIRE(driver != nullptr);
  std::unique_ptr<GDALDataset> ds(driver->Create(path.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr));
  REQUIRE(ds != nullptr);
  OGRSpatialReference srs;
  srs.importFromEPSG(32614);
  OGRLayer* layer = ds->CreateLayer("faults", &srs, wkbLineString, nullptr);
  REQUIRE(layer != nullptr);
  OGRFieldDefn id_field("fault_id", OFTString), dip_field("dip", OFTReal);
  REQUIRE(layer->CreateField(&id_field) == OGRERR_NONE);
  REQUIRE(layer->CreateField(&dip_field) == OGRERR_NONE);
  OGRFeature f(layer->GetLayerDefn());
  f.SetField("fault_id", id.c_str());
  f.SetField("dip", 60.0);
  OGRLineString line;
  for (const auto& p : points) line.addPoint(p.x, p.y);
  f.SetGeometry(&line);
  REQUIRE(layer->CreateFeature(&f) == OGRERR_NONE);
}

std::string two_features(const std::string& id1, const std::string& coords1, const std::string& id2,
                         const std::string& coords2) {
  return R"({"type": "FeatureCollection", "features": [
    {"type": "Feature", "properties": {"fault_id": ")" + id1 + R"(", "dip": 60},
     "geometry": {"type": "LineString", "coordinates": )" + coords1 + R"(}},
    {"type": "Feature", "properties": {"fault_id": ")" + id2 + R"(", "dip": 60},
     "geometry": {"type": "LineString", "coordinates": )" + coords2 + R"(}}]})";
}

}  // namespace

TEST_CASE("one fault id, one feature: a repeated id names both features") {
  test::TempDir dir("faults-dup");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  write_text(dir / "dup.geojson", two_features("F1", "[[-97.6, 35.9], [-97.5, 36.0]]", "F1", "[[-97.7, 35.9], [-97.6, 36.0]]"));
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "dup.geojson", utm),
                       doctest::Contains("dup.geojson layer 'dup' feature FID 1: field 'fault_id' = 'F1': expected a "
                                         "fault id on one feature only: FID 0 of layer 'dup' has it too"),
                       InputError);
  // Two pieces of one fault as one MultiLineString feature stay one fault (the first fixture).
  write_text(dir / "ok.geojson", two_features("F1", "[[-97.6, 35.9], [-97.5, 36.0]]", "F2", "[[-97.7, 35.9], [-97.6, 36.0]]"));
  CHECK(formats::read_fault_segments(dir / "ok.geojson", utm, options()).size() == 6);
}

TEST_CASE("a trace that folds back is refused naming the fault and the vertex, unless accepted") {
  test::TempDir dir("faults-fold");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  // UTM coordinates (the file declares EPSG:32614): 4 km east, then 3.9 km back west 200 m north
  // of it: a turn of 180 - atan(200/3900) = 177.06 degrees at vertex 2 (plain trigonometry).
  const std::string hairpin = R"({"type": "FeatureCollection",
    "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32614"}}, "features": [
    {"type": "Feature", "properties": {"fault_id": "HP", "dip": 60},
     "geometry": {"type": "LineString", "coordinates": [[600000, 4000000], [604000, 4000000], [600100, 4000200]]}}]})";
  write_text(dir / "fold.geojson", hairpin);
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "fold.geojson", utm, options()),
                       doctest::Contains("fold.geojson layer 'fold' feature FID 0 (fault 'HP'): field 'geometry' = "
                                         "'the trace turns back by 177.1 deg at vertex 2 of 3 (604000, 4000000)"),
                       InputError);
  auto o = options();
  o.allow_folded = true;
  CHECK(formats::read_fault_segments(dir / "fold.geojson", utm, o).size() == 2);  // 7.9 km / 5 km

  // A trace whose third edge comes back across its first (turns of 90 and 135 degrees only): the
  // edge from vertex 3 meets the edge from vertex 1 at (602000, 4000000) (plain geometry).
  write_text(dir / "cross.geojson", R"({"type": "FeatureCollection",
    "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32614"}}, "features": [
    {"type": "Feature", "properties": {"fault_id": "X", "dip": 60},
     "geometry": {"type": "LineString", "coordinates": [[600000, 4000000], [604000, 4000000], [604000, 4002000], [601000, 3999000]]}}]})");
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "cross.geojson", utm, options()),
                       doctest::Contains("(fault 'X'): field 'geometry' = 'the trace crosses itself: the edge from "
                                         "vertex 3 of 4 meets the edge from vertex 1 at (602000, 4000000)"),
                       InputError);
}

TEST_CASE("an empty collection has no fault features; coordinates are checked where they are read") {
  test::TempDir dir("faults-empty");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  write_text(dir / "empty.geojson", R"({"type": "FeatureCollection", "features": []})");
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "empty.geojson", utm),
                       doctest::Contains("empty.geojson: field 'features' = 'none: the fault map has no fault features"),
                       InputError);

  // Each file holds one trace with one implausible vertex or length; the message names it.
  const auto refused = [&](const std::string& file, const std::vector<geometry::Point2>& points,
                           const std::string& expected) {
    CAPTURE(file);
    write_gpkg(dir / file, "F9", points);
    CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / file, utm), doctest::Contains(expected.c_str()), InputError);
  };
  refused("nan.gpkg", {{600000, 4000000}, {NAN, 4001000}},
          "nan.gpkg layer 'faults' feature FID 1 (fault 'F9'): field 'geometry vertex 2 of 2' = '(nan, 4001000)': "
          "expected finite x and y coordinates");
  refused("huge.gpkg", {{600000, 4000000}, {1e308, 4001000}},
          "huge.gpkg layer 'faults' feature FID 1 (fault 'F9'): field 'trace vertex 2' = '(1e+308, 4001000)': expected "
          "projected coordinates within 1e8 m");
  // 180,000 km of trace inside the coordinate bounds: refused by its length before any segment
  // is made (it would be 180,000 segments of 1 km).
  refused("long.gpkg", {{0, 0}, {0, 9e7}, {9e7, 9e7}},
          "(fault 'F9'): field 'trace length' = '1.8e+08 m': expected a fault trace of at most 1000 km");
}

TEST_CASE("text from the fault map is UTF-8, checked where it is read") {
  test::TempDir dir("faults-utf8");
  const formats::Crs utm = formats::working_crs("EPSG:32614");
  write_gpkg(dir / "latin1.gpkg", "Fall\xE9", {{600000, 4000000}, {601000, 4001000}});
  CHECK_THROWS_WITH_AS(formats::read_fault_segments(dir / "latin1.gpkg", utm),
                       doctest::Contains("latin1.gpkg layer 'faults' feature FID 1: field 'fault_id' = 'Fall\\xE9': "
                                         "expected UTF-8 text without control characters (byte 0xE9 at position 5 "
                                         "is not UTF-8)"),
                       InputError);
  write_gpkg(dir / "utf8.gpkg", "Fall\xC3\xA9", {{600000, 4000000}, {601000, 4001000}});
  CHECK(formats::read_fault_segments(dir / "utf8.gpkg", utm).front().fault_id == "Fall\xC3\xA9");
}

TEST_CASE("a CRS the file declares but PROJ does not know is not taken as WGS 84") {
  test::TempDir dir("faults-crs999");
  write_text(dir / "crs.geojson", R"({"type": "FeatureCollection",
    "crs": {"type": "name", "properties": {"name": "EPSG:999999"}}, "features": [
    {"type": "Feature", "properties": {"fault_id": "A", "dip": 60},
     "geometry": {"type": "LineString", "coordinates": [[600000, 4000000], [601000, 4001000]]}}]})");
  try {
    formats::read_fault_segments(dir / "crs.geojson", formats::working_crs("EPSG:32614"));
    FAIL("an unknown CRS was accepted");
  } catch (const InputError& e) {
    const std::string m = e.what();
    CHECK_MESSAGE(m.find("crs.geojson: field 'crs' = 'declared in the file but unknown") != std::string::npos, m);
    CHECK_MESSAGE(m.find("WGS 84") == std::string::npos, m);
  }
}
