#pragma once
// The critical factors f_crit of a group of wells for every fault segment and realization of a
// probabilistic run (critical_factor.hpp), and the slips of what-if variants, from two pressure
// models over the same realizations (pressure_model.hpp): `base`, the screen's (every well at
// its planned rates), and `part`, the group's wells over the part of their schedules that is
// scaled (after the `from` date, or all of it). Scaling that part by f gives, at every check
// point p and tracking time t_k (Theis superposition in the rates, critical_factor.hpp),
//   Δp_p(t_k; f) = Δp_base,p(t_k) + (f − 1)·Δp_part,p(t_k),
// so Δp_rest = Δp_base − Δp_part and Δp_G = Δp_part. A segment's Δp is the maximum over its
// check points, so it slips at factor f iff some (p, t_k) has Δp_p(t_k; f) ≥ Δp_crit, and f_crit
// is the minimum of critical_factor() over its check points (exact, by the same linearity). The
// part's model holds only the group's wells, so it costs a small share of the screen's; at
// f = 1 every answer is the screen's own.
//
// Speed: the answers need, per segment, only its k smallest f_crit (k = steps_needed() of the
// thresholds: the count at which the lower end of the Wilson interval passes the largest
// threshold) and every f_crit up to the shown curve's end. A realization's series is evaluated
// only where rigorous bounds allow a crossing at a factor up to the cutoff C (segment_curve in
// group_factors.cpp): U_base + (C − 1)·U_part ≥ Δp_crit for C ≥ 1, U_base − (1 − C)·L_part for
// C < 1, with U and L the upper and lower bounds of each model's Δp over the chunk, max (min)
// over the check points (chunk_bounds.hpp; first over all times at once, as a sieve). The others
// get f_crit = +∞, which is exact for every question asked at f ≤ C.
//
// Symbol table: horizon K (tracking index of T), f_max (the largest factor resolved).
#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

#include "core/probabilistic/allowable_factor.hpp"
#include "core/probabilistic/pressure_model.hpp"

namespace slipscreen::probabilistic {

// One SlipFactorCurve per segment over the valid realizations (N = dp_crit.cols()); realizations
// already critical before injection (Δp_crit ≤ 0) are counted in N but carry no f_crit, as in the
// screen's injection-induced P. Each curve is exact on [0, C_s] with C_s ≥ the range the run's
// answers show (curve_end) and ≥ its steps_needed()-th smallest f_crit (capped at f_max): every
// segment_limit() at `thresholds`, the allowable factors and capacity_curve.csv are exact, and
// are all that is asked of them. InputError if horizon is not a tracking index, f_max is not ≥ 1,
// or the two models do not cover the same check points and realizations.
std::vector<SlipFactorCurve> group_factor_curves(const PressureModel& base, const PressureModel& part,
                                                 const Eigen::MatrixXf& dp_crit, std::size_t horizon, double f_max,
                                                 const std::vector<double>& thresholds, double z);

// A what-if variant prepared once for the search that runs segment by segment while the screen
// tracks its realizations: the part's rates are multiplied by `factor` ≥ 0. `from_row` is the
// first tracking index at which any of the part's tables is non-zero; before it the variant's
// Δp is the screen's, exactly.
struct VariantSearch {
  const PressureModel* base = nullptr;
  PressureModel part;
  double factor = 1.0;
  std::size_t from_row = 0;
  Eigen::MatrixXd parts_base, parts_part;  // split_basis() of each model, for the bounds
};

// InputError if the factor is not ≥ 0 or the models do not cover the same check points,
// tracking times and `realizations` valid realizations.
VariantSearch prepare_variant(const PressureModel& base, PressureModel part, double factor, std::size_t realizations);

// Injection-induced slips by each output time of segment s under the variant, over the valid
// realizations (one per entry of `first_crossing`, which covers every column of the run: the tracking index of each
// one's first crossing under the screen's rates, −1 if none; slip_tracker.hpp). A realization
// that crosses before from_row crosses at the same time in the variant; the others are searched
// from from_row on, in chunks of 24 tracking times, in order until the first crossing, and only
// in chunks whose bound (U_base + (factor − 1)·U_part, or ·L_part when factor < 1, as above)
// reaches Δp_crit: the same
// result as evaluating every series.
std::vector<std::uint64_t> variant_segment_slips(const VariantSearch& v, const Eigen::MatrixXf& dp_crit, std::size_t s,
                                                 std::span<const int> first_crossing,
                                                 const std::vector<std::size_t>& output_index);

}  // namespace slipscreen::probabilistic
