#pragma once
// The value of a scenario quantity that was not given (checked before use: docs/scenario.md).
#include <limits>

namespace slipscreen::scenario {

inline constexpr double kUnset = std::numeric_limits<double>::quiet_NaN();

}  // namespace slipscreen::scenario
