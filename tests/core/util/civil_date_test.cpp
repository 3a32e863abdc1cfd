#include "core/util/civil_date.hpp"

#include <doctest/doctest.h>

using namespace slipscreen::util;

TEST_CASE("days_from_civil against Python's datetime.date (date - date(1970,1,1)).days") {
  // Reference values computed with /usr/bin/python3, datetime module.
  CHECK(days_from_civil({1970, 1, 1}) == 0);
  CHECK(days_from_civil({2000, 3, 1}) == 11017);
  CHECK(days_from_civil({1969, 12, 31}) == -1);
  CHECK(days_from_civil({2024, 2, 29}) == 19782);
  CHECK(days_from_civil({1, 1, 1}) == -719162);
  CHECK(days_from_civil({9999, 12, 31}) == 2932896);
  CHECK(days_from_civil({2037, 1, 1}) == 24472);
}

TEST_CASE("civil_from_days inverts days_from_civil over the whole ISO range") {
  for (std::int64_t z = -719162; z <= 2932896; z += 37) {
    const CivilDate d = civil_from_days(z);
    REQUIRE(days_from_civil(d) == z);
    REQUIRE(d.day <= days_in_month(d.year, d.month));
  }
}

TEST_CASE("ISO parsing is strict") {
  CHECK(parse_iso_date("2024-02-29") == CivilDate{2024, 2, 29});
  CHECK_FALSE(parse_iso_date("2023-02-29"));  // 2023 is not a leap year (common practice)
  CHECK_FALSE(parse_iso_date("1900-02-29"));  // century rule
  CHECK(parse_iso_date("2000-02-29"));        // 400-year rule
  CHECK_FALSE(parse_iso_date("2024-13-01"));
  CHECK_FALSE(parse_iso_date("2024-1-01"));
  CHECK_FALSE(parse_iso_date("2024/01/01"));
  CHECK_FALSE(parse_iso_date("2024-01-01x"));
  CHECK(parse_iso_month("2019-07") == CivilDate{2019, 7, 1});
  CHECK_FALSE(parse_iso_month("2019-7"));
  CHECK_FALSE(parse_iso_month("2019-00"));
  CHECK(format_iso_date({987, 3, 4}) == "0987-03-04");
  CHECK(format_iso_month({2027, 11, 1}) == "2027-11");
}

TEST_CASE("calendar month arithmetic clamps to the month's end") {
  CHECK(add_months({2027, 1, 31}, 1) == CivilDate{2027, 2, 28});
  CHECK(add_months({2028, 1, 31}, 1) == CivilDate{2028, 2, 29});
  CHECK(add_months({2027, 12, 15}, 1) == CivilDate{2028, 1, 15});
  CHECK(add_months({2027, 1, 15}, -1) == CivilDate{2026, 12, 15});
  CHECK(add_months({2027, 5, 1}, 120) == CivilDate{2037, 5, 1});
}

TEST_CASE("seconds and dates") {
  CHECK(to_seconds({1970, 1, 2}) == 86400.0);
  CHECK(date_at(86399.0) == CivilDate{1970, 1, 1});
  CHECK(date_at(-1.0) == CivilDate{1969, 12, 31});
}
