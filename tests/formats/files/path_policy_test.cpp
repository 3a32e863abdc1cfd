#include "formats/files/path_policy.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;

TEST_CASE("network paths are recognised and refused unless allowed") {
  for (const char* p : {"/vsicurl/https://example.org/f.gpkg", "/vsis3/bucket/f.gpkg", "/VSIGS/b/f.fgb",
                        "/vsizip//vsicurl/http://h/f.zip", "https://example.org/f.geojson", "ftp://h/f.shp",
                        "PG:dbname=faults", "WFS:http://h/wfs"}) {
    CAPTURE(p);
    CHECK(formats::is_network_path(p));
    CHECK_THROWS_WITH_AS(formats::require_local_path(p, false, "region.faults"), doctest::Contains("region.faults"),
                         RefusedError);
    CHECK_NOTHROW(formats::require_local_path(p, true, "region.faults"));
  }
  for (const char* p : {"faults.gpkg", "data/faults.geojson", "/home/u/faults.shp", "/vsizip/local.zip/f.shp",
                        "C:/data/f.gpkg"}) {
    CAPTURE(p);
    CHECK_FALSE(formats::is_network_path(p));
  }
}

TEST_CASE("safe relative outputs") {
  CHECK(formats::safe_relative_output("k", "tables/./summary.csv") == std::filesystem::path("tables/summary.csv"));
  CHECK_THROWS_WITH_AS(formats::safe_relative_output("outputs.table", "../../etc/x"),
                       doctest::Contains("outputs.table = '../../etc/x'"), RefusedError);
  CHECK_THROWS_WITH_AS(formats::safe_relative_output("outputs.table", "/tmp/x"), doctest::Contains("absolute"),
                       RefusedError);
  CHECK_THROWS_AS(formats::safe_relative_output("k", "https://h/x.csv"), RefusedError);
}

TEST_CASE("control characters in an output name are refused, shown escaped") {
  CHECK_THROWS_WITH_AS(formats::safe_relative_output("output.files.segments", "seg\nments.csv"),
                       doctest::Contains("output.files.segments = 'seg\\nments.csv': a control character"),
                       RefusedError);
  CHECK_THROWS_AS(formats::safe_relative_output("k", "a\tb.csv"), RefusedError);
  CHECK_THROWS_AS(formats::safe_relative_output("k", std::string("a\0b.csv", 7)), RefusedError);
  CHECK_THROWS_AS(formats::safe_relative_output("k", "a\x7f.csv"), RefusedError);
  CHECK(formats::escaped_text(std::string("a\tb\0c\x01\r", 7)) == "a\\tb\\0c\\x01\\r");
  CHECK(formats::safe_relative_output("k", "résumé.csv") == std::filesystem::path("résumé.csv"));  // UTF-8 is fine
}

TEST_CASE("GDAL virtual paths are told from local ones") {
  for (const char* p : {"/vsimem/run", "/vsizip/a.zip/run", "/VSIMEM/x", "/vsistdout/", "https://h/x", "PG:db"}) {
    CAPTURE(p);
    CHECK(formats::is_virtual_or_network_path(p));
  }
  for (const char* p : {"runs/demo", "/tmp/vsimem/run", "vsimem/run", "/home/u/run"}) {
    CAPTURE(p);
    CHECK_FALSE(formats::is_virtual_or_network_path(p));
  }
}
