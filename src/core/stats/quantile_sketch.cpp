#include "core/stats/quantile_sketch.hpp"

#include <algorithm>
#include <bit>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::stats {
namespace {

constexpr std::uint64_t kEncodingVersion = 1;

std::string text(double v) { return std::to_string(v); }

}  // namespace

QuantileSketch::QuantileSketch(double relative_accuracy, double zero_threshold, std::size_t max_buckets)
    : alpha_(relative_accuracy), gamma_(0.0), multiplier_(0.0), zero_threshold_(zero_threshold),
      max_buckets_(max_buckets), min_(std::numeric_limits<double>::infinity()),
      max_(-std::numeric_limits<double>::infinity()) {
  if (!(relative_accuracy > 0.0 && relative_accuracy < 1.0))
    throw InputError("relative accuracy", text(relative_accuracy), "a number between 0 and 1, such as 0.01");
  if (!(zero_threshold >= std::numeric_limits<double>::min()) || !std::isfinite(zero_threshold))
    throw InputError("zero threshold", text(zero_threshold), "a finite number >= 2.2250738585072014e-308 (the smallest normal double)");
  if (max_buckets < 2) throw InputError("max buckets", std::to_string(max_buckets), "at least 2");
  // γ = (1 + α)/(1 − α) (Masson et al. 2019, §2); M = 1/(γ − 1) buckets per binade of L.
  gamma_ = (1.0 + alpha_) / (1.0 - alpha_);
  multiplier_ = (1.0 - alpha_) / (2.0 * alpha_);
}

namespace {
// L(x) = e + s for x = 2^e (1 + s), 0 ≤ s < 1: log2 interpolated linearly between powers of two,
// read from the bits of a normal double (exact: no rounding but that of e + s).
double linear_log2(double x) {
  const auto bits = std::bit_cast<std::uint64_t>(x);
  const auto e = static_cast<int>((bits >> 52) & 0x7FF) - 1023;
  const double s = static_cast<double>(bits & ((std::uint64_t{1} << 52) - 1)) * 0x1p-52;
  return static_cast<double>(e) + s;
}
// L⁻¹(y) = 2^⌊y⌋ (1 + y − ⌊y⌋).
double linear_exp2(double y) {
  const double f = std::floor(y);
  return std::ldexp(1.0 + (y - f), static_cast<int>(f));
}
}  // namespace

std::int64_t QuantileSketch::index_of(double magnitude) const {
  // i = ⌈M·L(x)⌉: bucket i holds L⁻¹((i−1)/M) < x ≤ L⁻¹(i/M), a ratio of at most 1 + 1/M = γ.
  // ⌈y⌉ by truncation and one correction (exact; no libm call on baseline x86-64).
  const double y = linear_log2(magnitude) * multiplier_;
  const auto i = static_cast<std::int64_t>(y);
  return static_cast<double>(i) < y ? i + 1 : i;
}

double QuantileSketch::representative(std::int64_t index) const {
  // x̃ = 2ab/(a + b) for the bucket (a, b]: relative error (b − a)/(a + b) ≤ (γ − 1)/(γ + 1) = α
  // at both ends (Masson et al. 2019 §2 with the bucket bounds of the linear mapping).
  const double a = linear_exp2(static_cast<double>(index - 1) / multiplier_);
  const double b = linear_exp2(static_cast<double>(index) / multiplier_);
  return 2.0 * a * b / (a + b);
}

void QuantileSketch::Store::add(std::int64_t index, std::uint64_t n, std::size_t max_buckets) {
  const auto m = static_cast<std::int64_t>(max_buckets);
  if (counts.empty()) {
    offset = index;
    counts.assign(1, n);
    return;
  }
  const std::int64_t top = offset + static_cast<std::int64_t>(counts.size()) - 1;
  if (index > top) {
    // Extend upwards; if the range then exceeds m buckets, fold the lowest ones into the
    // new lowest kept bucket (collapsing-lowest store, Masson et al. 2019 §2.2).
    const std::int64_t low = std::max(offset, index - m + 1);
    std::uint64_t folded = 0;
    for (std::int64_t k = offset; k < low && k <= top; ++k) folded += counts[static_cast<std::size_t>(k - offset)];
    std::vector<std::uint64_t> next(static_cast<std::size_t>(index - low + 1), 0);
    for (std::int64_t k = std::max(low, offset); k <= top; ++k)
      next[static_cast<std::size_t>(k - low)] = counts[static_cast<std::size_t>(k - offset)];
    next[0] += folded;
    next.back() += n;
    counts.swap(next);
    offset = low;
    return;
  }
  // At or below the top: a bucket below the collapse bound goes to the lowest kept bucket.
  const std::int64_t target = std::max(index, top - m + 1);
  if (target < offset) {
    counts.insert(counts.begin(), static_cast<std::size_t>(offset - target), 0);
    offset = target;
  }
  counts[static_cast<std::size_t>(target - offset)] += n;
}

void QuantileSketch::add(double x) { add(x, 1); }

