#include "core/util/number_text.hpp"

#include <charconv>
#include <cmath>
#include <sstream>
#include <string_view>

namespace slipscreen::util {

std::string number_text(double v, int precision) {
  std::ostringstream s;
  s.precision(precision);
  s << v;
  return s.str();
}

void append_fixed(std::string& out, double v, int decimals) {
  if (std::isnan(v)) return;
  if (std::isinf(v)) {
    out += v > 0 ? "inf" : "-inf";
    return;
  }
  char buf[352];  // enough for any finite double in fixed notation with a few decimals
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed, decimals);
  const std::string_view s(buf, static_cast<std::size_t>(r.ptr - buf));
  // "-0.000" is "0.000"
  out += s[0] == '-' && s.find_first_not_of("-0.") == std::string_view::npos ? s.substr(1) : s;
}

std::string fixed_decimals(double v, int decimals) {
  std::string s;
  append_fixed(s, v, decimals);
  return s;
}

}  // namespace slipscreen::util
