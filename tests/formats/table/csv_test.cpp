#include "formats/table/csv.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::formats;

TEST_CASE("RFC 4180 quoting, CRLF, comments and line numbers") {
  const std::string text =
      "\xEF\xBB\xBF# crs: EPSG:32708\r\n"
      "id,name,top [ft]\r\n"
      "W1,\"Smith, \"\"A\"\"\",5000\r\n"
      "\r\n"
      "W2,\"two\nlines\",6000\n"
      "W3,,7000";
  const CsvTable t = parse_csv(text, "w.csv");
  CHECK(t.header.size() == 3);
  CHECK(t.header_line == 2);
  REQUIRE(t.rows.size() == 3);
  CHECK(t.rows[0].fields[1] == "Smith, \"A\"");  // RFC 4180 section 2, rules 6 and 7
  CHECK(t.rows[0].line == 3);
  CHECK(t.rows[1].fields[1] == "two\nlines");
  CHECK(t.rows[1].line == 5);
  CHECK(t.rows[2].line == 7);  // the quoted line break counts as a line
  CHECK(t.rows[2].fields[1].empty());
  CHECK(t.comment_value("CRS") == std::string("EPSG:32708"));
  CHECK(t.column("TOP") == std::size_t{2});
  CHECK(t.where(t.rows[2], 2) == "w.csv line 7, column 3 ('top [ft]')");
}

TEST_CASE("header units") {
  CHECK(split_header_unit("top [ft]").name == "top");
  CHECK(split_header_unit("top [ft]").unit == "ft");
  CHECK(split_header_unit(" rate (bbl/d) ").unit == "bbl/d");
  CHECK(split_header_unit("volume").unit.empty());
}

TEST_CASE("malformed CSV names file and line") {
  CHECK_THROWS_WITH_AS(parse_csv("a,b\n1,2,3\n", "x.csv"),
                       doctest::Contains("x.csv line 2: field 'row' = '3 fields': expected 2 fields"), InputError);
  CHECK_THROWS_WITH_AS(parse_csv("a,b\n1,\"open\n", "x.csv"), doctest::Contains("x.csv line 2"), InputError);
  CHECK_THROWS_WITH_AS(parse_csv("a,b\n1,\"x\"y\n", "x.csv"), doctest::Contains("after the closing quote"), InputError);
  CHECK_THROWS_WITH_AS(parse_csv("a,A\n", "x.csv"), doctest::Contains("not used before"), InputError);
  CHECK_THROWS_WITH_AS(parse_csv("# only a comment\n", "x.csv"), doctest::Contains("header"), InputError);
  CHECK_THROWS_AS(read_csv("/nonexistent/file.csv", "file.csv"), IoError);
}

TEST_CASE("cells are UTF-8 without control characters, checked where they are read") {
  // A NUL byte in a well id is blamed on this file, line and column (not on a later file whose
  // ids no longer match).
  const std::string nul = std::string("id,x\nW1,1\nW2\0,2\n", 17);
  CHECK_THROWS_WITH_AS(parse_csv(nul, "wells.csv"),
                       doctest::Contains("wells.csv line 3, column 1 ('id'): field 'id' = 'W2\\x00': expected UTF-8 "
                                         "text without control characters (a NUL byte (0x00) at position 3"),
                       InputError);
  CHECK_THROWS_WITH_AS(parse_csv("id,name\nW1,Pe\xF1" "a\n", "wells.csv"),
                       doctest::Contains("wells.csv line 2, column 2 ('name'): field 'name' = 'Pe\\xF1a': expected "
                                         "UTF-8 text without control characters (byte 0xF1 at position 3 is not UTF-8"),
                       InputError);
  CHECK_THROWS_WITH_AS(parse_csv("id,t\xE9te\n", "h.csv"), doctest::Contains("h.csv line 1, column 2"), InputError);
  CHECK_THROWS_WITH_AS(parse_csv("# crs: EPSG\x01\nid\n", "c.csv"), doctest::Contains("c.csv line 1: field 'comment'"),
                       InputError);
  // UTF-8 text, tabs and line breaks inside quotes are fine.
  const CsvTable t = parse_csv("id,name\nW1,\"Pe\xC3\xB1" "a\tnorth\nside\"\n", "ok.csv");
  REQUIRE(t.rows.size() == 1);
  CHECK(t.rows[0].fields[1] == "Pe\xC3\xB1" "a\tnorth\nside");
}