void QuantileSketch::add(double x, std::uint64_t n) {
  if (!std::isfinite(x)) throw NumericalError("quantile sketch: value " + text(x) + " is not a finite number");
  if (n == 0) throw InputError("quantile sketch count", "0", "a count of at least 1");
  count_ += n;
  min_ = std::min(min_, x);
  max_ = std::max(max_, x);
  if (x > zero_threshold_)
    positive_.add(index_of(x), n, max_buckets_);
  else if (x < -zero_threshold_)
    negative_.add(index_of(-x), n, max_buckets_);
  else
    zero_count_ += n;
}

void QuantileSketch::merge(const QuantileSketch& other) {
  if (other.alpha_ != alpha_ || other.zero_threshold_ != zero_threshold_ || other.max_buckets_ != max_buckets_)
    throw InputError("quantile sketch", "alpha=" + text(other.alpha_) + ", zero threshold=" + text(other.zero_threshold_),
                     "the same relative accuracy, zero threshold and bucket limit as the sketch it merges into (alpha=" +
                         text(alpha_) + ")");
  if (other.count_ == 0) return;
  // Add the other's buckets from the top down, so that the collapse bound is set by the
  // largest index first and the lower buckets fold exactly as they would value by value.
  const auto merge_store = [&](Store& into, const Store& from) {
    for (std::size_t k = from.counts.size(); k-- > 0;)
      if (from.counts[k] != 0) into.add(from.offset + static_cast<std::int64_t>(k), from.counts[k], max_buckets_);
  };
  merge_store(positive_, other.positive_);
  merge_store(negative_, other.negative_);
  zero_count_ += other.zero_count_;
  count_ += other.count_;
  min_ = std::min(min_, other.min_);
  max_ = std::max(max_, other.max_);
}

double QuantileSketch::quantile(double q) const {
  if (!(q >= 0.0 && q <= 1.0)) throw InputError("quantile", text(q), "a level between 0 and 1");
  if (count_ == 0) throw InputError("quantile sketch", "empty", "at least one value");
  if (q == 0.0) return min_;
  if (q == 1.0) return max_;
  // Rank ⌊q(n−1)⌋ (0-based), Masson et al. 2019 Algorithm 2.
  return value_above(static_cast<std::uint64_t>(std::floor(q * static_cast<double>(count_ - 1))));
}

double QuantileSketch::value_above(std::uint64_t rank) const {
  if (count_ == 0) throw InputError("quantile sketch", "empty", "at least one value");
  std::uint64_t seen = 0;
  // Most negative first: the negative store from its largest magnitude down.
  for (std::size_t k = negative_.counts.size(); k-- > 0;) {
    seen += negative_.counts[k];
    if (seen > rank)
      return std::clamp(-representative(negative_.offset + static_cast<std::int64_t>(k)), min_, max_);
  }
  seen += zero_count_;
  if (seen > rank) return std::clamp(0.0, min_, max_);
  for (std::size_t k = 0; k < positive_.counts.size(); ++k) {
    seen += positive_.counts[k];
    if (seen > rank)
      return std::clamp(representative(positive_.offset + static_cast<std::int64_t>(k)), min_, max_);
  }
  return max_;
}

std::vector<std::uint64_t> QuantileSketch::encode() const {
  std::vector<std::uint64_t> w = {kEncodingVersion,
                                  std::bit_cast<std::uint64_t>(alpha_),
                                  std::bit_cast<std::uint64_t>(zero_threshold_),
                                  max_buckets_,
                                  count_,
                                  zero_count_,
                                  std::bit_cast<std::uint64_t>(min_),
                                  std::bit_cast<std::uint64_t>(max_)};
  for (const Store* s : {&positive_, &negative_}) {
    w.push_back(static_cast<std::uint64_t>(s->offset));
    w.push_back(s->counts.size());
    w.insert(w.end(), s->counts.begin(), s->counts.end());
  }
  return w;
}

QuantileSketch QuantileSketch::decode(std::span<const std::uint64_t> w) {
  const auto bad = [&](const char* why) {
    return InputError("quantile sketch encoding", std::to_string(w.size()) + " words", why);
  };
  if (w.size() < 12 || w[0] != kEncodingVersion) throw bad("an encoding of version 1 from QuantileSketch::encode");
  QuantileSketch s(std::bit_cast<double>(w[1]), std::bit_cast<double>(w[2]), static_cast<std::size_t>(w[3]));
  s.count_ = w[4];
  s.zero_count_ = w[5];
  s.min_ = std::bit_cast<double>(w[6]);
  s.max_ = std::bit_cast<double>(w[7]);
  std::size_t at = 8;
  for (Store* store : {&s.positive_, &s.negative_}) {
    if (at + 2 > w.size()) throw bad("a complete encoding (it is cut short)");
    store->offset = static_cast<std::int64_t>(w[at]);
    const std::uint64_t size = w[at + 1];
    at += 2;
    if (size > w.size() - at || size > 2 * s.max_buckets_) throw bad("a complete encoding (it is cut short)");
    store->counts.assign(w.begin() + static_cast<std::ptrdiff_t>(at), w.begin() + static_cast<std::ptrdiff_t>(at + size));
    at += size;
  }
  if (at != w.size()) throw bad("no words after the encoding");
  std::uint64_t total = s.zero_count_;
  for (const Store* store : {&s.positive_, &s.negative_})
    for (auto c : store->counts) total += c;
  if (total != s.count_) throw bad("bucket counts that add up to the value count");
  return s;
}

}  // namespace slipscreen::stats
