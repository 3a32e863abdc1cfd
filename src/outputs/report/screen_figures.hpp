#pragma once
// The screen's figures over time (docs/report.md):
//   slip_probability  P(slip by t) of the top segments with their Wilson intervals as bands and
//                     the scenario's thresholds as lines (segment_probability.csv); none without a
//                     probabilistic screen;
//   pressure_history_<rank>  Δp at each of the (up to three) segments closest to failure with each
//                     well's part stacked, and the segment's Δp_crit (segment_pressure_history.csv,
//                     segments.csv); none when the run has no such table.
#include <string>
#include <vector>

#include "formats/drawing/canvas.hpp"
#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

// One segment's P(slip by t): dates (days since 1970), estimates and the Wilson interval's ends.
struct ProbabilityCurve {
  std::vector<double> x, p, lo, hi;
};

// The page of a P(slip by t) figure: one line with dots and a shaded interval band per segment
// (ids[i] in the legend), the thresholds `levels` dashed, dates x0..x1, P from 0 to ymax; `source`
// names the table under the title. Shared by slip_probability and depth_slip_probability.
void draw_probability_curves(formats::Canvas& c, const std::string& title, const std::string& source,
                             const std::vector<std::string>& ids, const std::vector<ProbabilityCurve>& series,
                             const std::vector<double>& levels, double x0, double x1, double ymax);

std::vector<Figure> slip_probability_figures(const ReportSource& source);
std::vector<Figure> pressure_history_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
