// The project's one trim (common practice: ASCII white space at both ends only).
#include "core/util/trim.hpp"

#include <doctest/doctest.h>

using slipscreen::util::trim;

TEST_CASE("trim removes spaces, tabs, carriage returns and line feeds at both ends only") {
  CHECK(trim("  2300 m \t") == "2300 m");
  CHECK(trim("\r\nEPSG:32708\r\n") == "EPSG:32708");
  CHECK(trim("a  b") == "a  b");
  CHECK(trim("") == "");
  CHECK(trim(" \t\r\n ") == "");
  CHECK(trim("\vx\v") == "\vx\v");  // only the four ASCII spaces above
}
