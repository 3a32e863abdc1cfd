#include "formats/table/iso_time.hpp"

#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::formats {
namespace {

struct Cursor {
  std::string_view s;
  std::size_t i = 0;
  bool done() const { return i >= s.size(); }
  char peek() const { return done() ? '\0' : s[i]; }
  bool digits(int n, int& out) {
    out = 0;
    for (int k = 0; k < n; ++k) {
      if (done() || s[i] < '0' || s[i] > '9') return false;
      out = out * 10 + (s[i++] - '0');
    }
    return true;
  }
  bool expect(char c) {
    if (peek() != c) return false;
    ++i;
    return true;
  }
};

constexpr const char* kMonthNames[] = {"January", "February", "March",     "April",   "May",      "June",
                                       "July",    "August",   "September", "October", "November", "December"};

}  // namespace

std::optional<std::string> impossible_date_reason(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  Cursor c{text};
  int y = 0, mo = 0, d = 0;
  if (!c.digits(4, y) || !c.expect('-') || !c.digits(2, mo) || !c.expect('-') || !c.digits(2, d)) return std::nullopt;
  if (mo < 1 || mo > 12 || d < 1) return std::nullopt;  // not a calendar date at all: a format error
  const std::chrono::year_month_day_last last{std::chrono::year{y} / std::chrono::month{static_cast<unsigned>(mo)} /
                                              std::chrono::last};
  const auto days = static_cast<int>(static_cast<unsigned>(last.day()));
  if (d <= days) return std::nullopt;
  return std::string(kMonthNames[mo - 1]) + " " + std::to_string(y) + " has " + std::to_string(days) + " days";
}

std::string date_expectation(std::string_view text, const std::string& format_expected) {
  if (const auto reason = impossible_date_reason(text)) return "a day that exists (" + *reason + ")";
  return format_expected;
}

double parse_iso8601_utc(std::string_view text, std::string_view field) {
  const auto fail = [&]() -> InputError {
    return InputError(std::string(field), std::string(text),
                      date_expectation(text, "an ISO 8601 UTC time such as '2024-03-05T14:22:31.5Z' or '2024-03-05'"));
  };
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t' || text.back() == '\r')) text.remove_suffix(1);
  Cursor c{text};
  int y = 0, mo = 0, d = 0, h = 0, mi = 0, sec = 0;
  double frac = 0.0;
  if (!c.digits(4, y) || !c.expect('-') || !c.digits(2, mo) || !c.expect('-') || !c.digits(2, d)) throw fail();
  const std::chrono::year_month_day ymd{std::chrono::year{y}, std::chrono::month{static_cast<unsigned>(mo)},
                                        std::chrono::day{static_cast<unsigned>(d)}};
  if (!ymd.ok()) throw fail();
  int offset_minutes = 0;
  if (!c.done()) {
    if (!(c.expect('T') || c.expect(' '))) throw fail();
    if (!c.digits(2, h) || !c.expect(':') || !c.digits(2, mi)) throw fail();
    if (c.expect(':')) {
      if (!c.digits(2, sec)) throw fail();
      if (c.expect('.') || c.expect(',')) {
        double scale = 0.1;
        int n = 0;
        while (!c.done() && c.peek() >= '0' && c.peek() <= '9') {
          frac += scale * (c.s[c.i++] - '0');
          scale /= 10.0;
          ++n;
        }
        if (n == 0) throw fail();
      }
    }
    if (h > 23 || mi > 59 || sec > 59) throw fail();
    if (c.expect('Z') || c.expect('z')) {
    } else if (c.peek() == '+' || c.peek() == '-') {
      const int sign = c.s[c.i++] == '-' ? -1 : 1;
      int oh = 0, om = 0;
      if (!c.digits(2, oh)) throw fail();
      if (c.expect(':')) {
        if (!c.digits(2, om)) throw fail();
      } else if (!c.done()) {
        if (!c.digits(2, om)) throw fail();
      }
      if (oh > 14 || om > 59) throw fail();
      offset_minutes = sign * (oh * 60 + om);
    }
    if (!c.done()) throw fail();
  }
  const auto days = std::chrono::sys_days(ymd).time_since_epoch().count();
  return static_cast<double>(days) * 86400.0 + h * 3600.0 + mi * 60.0 + sec + frac - offset_minutes * 60.0;
}

std::string format_iso8601_utc(double seconds) {
  const auto ms_total = static_cast<long long>(std::llround(seconds * 1000.0));
  long long days = ms_total / 86400000LL;
  long long ms = ms_total % 86400000LL;
  if (ms < 0) {
    ms += 86400000LL;
    --days;
  }
  const std::chrono::year_month_day ymd{std::chrono::sys_days{std::chrono::days{days}}};
  const int h = static_cast<int>(ms / 3600000), mi = static_cast<int>(ms / 60000 % 60),
            s = static_cast<int>(ms / 1000 % 60), milli = static_cast<int>(ms % 1000);
  char buf[48];
  if (milli == 0)
    std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02dZ", static_cast<int>(ymd.year()),
                  static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()), h, mi, s);
  else
    std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02d.%03dZ", static_cast<int>(ymd.year()),
                  static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()), h, mi, s, milli);
  return buf;
}

}  // namespace slipscreen::formats
