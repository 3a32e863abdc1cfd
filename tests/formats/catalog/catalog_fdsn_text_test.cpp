#include "formats/catalog/catalog_fdsn_text.hpp"

#include <doctest/doctest.h>

#include <fstream>

#include "core/errors.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

namespace {
const std::string kDir = std::string(SLIPSCREEN_TEST_DATA) + "/catalog/";
}  // namespace

TEST_CASE("the FDSN text header is recognised by its first cell") {
  CHECK(formats::is_fdsn_text_header("#EventID|Time|Latitude|Longitude|Depth/km|Author|Catalog|Contributor|"
                                     "ContributorID|MagType|Magnitude|MagAuthor|EventLocationName"));
  CHECK(formats::is_fdsn_text_header("# EventID | Time | Latitude"));
  CHECK(formats::is_fdsn_text_header("#eventid|time"));
  CHECK_FALSE(formats::is_fdsn_text_header("# Fictional catalog | made for tests"));
  CHECK_FALSE(formats::is_fdsn_text_header("EventID|Time|Latitude"));  // no '#'
  CHECK_FALSE(formats::is_fdsn_text_header("#EventID,Time,Latitude"));  // not '|'
  CHECK_FALSE(formats::is_fdsn_text_header(""));
}

TEST_CASE("an FDSN text catalog holds the events of the CSV fixture") {
  const auto csv = formats::read_catalog_csv(kDir + "fixture_catalog.csv", formats::CatalogColumns{});
  // Read through read_catalog: detected by its header although the extension is .txt.
  const auto r = formats::read_catalog(kDir + "fdsn_text.txt", formats::CatalogFormat::automatic, {}, true);
  CHECK(r.format == "fdsn_text");
  CHECK(r.records == 12);
  CHECK(r.columns == "time=Time; lat=Latitude; lon=Longitude; depth=Depth/km (km); mag=Magnitude; magtype=MagType; id=EventID");
  CHECK(r.catalog.crs == "EPSG:4326");
  REQUIRE(r.catalog.events.size() == csv.catalog.events.size());
  for (std::size_t i = 0; i < r.catalog.events.size(); ++i) {
    const auto& x = r.catalog.events[i];
    const auto& y = csv.catalog.events[i];
    CAPTURE(x.id);
    CHECK(x.id == y.id);
    CHECK(x.time == y.time);  // times without a zone are UTC (the FDSN text convention)
    CHECK(x.x == y.x);
    CHECK(x.y == y.y);
    REQUIRE(x.depth);
    CHECK(*x.depth == *y.depth);  // Depth/km
    CHECK(x.magnitude == y.magnitude);
    CHECK(x.magnitude_type == y.magnitude_type);
  }
  // "csv" as the format reads it too (the header tells); QuakeML does not.
  CHECK(formats::read_catalog(kDir + "fdsn_text.txt", formats::CatalogFormat::csv, {}, true).format == "fdsn_text");
}

TEST_CASE("FDSN text quirks: spaces around cells, extra columns, empty cells, short rows") {
  const auto r = formats::read_catalog_fdsn_text(kDir + "fdsn_text_quirks.txt");
  CHECK(r.records == 5);
  REQUIRE(r.rejected.size() == 2);
  CHECK(r.rejected[0].line == 5);
  CHECK(r.rejected[0].reason == "field 'Magnitude' is empty: expected a magnitude between -5 and 10.5");
  CHECK(r.rejected[1].line == 6);
  CHECK(r.rejected[1].reason.find("fields where the header has 14") != std::string::npos);
  REQUIRE(r.catalog.events.size() == 3);
  CHECK(r.catalog.events[0].id == "q1");
  CHECK(r.catalog.events[0].time == 1704255129.25);  // 2024-01-03T04:12:09.25 UTC (python3 datetime)
  CHECK_FALSE(r.catalog.events[1].depth);             // empty depth: unknown
  CHECK(r.catalog.events[2].magnitude_type == "Mw");  // quotes and commas are plain text here
  CHECK(r.catalog.events[2].source.find("line 7") != std::string::npos);
}

TEST_CASE("FDSN text: a mapping is refused, a header without a needed column is an error") {
  CHECK_THROWS_WITH_AS(formats::read_catalog(kDir + "fdsn_text.txt", formats::CatalogFormat::automatic,
                                             formats::parse_catalog_columns("mag=Magnitude"), false),
                       doctest::Contains("no mapping for a catalog in the FDSN text format"), InputError);
  test::TempDir dir("fdsn-text");
  std::ofstream(dir / "c.txt") << "#EventID|Time|Latitude|Longitude|Depth/km\ne1|2024-01-03T00:00:00|35.5|-98.2|4.1\n";
  CHECK_THROWS_WITH_AS(formats::read_catalog_fdsn_text((dir / "c.txt").string()),
                       doctest::Contains("c.txt line 1: field 'header' = '#EventID|Time|Latitude|Longitude|Depth/km': "
                                         "expected a magnitude column ('Magnitude', in any case), as the FDSN text "
                                         "format names it"),
                       InputError);
  std::ofstream(dir / "d.txt") << "EventID|Time\n";
  CHECK_THROWS_WITH_AS(formats::read_catalog_fdsn_text((dir / "d.txt").string()), doctest::Contains("d.txt line 1"),
                       InputError);
}
