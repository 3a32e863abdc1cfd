#pragma once
// Probabilistic screen: the probability that each fault segment has slipped by each output
// time, from Monte Carlo (or Latin hypercube) realizations of stress, friction, fault
// orientation, hydrogeology and injection rates.
//
// Method (docs/uncertainty.md): realization i draws its inputs from its own stream (seed, i)
// (stats::Sampler); the hydrogeology enters the pore pressure only through D = k/(μ φ c_t) and
// P = μ/(4π k h) (Theis 1935), so the pressure model is prepared once (similarity tables and a
// surrogate in D, pressure_surrogate.hpp) and every realization costs a few small matrix
// products. A segment has slipped by t when max_{t' ≤ t} Δp(t') ≥ Δp_crit (Coulomb criterion,
// geomech::critical_pressure_grid), tracked on the caller's tracking grid.
// P(slip by t) = slipped / N with its 95% Wilson (1927) score interval (stats::wilson_interval).
// Realizations whose fault is critical before any injection (Δp_crit ≤ 0) are counted apart
// and never folded into the injection-induced probability.
//
// Every accumulator is mergeable (slip counts, quantile sketches), so realizations or segments
// can be split across processes and merged to the single-process result. The well attribution
// of the median Δp (MedianAttribution) is the exception: it merges across segment splits only.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/probabilistic/realization_split.hpp"
#include "core/probabilistic/allowable_factor.hpp"
#include "core/probabilistic/conditioning.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/stats/quantile_sketch.hpp"
#include "core/stats/sampler.hpp"
#include "core/stats/slip_counts.hpp"

namespace slipscreen::probabilistic {

// One audited (realization, segment) pair: the realization's pressure inputs, the segment's
// Δp_crit and what the fast path found.
struct AuditEntry {
  std::uint64_t realization = 0;
  std::size_t segment = 0;
  double diffusivity = 0.0, prefactor = 0.0;  // m²/s, Pa per m³/s
  std::vector<double> group_scale;            // rate factor per rate group
  std::vector<std::size_t> well_group;        // rate group of each well
  double dp_crit = 0.0;                       // Pa
  int first_crossing = -1;                    // tracking index, fast path
  std::vector<double> dp_at_output;           // Pa, fast path
};

// Well attribution of a segment's median Δp: MedianAttribution (realization_split.hpp).

struct SegmentResult {
  std::vector<std::uint64_t> slipped_by;  // per output time: injection-induced slips by then
  // Per tracking time k (RunSettings::tracking_times): injection-induced slips first reached at
  // k, a histogram of the realizations' first crossings (exact to merge: integer counts). Its
  // running sum up to output_index[t] equals slipped_by[t]; see slipped_by_tracking().
  std::vector<std::uint64_t> first_slip;
  std::uint64_t already_critical = 0;     // realizations with Δp_crit ≤ 0 before injection
  std::uint64_t never_critical = 0;       // realizations where CFF cannot reach 0 (Δp_crit = +∞)
  stats::QuantileSketch dp_crit;          // finite Δp_crit values (Pa)
  std::vector<stats::QuantileSketch> dp;  // per output time: Δp (Pa), max over check points
  std::vector<double> sensitivity;        // Spearman ρ of each input with the final slip margin
  // Per output time: the well attribution of the median Δp (empty unless RunSettings::
  // attribute_median). Not a mergeable accumulator: it needs every realization's Δp at the
  // segment, so in a split run one part computes it over every realization (FinishedSegment).
  std::vector<MedianAttribution> median;
  // Weighted by the realizations' likelihood when the run is conditioned on observations
  // (RunSettings::observations; conditioning.hpp); empty otherwise.
  ConditionedCounts conditioned;
};

// Injection-induced slips by each tracking time: the running sum of `first_slip`.
std::vector<std::uint64_t> slipped_by_tracking(const SegmentResult& segment);

// The first tracking index at which slipped / realizations ≥ threshold (the same comparison as
// at the output times), or nothing if never by the last tracking time. `realizations` = 0 gives
// nothing.
std::optional<std::size_t> first_tracking_index_reaching(const SegmentResult& segment, std::uint64_t realizations,
                                                         double threshold);

struct ProbabilisticResult {
  std::vector<std::string> input_names;   // sampled inputs, then "strike perturbation", "dip perturbation"
  std::uint64_t realizations = 0;         // valid realizations (denominator of every probability)
  std::uint64_t rejected = 0;             // realizations whose sampled stress was not physical
  std::uint64_t beyond_frictional_limit = 0;  // valid realizations beyond (S1−p)/(S3−p) ≤ [√(μ²+1)+μ]²
  std::vector<SegmentResult> segments;
  // Maps: injection-induced slip counts [pixel * outputs + t]; realizations already critical
  // before injection (the same for every pixel: the stress is uniform) are counted apart.
  std::vector<std::uint64_t> map_dangerous, map_oriented;
  std::uint64_t map_dangerous_already_critical = 0, map_oriented_already_critical = 0;
  double diffusivity_min = 0.0, diffusivity_max = 0.0;  // m²/s over the realizations
  double surrogate_error = 0.0;           // estimated relative interpolation error in D
  stats::SamplerDescriptor sampler;
  std::vector<AuditEntry> audit;          // valid audited pairs, in (realization, segment) order
  // A split run's part other than 0: its block was sent to part 0 (RealizationSplit); only the
  // run-level fields above `segments` are set.
  bool merged_elsewhere = false;
  // Per segment, P(slip by T | f) of RunSettings::capacity's group (group_factors.hpp); empty
  // unless asked for.
  std::vector<SlipFactorCurve> capacity;
  // Per RunSettings::what_if variant, per segment, per output time: injection-induced slips by
  // then with the variant's rates (group_factors.hpp), on the same realizations.
  std::vector<std::vector<std::vector<std::uint64_t>>> what_if;
  // With RunSettings::observations: the importance weights, the observation fit and the inputs'
  // prior and posterior percentiles (set on every part of a split run).
  std::optional<Conditioning> conditioning;
};

// The plain method for one audited pair: every E1 term of every well, image and rate step is
// evaluated directly at every tracking time (no tables, no surrogate). Fills `first_crossing`
// and `dp_at_output` of the returned copy. Used by the benchmark and the tests to bound the
// fast path's error.
AuditEntry plain_slip_check(const AuditEntry& fast, const std::vector<WellInput>& wells,
                            const std::vector<SegmentInput>& segments, const RunSettings& settings);

// Runs the probabilistic screen. Throws InputError for inconsistent inputs (naming the field).
// With `split` (more than one part), tracks only this part's block of the valid realizations and
// merges on part 0 (realization_split.hpp); part 0's result is identical to the unsplit one.
// A split run keeps no audit (settings.audit_realizations must be empty).
ProbabilisticResult run_probabilistic(const UncertainModel& model, const std::vector<WellInput>& wells,
                                      const std::vector<SegmentInput>& segments, const RunSettings& settings,
                                      const RealizationSplit* split = nullptr);

}  // namespace slipscreen::probabilistic
