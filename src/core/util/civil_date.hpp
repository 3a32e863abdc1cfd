#pragma once
// Civil (proleptic Gregorian) dates: days from 1970-01-01, ISO 8601 parse and format, calendar
// month arithmetic. Times inside slipscreen are seconds since 1970-01-01T00:00Z (UTC, no leap
// seconds), held in a double: whole days are exact far beyond any injection history.
//
// Source: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (days_from_civil,
// civil_from_days), the algorithms behind C++20 <chrono> sys_days.
// Valid domain: years 1 to 9999 (ISO 8601 four-digit years); exact in that range.
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace slipscreen::util {

struct CivilDate {
  int year = 1970;
  int month = 1;  // 1..12
  int day = 1;    // 1..days_in_month
  friend bool operator==(const CivilDate&, const CivilDate&) = default;
  friend auto operator<=>(const CivilDate&, const CivilDate&) = default;
};

bool is_leap_year(int year);
int days_in_month(int year, int month);

// Days since 1970-01-01 (negative before). Hinnant's days_from_civil.
std::int64_t days_from_civil(const CivilDate& d);
// Inverse of days_from_civil. Hinnant's civil_from_days.
CivilDate civil_from_days(std::int64_t days);

// Strict ISO 8601 calendar date "YYYY-MM-DD"; nothing if malformed or not a real day.
std::optional<CivilDate> parse_iso_date(std::string_view text);
// Strict ISO 8601 month "YYYY-MM" (day set to 1); nothing if malformed.
std::optional<CivilDate> parse_iso_month(std::string_view text);

std::string format_iso_date(const CivilDate& d);   // "2027-03-01"
std::string format_iso_month(const CivilDate& d);  // "2027-03"

// The same day `months` calendar months later (negative: earlier), clamped to the month's end
// (2027-01-31 + 1 month = 2027-02-28), as common calendar practice.
CivilDate add_months(const CivilDate& d, int months);

inline constexpr double kSecondsPerDay = 86400.0;
// Seconds since 1970-01-01T00:00Z at the start of the day.
inline double to_seconds(const CivilDate& d) { return static_cast<double>(days_from_civil(d)) * kSecondsPerDay; }
// The civil date containing a time (seconds since 1970-01-01), rounding down to the day.
CivilDate date_at(double seconds);

}  // namespace slipscreen::util
