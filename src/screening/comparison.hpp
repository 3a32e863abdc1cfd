#pragma once
// `slipscreen compare OLD_RUN NEW_RUN` (docs/compare.md): what changed between two finished runs of
// one region, computed from what the two run folders hold (read back by outputs/comparison_read),
// with nothing run again. All quantities SI; times in s since 1970 (UTC).
//
// - inputs: the manifests' input files matched by role (the n-th file of a role against the n-th),
//   changed when the SHA-256 differs; parameters: the resolved scenario's values, compared leaf by
//   leaf (the wells apart, below);
// - wells: added, removed, status changed; each well's volume between the two histories' ends (a
//   run's history end is the latest end of a reported, not assumed, injection period of a
//   non-proposed well): what the later run reports for that interval, what the earlier run had
//   assumed or planned for it, and how much the later run revises the volume reported before the
//   earlier end;
// - segments: P(slip by date) at every output date the two runs share, the change and the pooled
//   two-proportion z test at 95 % (core/stats/two_proportion.hpp); per threshold, the segments
//   flagged (P ≥ threshold) in one run and not the other at the last common date;
// - catalog: events of the later review after the earlier review's last event; Mc, b and Σ of
//   both reviews and their change ("not reviewed" when a run had no catalog review).
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/stats/two_proportion.hpp"
#include "core/stats/wilson_interval.hpp"

namespace slipscreen::screening {

// ---- what one run folder holds, as the comparison needs it ----

struct RunInputFile {
  std::string role, path, sha256;
};

struct RunWellPeriod {
  double start = 0, end = 0;  // s since 1970
  double rate = 0;            // m³/s
  bool assumed = false;       // an assumed continuation, not reported
};

struct RunWell {
  std::string id;
  std::string status;  // "active", "shut-in", "proposed", ...
  bool proposed = false;
  std::vector<RunWellPeriod> periods;
};

struct RunSegmentProbability {
  std::string segment_id, fault_id;
  std::string date;           // ISO date, an output time
  double p_slip = 0;          // P(slip by date), injection-induced
  double dp_p50 = 0;          // Pa, median Δp at that date over the realizations
};

struct RunCatalogEvent {
  std::string id;
  std::string time;  // ISO 8601 as written
  double time_s = 0;
  double magnitude = 0;
};

struct RunCatalogReview {
  std::optional<std::string> last_time;  // the review's last kept event (ISO 8601)
  std::optional<double> last_time_s;
  std::optional<double> mc, b, sigma;    // completeness magnitude, b-value, seismogenic index Σ
  std::vector<RunCatalogEvent> events;   // the kept events
};

struct RunRecord {
  std::string folder;                     // as given on the command line
  std::string region, crs;                // region name and working CRS
  std::vector<RunInputFile> inputs;
  std::vector<std::pair<std::string, std::string>> parameters;  // "key.path" -> value (JSON text), sorted
  std::vector<RunWell> wells;
  std::uint64_t realizations = 0;         // valid realizations of the probabilistic screen
  std::vector<double> thresholds;         // the run's P(slip) thresholds
  std::vector<RunSegmentProbability> probabilities;  // segment × output time, in the run's order
  std::optional<RunCatalogReview> catalog;           // nothing: no catalog review
};

// ---- what changed ----

enum class Change { unchanged, changed, added, removed };
const char* change_name(Change c);  // "unchanged", "changed", "added", "removed"

struct InputChange {
  std::string role;
  std::optional<RunInputFile> old_file, new_file;
  Change change = Change::unchanged;
};

struct ParameterChange {
  std::string key;
  std::optional<std::string> old_value, new_value;  // nothing: absent in that run
};

struct WellChange {
  std::string id;
  Change change = Change::unchanged;  // `changed`: the status (or proposed flag) differs
  std::optional<std::string> old_status, new_status;
  double volume_reported_new = 0;     // m³ the later run reports between the two history ends
  double volume_expected_old = 0;     // m³ the earlier run assumed or planned for that interval
  double volume_revised = 0;          // m³: later minus earlier reported volume before the earlier end
};

struct SegmentChange {
  std::string segment_id, fault_id, date;
  double p_old = 0, p_new = 0;
  stats::TwoProportionTest test;
  double dp_p50_old = 0, dp_p50_new = 0;  // Pa
  std::vector<double> newly_flagged, cleared;  // thresholds crossed at this date, one way or the other
};

struct ThresholdChange {
  double threshold = 0;
  std::vector<std::string> newly_flagged, cleared;  // segment ids at the last common date
};

struct CatalogChange {
  bool old_reviewed = false, new_reviewed = false;
  std::optional<std::string> old_last_time, new_last_time;  // each review's last kept event
  std::vector<RunCatalogEvent> new_events;  // later events after the earlier last event
  std::optional<double> mc_old, mc_new, b_old, b_new, sigma_old, sigma_new;
};

struct Comparison {
  std::optional<double> history_end_old, history_end_new;  // s since 1970
  std::vector<InputChange> inputs;
  std::vector<ParameterChange> parameters;
  std::vector<WellChange> wells;                 // sorted by id
  std::uint64_t realizations_old = 0, realizations_new = 0;
  double z_crit = stats::kZ95;
  std::vector<std::string> common_dates;
  std::vector<std::string> segments_only_old, segments_only_new;
  std::vector<SegmentChange> segments;           // common segment × common date, the later run's order
  std::vector<double> thresholds;                // union of both runs', ascending
  std::optional<std::string> flag_date;          // the last common date
  std::vector<ThresholdChange> flags;            // one per threshold
  CatalogChange catalog;

  // Segments whose change exceeds the noise at some common date, in the later run's order.
  std::vector<std::string> moved_segments() const;
  // Whether anything at all differs (inputs, parameters, wells, probabilities, flags, catalog).
  bool any_change() const;
};

// The parameters that differ when the runs may not be compared: region name or working CRS.
// Nothing when they match; otherwise "region 'A' (OLD) against 'B' (NEW)".
std::optional<std::string> incomparable(const RunRecord& old_run, const RunRecord& new_run);

// The comparison. Throws InputError when the runs are incomparable (as above) or share no output date.
Comparison compare_runs(const RunRecord& old_run, const RunRecord& new_run, double z_crit = stats::kZ95);

}  // namespace slipscreen::screening
