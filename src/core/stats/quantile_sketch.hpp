#pragma once
// A mergeable quantile sketch with relative accuracy: DDSketch.
//
// Source: Masson, Rim & Lee (2019), "DDSketch: a fast and fully-mergeable quantile sketch
//   with relative-error guarantees", PVLDB 12(12):2195-2205, doi:10.14778/3352063.3352135.
//
// Symbol table (code name -> Masson et al. 2019):
//   alpha (relative_accuracy)  α        relative accuracy of every quantile estimate
//   gamma                      γ        (1 + α)/(1 − α), the largest ratio of a bucket's bounds
//   multiplier                 M        1/(γ − 1), buckets per power of two
//   index                      i        bucket of x > 0: i = ⌈M·L(x)⌉
//   representative             x̃_i      2ab/(a + b) for bucket (a, b]: within α·x of its values
//   max_buckets                m        bucket limit per store (collapsing lowest buckets)
//   q                          q        quantile level; the estimated value is that of rank
//                                       ⌊q(n − 1)⌋ (0-based) among the n values, as in the paper
//
// Index mapping: the paper's logarithmic mapping ⌈log_γ x⌉ costs a logarithm per value. This
// sketch uses the linearly interpolated mapping of the authors' open-source DDSketch libraries
// (from memory): a piecewise-linear log2 read from the double's exponent and significand,
// L(x) = e + s for x = 2^e (1 + s). L is exact at powers of two and increasing, and a bucket
// (L⁻¹((i−1)/M), L⁻¹(i/M)] has a ratio of bounds of at most 1 + 1/M = γ (largest just above a
// power of two), so the relative-accuracy guarantee is the same α; it uses about
// 1/(M·log2 γ) ≈ 1.44 times as many buckets as the logarithmic mapping, and no logarithm.
//
// Signs: values x > zero_threshold go to the positive store (index of x), values
// x < −zero_threshold to the negative store (index of |x|), the rest count as zero (estimate
// 0). Δp_crit can be ≤ 0, so all three are needed.
//
// Accuracy: for q in [0, 1], let x_q be the exact value of rank ⌊q(n−1)⌋. quantile(q) returns
// x̃ with |x̃ − x_q| ≤ α|x_q| (plus ~1e-14 relative from rounding at bucket bounds) whenever
// |x_q| ≥ zero_threshold and x_q's bucket has not been collapsed; |x̃ − x_q| ≤ zero_threshold
// when |x_q| < zero_threshold. Collapsing: a store keeps at most m buckets; buckets more than
// m − 1 below its largest index fold into the lowest kept one, i.e. magnitudes below about
// max|x|·2^−((m−2)/M − 0.09) (≈ max|x|·4e-13 for α = 0.01, m = 2048) lose their relative
// accuracy (their absolute error stays below that bound). q = 0 and q = 1 return the exact
// min and max.
//
// Merging: merge(A, B) gives the sketch that processing A's and B's values in one sketch
// gives, bucket for bucket (the bucket of a value depends only on the value, the collapse
// bound only on the largest index; counts are integers; min and max are exact). So
// quantiles of a merged sketch are bit-identical to single-process ones.
//
// Memory: 8 bytes per bucket between the smallest and largest index seen per store, about
// M·log2(max/min) buckets for values spanning max/min (≈ 660 buckets = 5.3 kB for four
// decades at α = 0.01), never more than 2m.
#include <cstdint>
#include <span>
#include <vector>

namespace slipscreen::stats {

class QuantileSketch {
 public:
  // α in (0, 1), zero_threshold ≥ the smallest normal double (finite), m ≥ 2. InputError otherwise.
  explicit QuantileSketch(double relative_accuracy = 0.01, double zero_threshold = 1e-12,
                          std::size_t max_buckets = 2048);

  // Adds a finite value (NumericalError for NaN or infinity).
  void add(double x);
  // Adds a finite value `count` times (count ≥ 1): a weighted sketch whose counts are integer
  // weights (stats::WeightedSketch). Merging stays exact (integer sums).
  void add(double x, std::uint64_t count);
  // Adds the other sketch's values (InputError if α, zero_threshold or m differ).
  void merge(const QuantileSketch& other);

  std::uint64_t count() const noexcept { return count_; }
  bool empty() const noexcept { return count_ == 0; }
  double min() const noexcept { return min_; }
  double max() const noexcept { return max_; }
  double relative_accuracy() const noexcept { return alpha_; }
  double zero_threshold() const noexcept { return zero_threshold_; }

  // Estimate of the q-quantile, q in [0, 1] (InputError otherwise, or if the sketch is empty).
  double quantile(double q) const;
  // The estimate of the first value, in increasing order, whose cumulative count exceeds `rank`
  // (quantile(q) is value_above(⌊q(n−1)⌋) for 0 < q < 1); the max when none does.
  double value_above(std::uint64_t rank) const;

  // Flat encoding for sending between processes; decode(encode()) == *this.
  std::vector<std::uint64_t> encode() const;
  static QuantileSketch decode(std::span<const std::uint64_t> words);

  bool operator==(const QuantileSketch& other) const = default;

 private:
  struct Store {
    std::int64_t offset = 0;             // index of counts[0]
    std::vector<std::uint64_t> counts;   // buckets offset .. offset + size − 1 (ends non-zero)
    void add(std::int64_t index, std::uint64_t n, std::size_t max_buckets);
    bool operator==(const Store&) const = default;
  };
  std::int64_t index_of(double magnitude) const;
  double representative(std::int64_t index) const;

  double alpha_, gamma_, multiplier_, zero_threshold_;
  std::size_t max_buckets_;
  Store positive_, negative_;
  std::uint64_t zero_count_ = 0, count_ = 0;
  double min_, max_;
};

}  // namespace slipscreen::stats
