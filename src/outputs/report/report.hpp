#pragma once
// The run report (docs/report.md): report.html (one self-contained file: inline SVG figures and
// CSS with a print stylesheet, no script, no font or address from outside), report.pdf (vector,
// A4 or Letter, text set with Pango) and figures/ (every figure as SVG, PNG and the CSV of its
// numbers), built from a finished run folder's files only: it computes nothing the run did not
// write, so every number in it can be found in a table or the manifest of the run.
//
// Figures come from builders, one function per family returning its figures from the run folder;
// adding a family is one line in report_figure_builders().
#include <cstddef>
#include <filesystem>
#include <functional>
#include <string>
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

using FigureBuilder = std::function<std::vector<Figure>(const ReportSource&)>;

// Every figure family of the report, in the report's order.
const std::vector<FigureBuilder>& report_figure_builders();

struct ReportOptions {
  std::string page = "A4";   // "A4" or "Letter"
  // The time the report is built ("" for a reproducible report: then nothing in it depends on
  // when or where it is built, and a rebuild gives the same bytes).
  std::string built_utc;
};

// Reads the run folder (its manifest already loaded into `source`) and writes report.html,
// report.pdf and figures/<name>.{svg,png,csv} into `into` (which must exist; it may be the run
// folder itself or a staging folder). Returns the files written, relative to `into`, sorted.
// Throws InputError naming a run table that is missing or malformed, IoError on a failed write.
std::vector<std::string> write_report(const ReportSource& source, const ReportOptions& options,
                                      const std::vector<FigureBuilder>& builders,
                                      const std::filesystem::path& into);

// The page size in points of "A4" (210 × 297 mm) or "Letter" (8.5 × 11 in).
std::pair<double, double> page_size(const std::string& page);

}  // namespace slipscreen::outputs::report
