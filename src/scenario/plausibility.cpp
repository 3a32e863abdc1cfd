#include "scenario/plausibility.hpp"

#include <charconv>
#include <cmath>

#include "formats/toml/toml_section.hpp"

namespace slipscreen::scenario::plausible {

bool plausible_date(const util::CivilDate& d) { return d >= kFirstDate && d <= kLastDate; }

bool looks_like_degrees(double x, double y) { return std::abs(x) <= 180.0 && std::abs(y) <= 90.0; }

std::string number_as_read(double v) {
  char buf[32];
  const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v);
  return ec == std::errc{} ? std::string(buf, end) : std::string("?");
}

void check(const formats::Section& s, std::string_view key, double si_value, const Range& range) {
  if (range.contains(si_value)) return;
  const auto f = s.find(key);
  s.fail(key, f ? formats::toml_value_text(*f->node) : number_as_read(si_value), range.expected);
}

}  // namespace slipscreen::scenario::plausible
