#pragma once
// The screen's figures over time (docs/report.md):
//   slip_probability  P(slip by t) of the top segments with their Wilson intervals as bands and
//                     the scenario's thresholds as lines (segment_probability.csv); none without a
//                     probabilistic screen;
//   pressure_history_<rank>  Δp at each of the (up to three) segments closest to failure with each
//                     well's part stacked, and the segment's Δp_crit (segment_pressure_history.csv,
//                     segments.csv); none when the run has no such table.
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

std::vector<Figure> slip_probability_figures(const ReportSource& source);
std::vector<Figure> pressure_history_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
