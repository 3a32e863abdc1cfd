#pragma once
// Text without its leading and trailing ASCII white space (space, tab, carriage return, line
// feed): the one trim of the project, for cells, keys, units and option values.
#include <string>
#include <string_view>

namespace slipscreen::util {

std::string trim(std::string_view s);

}  // namespace slipscreen::util
