#include "scenario/plausibility.hpp"

#include <charconv>
#include <cmath>

#include "formats/toml/toml_section.hpp"

namespace slipscreen::scenario::plausible {

bool plausible_date(const util::CivilDate& d) { return d >= kFirstDate && d <= kLastDate; }

bool looks_like_degrees(double x, double y) { return std::abs(x) <= 180.0 && std::abs(y) <= 90.0; }

std::string number_as_read(double v) {
  if (!std::isfinite(v)) return std::isnan(v) ? "nan" : (v > 0 ? "inf" : "-inf");
  char buf[400];
  const double a = std::abs(v);
  const auto format = (a == 0.0 || (a >= 1e-4 && a < 1e16)) ? std::chars_format::fixed : std::chars_format::scientific;
  const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v, format);
  return ec == std::errc{} ? std::string(buf, end) : std::string("?");
}

std::string written(const formats::Section& s, std::string_view key) {
  const auto f = s.find(key);
  if (!f) return "(missing)";
  if (const auto* d = f->node->as_floating_point()) {
    const double v = d->get();
    // A TOML float is written with a point: 235.0 stays "235.0", -35.1 is not -35.100000000000001.
    const bool whole = std::isfinite(v) && v == std::floor(v) && std::abs(v) < 1e16;
    return number_as_read(v) + (whole ? ".0" : "");
  }
  return formats::toml_value_text(*f->node);
}

void check(const formats::Section& s, std::string_view key, double si_value, const Range& range) {
  if (range.contains(si_value)) return;
  s.fail(key, s.has(key) ? written(s, key) : number_as_read(si_value), range.expected);
}

}  // namespace slipscreen::scenario::plausible
