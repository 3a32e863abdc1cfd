#pragma once
// Relative difference |a − b| / |b| for the stats suites' explicit tolerances.
#include <cmath>

namespace slipscreen::stats::test {
inline double relative_error(double a, double b) { return std::abs(a - b) / std::abs(b); }
}  // namespace slipscreen::stats::test
