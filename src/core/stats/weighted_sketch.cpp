// Weighted percentiles; see weighted_sketch.hpp.
#include "core/stats/weighted_sketch.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::stats {

std::uint64_t weighted_rank_threshold(double q, std::uint64_t values, std::uint64_t total_weight) {
  if (!(q > 0.0 && q < 1.0)) throw InputError("quantile", std::to_string(q), "a level between 0 and 1 (exclusive)");
  if (values == 0 || total_weight == 0) throw InputError("weighted sample", "total weight 0", "a positive total weight");
  // ⌊q(n − 1)⌋ exactly as QuantileSketch::quantile computes its rank, times the mean weight
  // (≤ W, no overflow since ⌊q(n − 1)⌋ < n).
  const auto rank = static_cast<std::uint64_t>(std::floor(q * static_cast<double>(values - 1)));
  return rank * (total_weight / values);
}

void WeightedSketch::add(double x, std::uint64_t units) {
  if (units > 0) sketch_.add(x, units);
  ++n_;
}

void WeightedSketch::merge(const WeightedSketch& other) {
  sketch_.merge(other.sketch_);
  n_ += other.n_;
}

double WeightedSketch::quantile(double q) const {
  return sketch_.value_above(weighted_rank_threshold(q, n_, sketch_.count()));
}

std::vector<std::uint64_t> WeightedSketch::encode() const {
  std::vector<std::uint64_t> w = sketch_.encode();
  w.push_back(n_);
  return w;
}

WeightedSketch WeightedSketch::decode(std::span<const std::uint64_t> words) {
  if (words.empty()) throw InputError("weighted sketch encoding", "0 words", "an encoding from WeightedSketch::encode");
  WeightedSketch s;
  s.sketch_ = QuantileSketch::decode(words.first(words.size() - 1));
  s.n_ = words.back();
  return s;
}

double weighted_percentile(std::span<const double> x, std::span<const std::uint64_t> units, double q) {
  if (x.size() != units.size())
    throw InputError("weights", std::to_string(units.size()), std::to_string(x.size()) + ", one per value");
  std::uint64_t total = 0;
  for (auto u : units) total += u;
  const std::uint64_t threshold = weighted_rank_threshold(q, x.size(), total);
  std::vector<std::size_t> order(x.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
  std::uint64_t seen = 0;
  for (std::size_t i : order) {
    seen += units[i];
    if (seen > threshold) return x[i];
  }
  return x[order.back()];
}

}  // namespace slipscreen::stats
