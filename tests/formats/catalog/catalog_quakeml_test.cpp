#include "formats/catalog/catalog_quakeml.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>

#include "core/errors.hpp"
#include "formats/catalog/catalog_file.hpp"

using namespace slipscreen;

namespace {
const std::string kDir = std::string(SLIPSCREEN_TEST_DATA) + "/catalog/";
}

TEST_CASE("QuakeML preferred origin and magnitude by publicID") {
  const auto r = formats::read_catalog_quakeml(kDir + "fixture_catalog.xml");
  CHECK(r.records == 12);
  CHECK(r.rejected.empty());
  CHECK(r.warnings.empty());
  REQUIRE(r.catalog.events.size() == 12);
  const auto& e = r.catalog.events[0];
  CHECK(e.id == "smi:slipscreen.test/ev01");
  CHECK(e.time == doctest::Approx(1704255129.25).epsilon(1e-15));  // not the superseded 2020 origin
  CHECK(e.y == 35.5012);
  CHECK(*e.depth == 4100.0);  // metres in QuakeML 1.2
  CHECK(e.magnitude == 1.2);  // not the decoy 9.9 Mx
  CHECK(e.magnitude_type == "ML");
  CHECK(r.catalog.description.find("Fictional") != std::string::npos);
}

TEST_CASE("QuakeML fall-backs are warnings; unusable events are rejected with lines") {
  const auto r = formats::read_catalog_quakeml(kDir + "quakeml_quirks.xml");
  CHECK(r.records == 5);
  REQUIRE(r.catalog.events.size() == 2);
  CHECK(r.catalog.events[0].magnitude == 1.4);
  CHECK_FALSE(r.catalog.events[0].depth);
  CHECK(*r.catalog.events[1].depth == 3500.0);
  REQUIRE(r.warnings.size() == 3);  // q1: no preferred origin, no preferred magnitude; q2: dangling origin
  CHECK(r.warnings[2].find("matches no Origin") != std::string::npos);
  REQUIRE(r.rejected.size() == 3);
  CHECK(r.rejected[0].line == 22);  // the <event> element of q3
  CHECK(r.rejected[0].reason.find("missing magnitude") != std::string::npos);
  CHECK(r.rejected[1].reason.find("not existing") != std::string::npos);
  CHECK(r.rejected[2].reason.find("ISO 8601") != std::string::npos);
}

TEST_CASE("malformed QuakeML is an input error with a line") {
  const auto p = std::filesystem::temp_directory_path() / "slipscreen_bad_quakeml.xml";
  {
    std::ofstream out(p);
    out << "<?xml version=\"1.0\"?>\n<quakeml>\n<eventParameters>\n<event>\n</eventParameters>\n";
  }
  CHECK_THROWS_WITH_AS(formats::read_catalog_quakeml(p.string()), doctest::Contains("line"), InputError);
  {
    std::ofstream out(p);
    out << "<?xml version=\"1.0\"?>\n<catalog/>\n";
  }
  CHECK_THROWS_WITH_AS(formats::read_catalog_quakeml(p.string()), doctest::Contains("quakeml"), InputError);
  std::filesystem::remove(p);
}
