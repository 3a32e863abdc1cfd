#include "formats/catalog/catalog_file.hpp"

#include <doctest/doctest.h>

#include <filesystem>

#include "core/errors.hpp"

using namespace slipscreen;

namespace {

// Two readings hold the same events: same ids, times within 1 ms, coordinates within 1e-9
// degrees, depths within 1 mm, equal magnitudes and types (common practice for "same event").
void check_same_events(const seismo::Catalog& a, const seismo::Catalog& b) {
  REQUIRE(a.events.size() == b.events.size());
  for (std::size_t i = 0; i < a.events.size(); ++i) {
    const auto& x = a.events[i];
    const auto& y = b.events[i];
    CAPTURE(x.id);
    CHECK(x.id == y.id);
    CHECK(std::abs(x.time - y.time) < 1e-3);
    CHECK(std::abs(x.x - y.x) < 1e-9);
    CHECK(std::abs(x.y - y.y) < 1e-9);
    REQUIRE(x.depth.has_value() == y.depth.has_value());
    if (x.depth) CHECK(std::abs(*x.depth - *y.depth) < 1e-3);
    CHECK(x.magnitude == doctest::Approx(y.magnitude).epsilon(1e-12));
    CHECK(x.magnitude_type == y.magnitude_type);
  }
}

}  // namespace

TEST_CASE("CSV and QuakeML forms of the test fixture hold identical events") {
  const std::string dir = std::string(SLIPSCREEN_TEST_DATA) + "/catalog/";
  const auto cols = formats::parse_catalog_columns("id=event_id;time=origin_time;depth=depth_km");
  const auto csv = formats::read_catalog(dir + "fixture_catalog.csv", formats::CatalogFormat::automatic, cols, true);
  const auto xml = formats::read_catalog(dir + "fixture_catalog.xml", formats::CatalogFormat::automatic, cols, true);
  CHECK(csv.format == "csv");
  CHECK(xml.format == "quakeml");
  check_same_events(csv.catalog, xml.catalog);
}

TEST_CASE("CSV and QuakeML forms of the demo catalog hold identical events") {
  const std::string dir = std::string(SLIPSCREEN_SOURCE_DIR) + "/catalogs/demo/";
  REQUIRE(std::filesystem::exists(dir + "demo_catalog.csv"));
  const auto csv = formats::read_catalog(dir + "demo_catalog.csv", formats::CatalogFormat::automatic, formats::CatalogColumns{}, true);
  const auto xml = formats::read_catalog(dir + "demo_catalog.xml", formats::CatalogFormat::automatic, formats::CatalogColumns{}, true);
  CHECK(csv.catalog.events.size() > 50);
  CHECK(csv.catalog.description.find("SYNTHETIC") != std::string::npos);
  CHECK(xml.catalog.description.find("SYNTHETIC") != std::string::npos);
  check_same_events(csv.catalog, xml.catalog);
}

TEST_CASE("format detection and unreadable files") {
  CHECK_THROWS_AS(formats::read_catalog("/nonexistent/catalog.dat", formats::CatalogFormat::automatic, formats::CatalogColumns{}, false),
                  IoError);
}
