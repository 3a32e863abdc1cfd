#pragma once
// What-if rate changes (issue 13; docs/decisions.md "What-if"): each [[what_if]] entry multiplies
// the rates of some wells by a factor from a date on. Every variant is computed in the
// probabilistic screen itself, on its realizations (common random numbers), by superposition:
// Δp = Δp_rest + factor·Δp_V with V the entry's wells after the date
// (ProbabilisticResult::what_if; core/probabilistic/group_factors.hpp).
#include <cstdint>
#include <string>
#include <vector>

#include "core/probabilistic/screen_inputs.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "screening/what_if_split.hpp"

namespace slipscreen::screening {

struct ProbabilisticRun;

// The variants' P(slip by each output time) beside the base's, per segment.
struct WhatIfResult {
  std::vector<std::string> names;               // per variant
  std::vector<std::vector<std::string>> wells;  // per variant: the wells changed
  std::vector<double> factors, from;            // per variant: factor, date (s)
  std::uint64_t realizations = 0;
  std::vector<std::string> segment_ids, fault_ids;
  std::vector<std::vector<std::uint64_t>> base;                  // [segment][output time]
  std::vector<std::vector<std::vector<std::uint64_t>>> variant;  // [variant][segment][output time]
};

WhatIfResult what_if_result(const scenario::ResolvedScenario& s, const PreparedRun& p, ProbabilisticRun& prob);

}  // namespace slipscreen::screening
