#include "core/util/number_text.hpp"

#include <doctest/doctest.h>

#include <limits>

using slipscreen::util::number_text;

TEST_CASE("numbers in messages are short and show NaN and infinity") {
  CHECK(number_text(0.1) == "0.1");
  CHECK(number_text(-1e-9) == "-1e-09");
  CHECK(number_text(1234.5678, 6) == "1234.57");
  CHECK(number_text(std::numeric_limits<double>::quiet_NaN()) == "nan");
  CHECK(number_text(std::numeric_limits<double>::infinity()) == "inf");
}
