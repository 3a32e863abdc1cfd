#include "formats/table/iso_time.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;
using formats::parse_iso8601_utc;

TEST_CASE("ISO 8601 UTC times to epoch seconds") {
  // Reference values: Python datetime.fromisoformat(...).timestamp() via /usr/bin/python3.
  CHECK(parse_iso8601_utc("2024-01-01T00:00:00Z") == 1704067200.0);
  CHECK(parse_iso8601_utc("2024-01-01") == 1704067200.0);
  CHECK(parse_iso8601_utc("2024-01-03T04:12:09.250Z") == doctest::Approx(1704255129.25).epsilon(1e-15));
  CHECK(parse_iso8601_utc("2024-01-09 10:00:00+02:00") == 1704787200.0);
  CHECK(parse_iso8601_utc("2024-01-09T03:30-04:30") == 1704787200.0);
  CHECK(parse_iso8601_utc("2024-01-09T08:00:00+0000") == 1704787200.0);
  CHECK(parse_iso8601_utc("1969-12-31T23:59:59.5Z") == doctest::Approx(-0.5).epsilon(1e-12));
  CHECK(parse_iso8601_utc("2024-02-29T00:00:00Z") - parse_iso8601_utc("2024-02-28T00:00:00Z") == 86400.0);
}

TEST_CASE("malformed times are input errors naming the field") {
  for (const char* bad : {"2023-02-29", "2024-13-01T00:00:00Z", "2024-01-01T24:00:00Z", "2024-01-01T00:00:00Zjunk",
                          "01/02/2024", "", "2024-1-1", "2024-01-01T10", "2024-01-01T10:00:00."}) {
    CAPTURE(bad);
    CHECK_THROWS_WITH_AS(parse_iso8601_utc(bad, "origin_time"), doctest::Contains("field 'origin_time'"), InputError);
  }
}

TEST_CASE("formatting round-trips to the millisecond") {
  CHECK(formats::format_iso8601_utc(1704255129.25) == "2024-01-03T04:12:09.250Z");
  CHECK(formats::format_iso8601_utc(1704067200.0) == "2024-01-01T00:00:00Z");
  CHECK(formats::format_iso8601_utc(-0.5) == "1969-12-31T23:59:59.500Z");
  CHECK(formats::format_iso8601_utc(1704067199.9996) == "2024-01-01T00:00:00Z");
  CHECK(parse_iso8601_utc(formats::format_iso8601_utc(1718900000.125)) == doctest::Approx(1718900000.125).epsilon(1e-15));
}

TEST_CASE("a day that does not exist is named as such, not as a format error") {
  // Month lengths of the Gregorian calendar (common practice): 2027 is not a leap year, 2028 is,
  // 2100 is not (divisible by 100, not by 400).
  CHECK(formats::impossible_date_reason("2027-02-30") == std::string("February 2027 has 28 days"));
  CHECK(formats::impossible_date_reason("2028-02-30") == std::string("February 2028 has 29 days"));
  CHECK(formats::impossible_date_reason("2100-02-29") == std::string("February 2100 has 28 days"));
  CHECK(formats::impossible_date_reason("2027-04-31T10:00Z") == std::string("April 2027 has 30 days"));
  CHECK(formats::impossible_date_reason("2027-01-32") == std::string("January 2027 has 31 days"));
  CHECK(!formats::impossible_date_reason("2027-13-01"));  // no month 13: a format error, as before
  CHECK(!formats::impossible_date_reason("2027-01-00"));
  CHECK(!formats::impossible_date_reason("2028-02-29"));
  CHECK(!formats::impossible_date_reason("27-02-30"));
  CHECK(!formats::impossible_date_reason("tomorrow"));
  CHECK(formats::date_expectation("2027-02-30", "a date") == "a day that exists (February 2027 has 28 days)");
  CHECK(formats::date_expectation("2027/02/28", "a date") == "a date");
  CHECK_THROWS_WITH_AS(parse_iso8601_utc("2027-02-30", "--from"),
                       doctest::Contains("field '--from' = '2027-02-30': expected a day that exists (February 2027 has "
                                         "28 days)"),
                       InputError);
}
