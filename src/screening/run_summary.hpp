#pragma once
// What the console summary of a run needs, drawn from the screens' results: the segments
// closest to failure, the counts, and the segments whose slip probability reaches a threshold.
#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/capacity.hpp"
#include "screening/what_if.hpp"
#include "screening/catalog_review.hpp"
#include "screening/conditioning_summary.hpp"
#include "screening/depth_summary.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::screening {

struct SegmentLine {
  std::string segment_id, fault_id;
  double dp_crit = 0, peak_dp = 0, final_dp = 0;  // Pa
  std::optional<std::string> first_crossing;     // ISO date
  geomech::CriticalStatus status = geomech::CriticalStatus::below_failure;
  std::string leading_well;   // largest share of Δp at the first crossing (else at the last output time)
  double leading_share = 0;
  bool leading_at_crossing = false;  // the share is taken at the first crossing
};

// One fault segment of the probabilistic screen that reaches a probability threshold.
struct FlaggedSegment {
  std::string segment_id, fault_id;
  double p_final = 0, ci_low = 0, ci_high = 0;  // P(slip by the last output time) and its interval
  double threshold = 0;                          // the highest threshold reached
  double p_already_critical = 0;                 // share of realizations critical before injection
  std::string first_date;                        // first tracking date (monthly grid) at which
                                                 // `threshold` is reached
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
  std::shared_ptr<const CapacityResult> capacity;     // when the scenario has [capacity]
  std::shared_ptr<const WhatIfResult> what_if;        // when the scenario has [[what_if]]
  std::optional<ConditioningSummary> conditioning;    // when the scenario has [observations]
  std::optional<DepthSummary> depth;                  // when [formation] model = "poroelastic_3d"
};

// The summary of the screens' results (folder and files are left to the caller).
// `probabilistic` may be null; `review` (may be empty) is moved into the summary.
RunSummary summarize_run(const scenario::ResolvedScenario& s, const PreparedRun& prepared,
                         const screen::ScreenResult& result, const ProbabilisticRun* probabilistic,
                         std::optional<CatalogReview> review);

}  // namespace slipscreen::screening
