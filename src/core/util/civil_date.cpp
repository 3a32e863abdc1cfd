#include "core/util/civil_date.hpp"

#include <cmath>
#include <cstdio>

namespace slipscreen::util {

bool is_leap_year(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

int days_in_month(int y, int m) {
  static constexpr int kDays[12] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  if (m < 1 || m > 12) return 0;
  return (m == 2 && is_leap_year(y)) ? 29 : kDays[m - 1];
}

// Hinnant, days_from_civil: eras of 400 years (146097 days), March-based year.
std::int64_t days_from_civil(const CivilDate& d) {
  const std::int64_t y = static_cast<std::int64_t>(d.year) - (d.month <= 2 ? 1 : 0);
  const std::int64_t era = (y >= 0 ? y : y - 399) / 400;
  const std::int64_t yoe = y - era * 400;                                   // [0, 399]
  const std::int64_t mp = (d.month + 9) % 12;                               // March = 0
  const std::int64_t doy = (153 * mp + 2) / 5 + d.day - 1;                  // [0, 365]
  const std::int64_t doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;           // [0, 146096]
  return era * 146097 + doe - 719468;
}

// Hinnant, civil_from_days.
CivilDate civil_from_days(std::int64_t z) {
  z += 719468;
  const std::int64_t era = (z >= 0 ? z : z - 146096) / 146097;
  const std::int64_t doe = z - era * 146097;
  const std::int64_t yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
  const std::int64_t doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
  const std::int64_t mp = (5 * doy + 2) / 153;
  const int day = static_cast<int>(doy - (153 * mp + 2) / 5 + 1);
  const int month = static_cast<int>(mp < 10 ? mp + 3 : mp - 9);
  const int year = static_cast<int>(yoe + era * 400 + (month <= 2 ? 1 : 0));
  return {year, month, day};
}

namespace {

std::optional<int> digits(std::string_view s) {
  if (s.empty()) return std::nullopt;
  int v = 0;
  for (char c : s) {
    if (c < '0' || c > '9') return std::nullopt;
    v = v * 10 + (c - '0');
  }
  return v;
}

}  // namespace

std::optional<CivilDate> parse_iso_month(std::string_view t) {
  if (t.size() != 7 || t[4] != '-') return std::nullopt;
  const auto y = digits(t.substr(0, 4));
  const auto m = digits(t.substr(5, 2));
  if (!y || !m || *y < 1 || *m < 1 || *m > 12) return std::nullopt;
  return CivilDate{*y, *m, 1};
}

std::optional<CivilDate> parse_iso_date(std::string_view t) {
  if (t.size() != 10 || t[7] != '-') return std::nullopt;
  auto ym = parse_iso_month(t.substr(0, 7));
  const auto d = digits(t.substr(8, 2));
  if (!ym || !d || *d < 1 || *d > days_in_month(ym->year, ym->month)) return std::nullopt;
  ym->day = *d;
  return ym;
}

std::string format_iso_date(const CivilDate& d) {
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", d.year, d.month, d.day);
  return buf;
}

std::string format_iso_month(const CivilDate& d) {
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-%02d", d.year, d.month);
  return buf;
}

CivilDate add_months(const CivilDate& d, int months) {
  const int index = d.year * 12 + (d.month - 1) + months;
  const int y = index >= 0 ? index / 12 : (index - 11) / 12;
  const int m = index - y * 12 + 1;
  const int last = days_in_month(y, m);
  return {y, m, d.day > last ? last : d.day};
}

CivilDate date_at(double seconds) {
  return civil_from_days(static_cast<std::int64_t>(std::floor(seconds / kSecondsPerDay)));
}

}  // namespace slipscreen::util
