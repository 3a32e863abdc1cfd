#include "formats/gis/gdal_errors.hpp"

#include <cpl_error.h>
#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;

TEST_CASE("GDAL failures are collected by the scope and thrown as IoError naming the file") {
  formats::GdalErrorScope scope("faults.gpkg");
  CHECK_FALSE(scope.has_error());
  CPLError(CE_Warning, CPLE_AppDefined, "just a warning");
  CHECK_FALSE(scope.has_error());
  REQUIRE(scope.warnings().size() == 1);
  CHECK(scope.warnings()[0] == "just a warning");
  CHECK_NOTHROW(scope.throw_if_error("reading"));
  CPLError(CE_Failure, CPLE_OpenFailed, "no such table");
  CHECK(scope.has_error());
  CHECK_THROWS_WITH_AS(scope.throw_if_error("reading"), "faults.gpkg: reading: no such table", IoError);
  scope.clear();
  CHECK_FALSE(scope.has_error());
}

TEST_CASE("scopes nest; the innermost collects, the outer sees nothing") {
  formats::GdalErrorScope outer("outer");
  {
    formats::GdalErrorScope inner("inner");
    CPLError(CE_Failure, CPLE_AppDefined, "inner failure");
    CHECK(inner.has_error());
  }
  CHECK_FALSE(outer.has_error());
  CPLError(CE_Failure, CPLE_AppDefined, "outer failure");
  CHECK(outer.message() == "outer failure");
}
