#pragma once
// Writing the deterministic screen's outputs into a run folder (see run.hpp for the list).
#include "core/screen/deterministic_screen.hpp"
#include "io/run.hpp"
#include "io/run_folder.hpp"
#include "io/run_inputs.hpp"

namespace slipscreen::io {

struct ProbabilisticRun;
struct CatalogReview;
// `probabilistic` (may be null) adds the probabilistic tables, rasters, GeoPackage columns and
// manifest block; `review` (may be null) the catalog review's tables and the earthquakes layer.
void write_run_outputs(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& prepared,
                       const screen::ScreenResult& result, const RunOptions& options,
                       const ProbabilisticRun* probabilistic = nullptr, const CatalogReview* review = nullptr);

// Number formatting of the tables: fixed decimals, "" for NaN, "inf" for +infinity; the same
// bytes for the same double on every run.
std::string fixed_decimals(double v, int decimals);
// The same, appended to `out` (for large tables).
void append_fixed(std::string& out, double v, int decimals);

// A CSV field, quoted (RFC 4180) when it holds a comma, quote or line break.
std::string csv_field(const std::string& s);

}  // namespace slipscreen::io
