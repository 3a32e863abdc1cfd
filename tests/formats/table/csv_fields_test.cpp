#include "formats/table/csv_fields.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;

TEST_CASE("CSV records split with RFC 4180 quoting") {
  using V = std::vector<std::string>;
  CHECK(formats::split_csv_record("a,b,c") == V{"a", "b", "c"});
  CHECK(formats::split_csv_record(" a , b ,") == V{"a", "b", ""});
  CHECK(formats::split_csv_record("\"x, y\",\"say \"\"hi\"\"\",z") == V{"x, y", "say \"hi\"", "z"});
  CHECK(formats::split_csv_record("a;b", ';') == V{"a", "b"});
  CHECK(formats::split_csv_record("") == V{""});
  CHECK_THROWS_AS(formats::split_csv_record("\"open,b"), InputError);
}
