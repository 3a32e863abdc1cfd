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
#include <optional>
#include <vector>

namespace slipscreen::probabilistic {

// P(slip by T | f) of one segment for every f ≥ 0.
class SlipFactorCurve {
 public:
  // `f_crit`: one value per realization that can slip by injection (≥ 0, +∞ allowed); at most
  // `realizations` of them. InputError for NaN, a negative value, too many values or N = 0.
  SlipFactorCurve(std::vector<double> f_crit, std::uint64_t realizations);
  std::uint64_t realizations() const { return n_; }
  // #{i : f_crit,i ≤ f}: the realizations slipped by T at factor f.
  std::uint64_t slipped(double f) const;
  double probability(double f) const { return static_cast<double>(slipped(f)) / static_cast<double>(n_); }
  // The critical factors in increasing order (the steps of the curve).
  const std::vector<double>& steps() const { return sorted_; }
  // Adds another set of realizations of the same segment (a split run's other part): the result
  // equals the curve built from both parts' values at once.
  void merge(const SlipFactorCurve& other);

 private:
  std::vector<double> sorted_;
  std::uint64_t n_ = 0;
};

// Which value of P(slip by T | f) the threshold applies to: the point estimate, or the upper or
// lower end of its Wilson interval (both increase with the count, as the estimate does).
enum class ProbabilityBound { point_estimate, wilson_upper, wilson_lower };

// The factor at which the segment's P(slip by T | f) (its point estimate, or the upper end of its
// Wilson interval with normal quantile z) first exceeds `threshold`: P stays at or below it for
// every f in [0, limit) and exceeds it at f = limit. 0: exceeded without the group (at f = 0);
// +∞: never exceeded. A threshold that even no slip at all exceeds (Wilson upper end at
// 0 slips above it) gives 0.
double segment_limit(const SlipFactorCurve& curve, double threshold, ProbabilityBound bound, double z);

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
// listed apart and do not bind. InputError if `curves` is empty or the threshold is not in (0, 1).
AllowableFactor allowable_factor(const std::vector<SlipFactorCurve>& curves, double threshold, ProbabilityBound bound,
                                 double z);

}  // namespace slipscreen::probabilistic
