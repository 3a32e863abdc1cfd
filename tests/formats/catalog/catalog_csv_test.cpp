#include "formats/catalog/catalog_csv.hpp"

#include <doctest/doctest.h>

#include <fstream>

#include "core/errors.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

namespace {
const std::string kDir = std::string(SLIPSCREEN_TEST_DATA) + "/catalog/";
const char* kFixtureMap = "id=event_id;time=origin_time;depth=depth_km;depth_unit=km";
}  // namespace

TEST_CASE("the CSV fixture reads with its mapping") {
  const auto r = formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::parse_catalog_columns(kFixtureMap));
  CHECK(r.records == 12);
  CHECK(r.rejected.empty());
  REQUIRE(r.catalog.events.size() == 12);
  const auto& e = r.catalog.events[0];
  CHECK(e.id == "smi:slipscreen.test/ev01");
  CHECK(e.time == doctest::Approx(1704255129.25).epsilon(1e-15));  // Python datetime (see iso_time_test)
  CHECK(e.y == 35.5012);
  CHECK(e.x == -98.2031);
  REQUIRE(e.depth);
  CHECK(*e.depth == doctest::Approx(4100.0).epsilon(1e-12));  // 4.10 km
  CHECK(e.magnitude == 1.2);
  CHECK(e.magnitude_type == "ML");
  CHECK(e.source.find("line 4") != std::string::npos);
  CHECK(r.catalog.description.find("Fictional") != std::string::npos);
  CHECK(r.catalog.kind == seismo::CoordinateKind::geographic);
  CHECK(r.columns == "time=origin_time; lat=latitude; lon=longitude; depth=depth_km (km); mag=magnitude; "
                     "magtype=magnitude_type; id=event_id");
}

TEST_CASE("unusable rows are reported with line numbers, never dropped silently") {
  const auto cols = formats::parse_catalog_columns("id=event_id;time=origin_time;depth=depth_km");
  const auto r = formats::read_catalog_csv(kDir + "bad_rows.csv", cols);
  CHECK(r.records == 8);
  REQUIRE(r.rejected.size() == 4);
  CHECK(r.rejected[0].line == 4);
  CHECK(r.rejected[0].reason.find("ISO 8601") != std::string::npos);
  CHECK(r.rejected[1].line == 5);
  CHECK(r.rejected[1].reason.find("'magnitude' is empty") != std::string::npos);
  CHECK(r.rejected[2].line == 6);
  CHECK(r.rejected[2].reason.find("fields") != std::string::npos);
  CHECK(r.rejected[3].line == 7);
  CHECK(r.rejected[3].reason.find("latitude") != std::string::npos);
  REQUIRE(r.catalog.events.size() == 4);
  CHECK(r.catalog.events[1].magnitude_type == "Mq");  // read as given; the type filter judges it
  CHECK_FALSE(r.catalog.events[2].depth);             // empty depth: unknown, not rejected
  CHECK(r.catalog.events[3].time == 1704787200.0);    // +02:00 offset converted to UTC
  CHECK(*r.catalog.events[3].depth == doctest::Approx(4100.0).epsilon(1e-12));  // "4100 m" with its unit
  // Strict mode: one error naming the file, the first line and the count.
  CHECK_THROWS_WITH_AS(formats::read_catalog(kDir + "bad_rows.csv", formats::CatalogFormat::automatic, cols, true),
                       doctest::Contains("bad_rows.csv line 4"), InputError);
  CHECK_THROWS_WITH_AS(formats::read_catalog(kDir + "bad_rows.csv", formats::CatalogFormat::automatic, cols, true),
                       doctest::Contains("4 unusable record(s)"), InputError);
}

TEST_CASE("header problems and missing files") {
  CHECK_THROWS_WITH_AS(formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::parse_catalog_columns("time=orign_time")),
                       doctest::Contains("did you mean 'origin_time'"), InputError);
  // A column the mapping names but the header lacks: the message shows the header as written.
  CHECK_THROWS_WITH_AS(formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::parse_catalog_columns("mag=ml")),
                       doctest::Contains("fixture_catalog.csv line 3: field 'magnitude column' = 'ml': expected a column "
                                         "of that name in the header 'event_id,origin_time,latitude,longitude,depth_km,"
                                         "magnitude,magnitude_type'"),
                       InputError);
  CHECK_THROWS_AS(formats::read_catalog_csv(kDir + "no_such_file.csv", formats::CatalogColumns{}), IoError);
  const auto r = formats::read_catalog_csv(kDir + "empty.csv", formats::parse_catalog_columns(kFixtureMap));
  CHECK(r.records == 0);
  CHECK(r.catalog.events.empty());
}

TEST_CASE("a UTF-8 byte-order mark before the first line is ignored") {
  const auto r = formats::read_catalog_csv(kDir + "bom_latin1.csv", formats::CatalogColumns{});
  CHECK(r.rejected.empty());
  CHECK(r.catalog.events.size() == 2);
  CHECK(r.catalog.description.find("Fictional") != std::string::npos);
}

TEST_CASE("the fixture reads without a mapping: its header uses common spellings") {
  const auto mapped = formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::parse_catalog_columns(kFixtureMap));
  const auto plain = formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::CatalogColumns{});
  REQUIRE(plain.catalog.events.size() == 12);
  CHECK(plain.columns == mapped.columns);
  CHECK(plain.warnings.empty());
}

TEST_CASE("a header without a depth column gives a warning, not an error; depth=- gives none") {
  test::TempDir dir("catalog-nodepth");
  std::ofstream(dir / "c.csv") << "id,time,lat,lon,mag\nd1,2024-01-03T04:12:09Z,35.5,-98.2,1.2\n";
  const auto r = formats::read_catalog_csv((dir / "c.csv").string(), formats::CatalogColumns{});
  REQUIRE(r.catalog.events.size() == 1);
  CHECK_FALSE(r.catalog.events[0].depth);
  REQUIRE(r.warnings.size() == 1);
  CHECK(r.warnings[0].find("no depth column (looked for 'depth' or 'depth_km')") != std::string::npos);
  const auto quiet = formats::read_catalog_csv((dir / "c.csv").string(), formats::parse_catalog_columns("depth=-"));
  CHECK(quiet.warnings.empty());
  CHECK(quiet.columns.find("depth=-") != std::string::npos);
}
