#pragma once
// The allowable rate of a group of wells (issue 13, docs/decisions.md "Allowable rate"): the
// largest factor f on the group's planned rates for which every fault segment's P(slip by T | f)
// stays at or below each threshold (upper end of its Wilson interval, the point estimate
// beside it), the segment that binds it, the schedule it means, and the deterministic answer
// (every segment's best-estimate margin Δp_crit − Δp ≥ [capacity] margin). T is the last output
// time. Computed from the probabilistic screen's own realizations (ProbabilisticResult::
// capacity, core/probabilistic/group_factors.hpp), exactly, by the linearity of Δp in the rates.
#include <optional>
#include <string>
#include <vector>

#include "core/probabilistic/allowable_factor.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/capacity_split.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

struct ProbabilisticRun;

// The factor answered for one bound: `limit` is the exact factor at which the binding segment's
// P first exceeds the threshold (+∞: none up to up_to); `allowed` is `limit` rounded down to 3
// significant digits and strictly below it (the number a user can put in a schedule).
struct FactorAnswer {
  double limit = 0.0, allowed = 0.0;
  bool beyond = false;                  // no segment exceeds up to [capacity] up_to
  std::optional<std::size_t> binding;   // segment index
};

struct CapacityThreshold {
  double threshold = 0.0;
  FactorAnswer wilson;                  // the upper end of the 95 % (confidence) Wilson interval
  FactorAnswer point;                   // the point estimate
  std::vector<std::size_t> reached_without;  // segments over the threshold (Wilson upper) at f = 0
};

// A planned period of a group well, the part the factor scales.
struct ScaledPeriod {
  double start = 0.0, end = 0.0;  // s
  double rate = 0.0;              // m³/s at f = 1
};

struct GroupWellPlan {
  std::string id;
  std::vector<ScaledPeriod> periods;
};

struct CapacityResult {
  std::vector<std::string> wells;            // the group
  std::optional<double> from;                // s
  double horizon = 0.0;                      // T, s (the last output time)
  double up_to = 10.0;
  double confidence = 0.95;
  std::vector<probabilistic::SlipFactorCurve> curves;  // per segment
  std::vector<std::string> segment_ids, fault_ids;     // per segment
  std::vector<CapacityThreshold> thresholds;
  std::vector<GroupWellPlan> plan;
  // Deterministic answer: the largest f keeping every segment's margin ≥ margin.
  double margin = 0.0;                       // Pa
  FactorAnswer deterministic;
  std::vector<std::size_t> deterministic_reached_without;
};

// The answers, from a probabilistic run made with capacity_split and the deterministic screen.
CapacityResult capacity_answer(const scenario::ResolvedScenario& s, const PreparedRun& p,
                               const screen::ScreenResult& det, ProbabilisticRun& prob);

// `limit` rounded down to 3 significant digits, strictly below it (0 for 0, +∞ for +∞).
double allowed_below(double limit);

}  // namespace slipscreen::screening
