#pragma once
// A number as it appears in an error message: shortest round-trip form up to `precision`
// significant digits ("0.1", "-1e-09", "nan", "inf").
#include <string>

namespace slipscreen::util {

std::string number_text(double v, int precision = 10);

}  // namespace slipscreen::util
