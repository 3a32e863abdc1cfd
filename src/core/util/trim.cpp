#include "core/util/trim.hpp"

namespace slipscreen::util {

std::string trim(std::string_view s) {
  constexpr std::string_view kSpace = " \t\r\n";
  const auto first = s.find_first_not_of(kSpace);
  if (first == std::string_view::npos) return {};
  return std::string(s.substr(first, s.find_last_not_of(kSpace) - first + 1));
}

}  // namespace slipscreen::util
