#pragma once
// What a conditioned run reports about its weights (docs/conditioning.md): the inputs the
// observations moved most and the console's summary.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/probabilistic/conditioning.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "screening/seismicity_likelihood.hpp"

namespace slipscreen::screening {

// One sampled input's prior and posterior percentiles as the tables and the console show them.
struct InputShift {
  std::string input;
  std::size_t index = 0;     // in the sampler order (ProbabilisticResult::input_names)
  double width_ratio = 1.0;  // (posterior P95 − P5) / (prior P95 − P5)
  double median_shift = 0.0; // (posterior P50 − prior P50) / (prior P95 − P5)
};
// The uncertain inputs, those the observations moved most first (largest of |median_shift| and
// |1 − width_ratio|; ties in sampler order).
std::vector<InputShift> input_shifts(const probabilistic::Conditioning& c, const std::vector<std::string>& names);

// What the console shows of a conditioned run (RunSummary::conditioning).
struct ConditionedSegment {
  std::string segment_id, fault_id;
  double p_prior = 0, p_conditioned = 0, ci_low = 0, ci_high = 0;  // P(slip by the last output time)
};
struct ConditioningSummary {
  std::size_t observations = 0;
  std::uint64_t realizations = 0;
  double n_eff = 0;
  std::string warning;                      // low_effective_sample_warning, or empty
  std::vector<InputShift> moved;            // at most kConsoleInputs, those moved most first
  std::vector<ConditionedSegment> segments; // at most kConsoleSegments, highest of the two P first
  std::optional<SeismicityUse> seismicity;  // [observations] seismicity = true: the events used
  std::uint64_t seismicity_beyond_domain = 0;  // realizations whose Dieterich rate left its domain (weight 0)
};
// The console's and the manifest's sentence on the earthquakes used: counts, Mc, period, distance.
std::string seismicity_sentence(const SeismicityUse& u);
inline constexpr std::size_t kConsoleInputs = 3, kConsoleSegments = 5;
ConditioningSummary conditioning_summary(const ProbabilisticRun& run, const PreparedRun& p);

}  // namespace slipscreen::screening
