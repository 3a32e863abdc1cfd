#pragma once
// Weighted percentiles that merge exactly: a DDSketch (stats::QuantileSketch, Masson, Rim & Lee
// 2019) whose bucket counts are integer weights, and the exact weighted percentile of a sample
// held in memory, both with the same rank rule (docs/conditioning.md, "Weighted percentiles").
//
// Weights are fixed-point integers (importance weights normalised to a total of 2^52 units,
// probabilistic/conditioning.hpp), so sums of weights are exact in any order: a sketch filled
// by several threads or processes and merged is bit-identical to a single pass.
//
// Rank rule. For n values (zero weights included) with total weight W, the q-percentile
// (0 < q < 1) is the first value in increasing order whose cumulative weight exceeds
// ⌊q(n − 1)⌋ · ⌊W/n⌋. With equal weights u this is cumulative count > ⌊q(n − 1)⌋, the
// unweighted rule of QuantileSketch::quantile (value of rank ⌊q(n − 1)⌋), exactly: equal weights
// give the unweighted percentiles bit for bit. With unequal weights it is the weighted
// quantile at level ⌊q(n − 1)⌋/n (within 1/n of q).
// Accuracy of the sketch: the relative accuracy α of QuantileSketch for the value so selected.
#include <cstdint>
#include <span>
#include <vector>

#include "core/stats/quantile_sketch.hpp"

namespace slipscreen::stats {

class WeightedSketch {
 public:
  // Adds a finite value with weight `units` (0 counts the value in n without weight).
  void add(double x, std::uint64_t units);
  void merge(const WeightedSketch& other);

  std::uint64_t values() const noexcept { return n_; }
  std::uint64_t total_weight() const noexcept { return sketch_.count(); }
  bool empty() const noexcept { return sketch_.empty(); }
  // The q-percentile by the rank rule above, q in (0, 1) (InputError otherwise or when the total
  // weight is 0).
  double quantile(double q) const;

  std::vector<std::uint64_t> encode() const;
  static WeightedSketch decode(std::span<const std::uint64_t> words);
  bool operator==(const WeightedSketch&) const = default;

 private:
  QuantileSketch sketch_;
  std::uint64_t n_ = 0;
};

// The cumulative weight a q-percentile must exceed under the rank rule above.
std::uint64_t weighted_rank_threshold(double q, std::uint64_t values, std::uint64_t total_weight);

// The exact weighted q-percentile of `x` with integer weights `units` (same size) under the rank
// rule above; q in (0, 1). InputError for mismatched sizes or a total weight of 0.
double weighted_percentile(std::span<const double> x, std::span<const std::uint64_t> units, double q);

}  // namespace slipscreen::stats
