#pragma once
// Numbers as text in the tables a run writes: fixed decimals with the same bytes for the same
// double on every run (std::to_chars), "" for NaN, "inf"/"-inf" for infinities, and "-0.000"
// written as "0.000".
#include <string>

namespace slipscreen::formats {

std::string fixed_decimals(double v, int decimals);
// The same, appended to `out` (for large tables).
void append_fixed(std::string& out, double v, int decimals);

}  // namespace slipscreen::formats
