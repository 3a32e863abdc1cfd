#pragma once
// The allowable rate factor of a group of wells: the largest factor f on the group's rates for
// which every fault segment's P(slip by T | f) stays at or below a threshold.
//
// Source: linearity of Δp in the well rates (BRIEF 2.6, critical_factor.hpp): realization i
// slips at f iff f ≥ f_crit,i, so P(slip by T | f) = #{i : f_crit,i ≤ f} / N exactly, a
// right-continuous step function of f with its steps at the f_crit values; its upper bound is
// the Wilson (1927) score interval's upper end for that count (stats::wilson_interval), which
// increases with the count.
//
// Symbol table (code name -> symbol):
//   f_crit        f_crit,i   critical factors of one segment's realizations (critical_factor())
//   realizations  N          the denominator: every valid realization (realizations already
//                            critical before injection are counted in N but passed no f_crit,
//                            as in the probabilistic screen's injection-induced P)
//   threshold     P_max      the threshold on P(slip by T | f)
//
// Exact: counts are integers and the steps are the f_crit values themselves, so the answers
// involve no search tolerance. Curves merge exactly (SlipFactorCurve::merge: the f_crit lists and counts add).
#include <cstddef>
#include <cstdint>
#include <limits>
#include <optional>
#include <vector>

namespace slipscreen::probabilistic {

// P(slip by T | f) of one segment for every f in [0, exact_up_to].
class SlipFactorCurve {
 public:
  // `f_crit`: one value per realization that can slip by injection (≥ 0, +∞ allowed); at most
  // `realizations` of them. `exact_up_to`: every realization whose f_crit is at or below it is
  // listed with its value; the others may be listed as +∞ (group_factors.hpp computes only what
  // its questions need). InputError for NaN, a negative value, too many values, N = 0 or a
  // range that is not > 0.
  SlipFactorCurve(std::vector<double> f_crit, std::uint64_t realizations,
                  double exact_up_to = std::numeric_limits<double>::infinity());
  std::uint64_t realizations() const { return n_; }
  // The curve is exact on [0, exact_up_to()].
  double exact_up_to() const { return exact_up_to_; }
  // #{i : f_crit,i ≤ f}: the realizations slipped by T at factor f. LogicError for f beyond
  // exact_up_to(): the count there is not known.
  std::uint64_t slipped(double f) const;
  double probability(double f) const { return static_cast<double>(slipped(f)) / static_cast<double>(n_); }
  // The critical factors in increasing order (the steps of the curve).
  const std::vector<double>& steps() const { return sorted_; }
  // Adds another set of realizations of the same segment (a split run's other part): the result
  // equals the curve built from both parts' values at once, exact up to the smaller range.
  void merge(const SlipFactorCurve& other);

 private:
  std::vector<double> sorted_;
  std::uint64_t n_ = 0;
  double exact_up_to_ = std::numeric_limits<double>::infinity();
};

// Which value of P(slip by T | f) the threshold applies to: the point estimate, or the upper or
// lower end of its Wilson interval (both increase with the count, as the estimate does).
enum class ProbabilityBound { point_estimate, wilson_upper, wilson_lower };

// The factor at which the segment's P(slip by T | f) (its point estimate, or the upper end of its
// Wilson interval with normal quantile z) first exceeds `threshold`: P stays at or below it for
// every f in [0, limit) and exceeds it at f = limit. 0: exceeded without the group (at f = 0);
// +∞: never exceeded. A threshold that even no slip at all exceeds (Wilson upper end at
// 0 slips above it) gives 0. It is the (m + 1)-th smallest f_crit, m the largest count within the
// threshold (limit_step); exact whenever that step is within the curve's exact range, and +∞
// (beyond the range) otherwise. std::logic_error if the curve's range is too short to tell.
double segment_limit(const SlipFactorCurve& curve, double threshold, ProbabilityBound bound, double z);

// The number of smallest f_crit of a curve of N realizations that decide segment_limit() for
// every threshold of `thresholds` and every bound: the largest (m + 1) over them, at most N.
std::uint64_t steps_needed(std::uint64_t realizations, const std::vector<double>& thresholds, double z);

struct AllowableFactor {
  // The smallest positive segment limit (+∞ when no segment ever exceeds): every f below it
  // keeps every segment at or below the threshold, and at it `binding` exceeds it.
  double limit = 0.0;
  // The largest double below `limit` (+∞ when `limit` is): the largest f the answer allows.
  double largest = 0.0;
  std::optional<std::size_t> binding;      // the segment whose limit it is (lowest index on ties)
  std::vector<std::size_t> reached_without;  // segments with limit 0: exceeded without the group
};

// The allowable factor over the segments; those exceeding the threshold without the group are
// listed apart and do not bind. Which exceed it is judged with `left_apart_by` (default: `bound`
// itself); the point estimate's answer beside a Wilson-upper answer takes the Wilson-upper set, so
// both answers are over the same segments and the conservative one is never the larger
// (docs/decisions.md). InputError if `curves` is empty or the threshold is not in (0, 1).
AllowableFactor allowable_factor(const std::vector<SlipFactorCurve>& curves, double threshold, ProbabilityBound bound,
                                 double z, std::optional<ProbabilityBound> left_apart_by = std::nullopt);

// The range of f that the run's curve of P(slip by T | f) shows (capacity_curve.csv): 1.5 times
// the largest finite answer (conservative and point estimate, over `thresholds`), at least 2, at
// most f_max. Every curve must be exact up to it (group_factors.hpp makes them so).
double curve_end(const std::vector<SlipFactorCurve>& curves, const std::vector<double>& thresholds, double z,
                 double f_max);

}  // namespace slipscreen::probabilistic
