#pragma once
// The figures of the faults screened in depth (docs/report.md, "Faults in depth"; the 3-D
// poroelastic model of docs/physics.md), drawn from a finished run folder's tables only:
//
//   depth_coulomb_margin     the Coulomb margin μΔp_crit − ΔCFF of the top segments against the
//                            output dates, at each date's check point closest to failure
//                            (fault_depth.csv); zero is failure
//   depth_slip_probability   P(slip by t) of the top segments with their Wilson intervals
//                            (fault_depth_probability.csv), when the run had [uncertainty]
//
// and the figure of docs/physics.md, "The three models on one case":
//
//   model_comparison         Δp and ΔCFF against time (log axes) for Theis, leaky and the 3-D
//                            model at the fault 5 km away and 1 km below the injected layer
//                            (docs/physics/model_comparison.csv)
//
// The top segments in depth: with [uncertainty] the highest P(slip) at the last output date
// (ties: the table's order), else the smallest Coulomb margin over the output dates.
#include <cstddef>
#include <string>
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

class RunTable;

// fault_depth.csv and fault_depth_probability.csv, beside segment_times.csv.
std::string depth_table_file(const ReportSource& s);
std::string depth_probability_file(const ReportSource& s);

struct DepthTopSegment {
  std::string segment_id, fault_id;
  std::size_t closest_row = 0;      // fault_depth.csv: the row of the smallest Coulomb margin
  std::size_t probability_row = 0;  // fault_depth_probability.csv: the last date's row (with it)
};

struct DepthTop {
  bool probabilistic = false;  // ranked by P(slip) at the last date, else by the margin
  std::vector<DepthTopSegment> segments;
};

// The `n` top segments in depth (none when the run did not screen faults in depth). InputError
// naming the table and line when a table is malformed.
DepthTop depth_top_segments(const ReportSource& s, std::size_t n);

// The report's table of the top segments in depth (docs/report.md, "Faults in depth"): segment,
// fault, with [uncertainty] P(slip by the last date) and its interval, the first crossing's date,
// depth and ΔCFF, the closest margin; every cell the run tables' own text, the units
// those of their columns. Empty rows when the run did not screen faults in depth.
struct DepthTable {
  bool probabilistic = false;
  std::string last_date;        // of fault_depth_probability.csv ("" without it)
  std::string realizations;     // as that table holds it
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};
DepthTable depth_table(const ReportSource& s, std::size_t n);

// The two figures above that the run's tables allow.
std::vector<Figure> depth_figures(const ReportSource& s);

// docs/physics.md's comparison figure from the table written by
// tests/core/poro/model_comparison_test.cpp (columns time_days, dp_theis, dp_leaky, dp_3d,
// dcff_theis, dcff_leaky, dcff_3d in MPa); its data are the table's columns as written.
Figure model_comparison_figure(const RunTable& t);

}  // namespace slipscreen::outputs::report
