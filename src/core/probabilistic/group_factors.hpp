#pragma once
// The critical factors f_crit of a group of wells for every fault segment and realization of a
// probabilistic run (critical_factor.hpp), from the run's pressure model with the group's wells
// kept apart (pressure_model.hpp, `apart`): the surrogate gives, per check point p and tracking
// time t_k ≤ T, Δp_rest,p(t_k) (the groups not apart) and Δp_G,p(t_k) (the groups apart), each
// Σ_g P·f_g·G_{p,g}(t_k, D) over its groups. A segment's Δp is the maximum over its check points,
// so it slips at factor f iff some (p, t_k) has Δp_rest,p + f·Δp_G,p ≥ Δp_crit, and f_crit is the
// minimum of critical_factor() over its check points (exact, by the same linearity).
//
// Speed: a realization's series is evaluated only where a rigorous bound allows a crossing at a
// factor up to f_max: max_p (B_rest,p + f_max·B_G,p) with B = Σ_g |P f_g| Σ_d |ℓ_d| max_{k≤K}
// |G_{p,g}(t_k, D_d)| (triangle inequality, as slip_tracker.hpp). The others get f_crit = +∞,
// which is exact for every question asked at f ≤ f_max: P(slip by T | f) is exact on [0, f_max].
//
// Symbol table: horizon K (tracking index of T), f_max (the largest factor resolved).
#include <cstddef>
#include <cstdint>
#include <vector>

#include "core/probabilistic/allowable_factor.hpp"
#include "core/probabilistic/pressure_model.hpp"

namespace slipscreen::probabilistic {

// One SlipFactorCurve per segment over the valid realizations (N = dp_crit.cols()); realizations
// already critical before injection (Δp_crit ≤ 0) are counted in N but carry no f_crit, as in the
// screen's injection-induced P. `apart` (per rate group of `pm`) says which groups are the
// group's: the group's wells must not share a rate group with other wells (pressure_model.hpp,
// `apart`, does that). InputError if horizon is not a tracking index, f_max is not > 0 or
// `apart` does not have one flag per group.
std::vector<SlipFactorCurve> group_factor_curves(const PressureModel& pm, const std::vector<char>& apart,
                                                 const Eigen::MatrixXf& dp_crit, std::size_t horizon, double f_max);

// What-if variants by the same superposition: per segment and output time, the injection-induced
// slips by then (as SegmentResult::slipped_by) with the group's rates multiplied by `factor` ≥ 0,
// Δp = Δp_rest + factor·Δp_G at every check point and tracking time. As in slip_tracker.hpp, the
// series is evaluated in chunks of 24 tracking times, in order until the first crossing, and only
// in chunks whose bound (the one above, per chunk, with f_max = factor) reaches Δp_crit: the same
// result as evaluating every series.
std::vector<std::vector<std::uint64_t>> group_variant_slips(const PressureModel& pm, const std::vector<char>& apart,
                                                            const Eigen::MatrixXf& dp_crit,
                                                            const std::vector<std::size_t>& output_index, double factor);

}  // namespace slipscreen::probabilistic
