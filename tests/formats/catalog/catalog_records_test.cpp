// Strict mode over read catalog records (formats/catalog/catalog_records.cpp).
#include "formats/catalog/catalog_records.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;

TEST_CASE("strict mode refuses a catalog with unusable records, naming the first and the count") {
  formats::CatalogReadResult r;
  r.path = "quakes.csv";
  CHECK_NOTHROW(formats::throw_if_strict(r, true));  // nothing rejected
  r.rejected = {{7, "field 'time' = '2024-13-01': expected an ISO 8601 UTC time"}, {9, "no magnitude"}};
  CHECK_NOTHROW(formats::throw_if_strict(r, false));  // lenient: the records are reported instead
  CHECK_THROWS_WITH_AS(formats::throw_if_strict(r, true),
                       doctest::Contains("quakes.csv line 7: field 'record' = 'unusable': expected every record "
                                         "usable in strict mode; 2 unusable record(s), the first: field 'time'"),
                       InputError);
}
