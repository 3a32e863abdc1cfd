#pragma once
// Numbers as text: the one family of number-to-text helpers of the project.
#include <string>

namespace slipscreen::util {

// As in an error message or a note: at most `precision` significant digits, printf's %g form
// ("0.1", "-1e-09", "nan", "inf").
std::string number_text(double v, int precision = 10);

// As in the tables a run writes: fixed decimals with the same bytes for the same double on every
// run (std::to_chars), "" for NaN, "inf"/"-inf" for infinities, "-0.000" written as "0.000".
std::string fixed_decimals(double v, int decimals);
// The same, appended to `out` (for large tables).
void append_fixed(std::string& out, double v, int decimals);

}  // namespace slipscreen::util
