#pragma once
// What the report's text and figures share about a run folder (docs/report.md): the names of its
// files (from the manifest's resolved [output.files]), which segments count as the top ones, the
// thresholds and the last output date.
#include <cstddef>
#include <string>
#include <vector>

#include "outputs/report/figure.hpp"
#include "outputs/report/figure_support.hpp"

namespace slipscreen::outputs::report {

std::string segments_file(const ReportSource& s);       // segments.csv
std::string segment_times_file(const ReportSource& s);  // segment_times.csv
std::string pressure_raster_file(const ReportSource& s);  // pressure_change.tif ("" when no rasters)
std::string geopackage_file(const ReportSource& s);       // screen.gpkg ("" when none)
std::string pressure_history_file(const ReportSource& s);  // segment_pressure_history.csv (beside segment_times)

// The unit the run writes pressures in (the manifest's [output] units): psi for an oilfield run,
// else MPa. For figures drawn from the Δp raster, which holds MPa in either system.
DisplayUnit pressure_unit(const ReportSource& s);

// The allowable-rate and what-if tables (docs/outputs.md): capacity_curve.csv, what_if.csv.
std::string capacity_curve_file(const ReportSource& s);
std::string what_if_file(const ReportSource& s);
// The manifest's `capacity` block (parameters.capacity), or null when the run has no [capacity].
const nlohmann::json* capacity_block(const ReportSource& s);
// Whether the run has a probabilistic screen (segment_probability*.csv).
bool has_probabilistic(const ReportSource& s);
// The scenario's P(slip) thresholds (empty without a probabilistic screen).
std::vector<double> thresholds(const ReportSource& s);

struct TopSegments {
  std::vector<std::string> ids;  // in order, most critical first
  bool probabilistic = false;    // ranked by P(slip) at the last output time, else by the margin
};
// The `n` top segments: by p_slip_final (segment_probability_summary.csv, highest first) with a
// probabilistic screen, else by margin_* of segments.csv (smallest first); ties keep the table's order.
TopSegments top_segments(const ReportSource& s, std::size_t n);

}  // namespace slipscreen::outputs::report
