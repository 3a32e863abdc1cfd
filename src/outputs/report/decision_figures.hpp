#pragma once
// The figure of the allowable-rate answer (docs/report.md, "Allowable rate"):
//   capacity_curve  P(slip by T | f) against the factor f on the group's planned rates, the
//                   largest over the segments and the segments that bind an answer
//                   (capacity_curve.csv), the thresholds as lines, each threshold's allowed f
//                   marked on it and f = 1 (the plan); none when the run has no [capacity].
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

std::vector<Figure> capacity_curve_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
