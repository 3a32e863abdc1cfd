#pragma once
// Running a scenario end to end: prepare the inputs (run_inputs.hpp), compute the deterministic
// screen (core/screen), write every output into one run folder that appears all at once
// (run_folder.hpp), and return what the console summary needs.
//
// Run folder contents (names configurable under [output.files]; docs/outputs.md):
//   segment_times.csv     one row per fault segment and output time (tidy)
//   well_shares.csv       one row per segment, output time and well: each well's share of Δp
//   segments.csv          one row per fault segment: stress, Δp_crit, peak Δp, first crossing
//   pressure_change.tif   Δp (MPa), one Float32 band per output time, band descriptions = dates
//   screen.gpkg           layers fault_segments and wells
//   manifest.json         version, command line, resolved parameters, SHA-256 of every input
#include "core/caution.hpp"
#include <filesystem>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "io/scenario.hpp"

namespace slipscreen::io {

struct CatalogReview;  // catalog_review.hpp

// The screening caution repeated in every output and console summary.
using slipscreen::kScreeningCaution;  // core/caution.hpp

// The statement of the time grid searched for first crossings.
inline constexpr const char* kTrackingGridStatement =
    "first crossings are searched on the first day of every month, every rate-change time and "
    "every output time, from the first injection to the last output time; a crossing happened "
    "in the interval ending at the reported date (at most one month)";

struct RunOptions {
  std::filesystem::path out;   // run folder; empty: the scenario's output.folder (from the working directory)
  bool force = false;          // replace an existing run folder
  bool allow_network = false;  // GDAL network paths in the scenario
  bool reproducible = false;   // no creation time in the manifest, fixed GeoPackage timestamp
  std::vector<std::string> command_line;
  // Progress: a stage name and the fraction of the pressure computation done.
  std::function<void(const std::string& stage, double fraction)> progress;
};

struct SegmentLine {
  std::string segment_id, fault_id;
  double dp_crit = 0, peak_dp = 0, final_dp = 0;  // Pa
  std::optional<std::string> first_crossing;     // ISO date
  geomech::CriticalStatus status = geomech::CriticalStatus::below_failure;
  std::string leading_well;                       // largest share at the last output time
  double leading_share = 0;
};

// One fault segment of the probabilistic screen that reaches a probability threshold.
struct FlaggedSegment {
  std::string segment_id, fault_id;
  double p_final = 0, ci_low = 0, ci_high = 0;  // P(slip by the last output time) and its interval
  double threshold = 0;                          // the highest threshold reached
  std::string first_date;                        // first output date at which it is reached
};

struct ProbabilisticSummary {
  std::uint64_t realizations = 0, rejected = 0, beyond_frictional_limit = 0;
  std::string sampler;
  double confidence = 0.95;
  std::vector<double> thresholds;
  double mc_half_width_max = 0;          // largest half-width of the intervals (Monte Carlo error)
  double surrogate_error = 0;
  std::size_t already_critical_segments = 0;  // segments with any realization critical before injection
  std::vector<FlaggedSegment> flagged;    // sorted by final probability, highest first
};

struct RunSummary {
  std::filesystem::path folder;
  std::vector<std::string> files;  // relative to the folder, sorted
  std::size_t fault_count = 0, segment_count = 0, well_count = 0;
  std::size_t crossing_count = 0, already_critical_count = 0;
  std::vector<SegmentLine> closest;  // segments sorted by Δp_crit − peak Δp (closest first)
  bool radius_clamped = false;
  std::string last_date;
  std::optional<ProbabilisticSummary> probabilistic;  // when the scenario has [uncertainty]
  std::shared_ptr<const CatalogReview> catalog;       // when the scenario has [catalog]
};

// Throws the typed errors of the inputs; nothing is left behind when it throws.
RunSummary run_scenario(const ResolvedScenario& s, const RunOptions& o);

// The run folder a scenario writes to with these options (RefusedError when none is given).
std::filesystem::path run_folder_of(const ResolvedScenario& s, const RunOptions& o);

}  // namespace slipscreen::io
