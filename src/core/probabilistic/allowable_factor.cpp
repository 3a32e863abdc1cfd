#include "core/probabilistic/allowable_factor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <stdexcept>
#include <string>

#include "core/errors.hpp"
#include "core/stats/wilson_interval.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();

// Whether `count` slips of N keep the bound at or below the threshold.
bool within(std::uint64_t count, std::uint64_t n, double threshold, ProbabilityBound bound, double z) {
  if (bound == ProbabilityBound::point_estimate) return static_cast<double>(count) / static_cast<double>(n) <= threshold;
  const auto ci = stats::wilson_interval(count, n, z);
  return (bound == ProbabilityBound::wilson_upper ? ci.upper : ci.lower) <= threshold;
}

}  // namespace

SlipFactorCurve::SlipFactorCurve(std::vector<double> f_crit, std::uint64_t realizations, double exact_up_to)
    : sorted_(std::move(f_crit)), n_(realizations), exact_up_to_(exact_up_to) {
  if (n_ == 0) throw InputError("realizations", "0", "at least one realization");
  if (!(exact_up_to_ > 0.0)) throw InputError("exact range of the factor curve", std::to_string(exact_up_to_), "a factor > 0");
  if (sorted_.size() > n_)
    throw InputError("critical factors", std::to_string(sorted_.size()),
                     "at most one per realization (" + std::to_string(n_) + ")");
  for (double f : sorted_)
    if (!(f >= 0.0)) throw InputError("critical factor", std::to_string(f), "a factor >= 0 or +infinity");
  std::sort(sorted_.begin(), sorted_.end());
}

std::uint64_t SlipFactorCurve::slipped(double f) const {
  if (f > exact_up_to_)
    throw std::logic_error("slip count at f = " + std::to_string(f) + " asked of a curve exact only up to " +
                           std::to_string(exact_up_to_));
  return static_cast<std::uint64_t>(std::upper_bound(sorted_.begin(), sorted_.end(), f) - sorted_.begin());
}

void SlipFactorCurve::merge(const SlipFactorCurve& other) {
  std::vector<double> both(sorted_.size() + other.sorted_.size());
  std::merge(sorted_.begin(), sorted_.end(), other.sorted_.begin(), other.sorted_.end(), both.begin());
  sorted_ = std::move(both);
  n_ += other.n_;
  exact_up_to_ = std::min(exact_up_to_, other.exact_up_to_);
}

namespace {
// The largest count m of N slips within the threshold (the bound increases with the count): a
// binary search over [0, N]; none when 0 slips already exceed it.
std::optional<std::uint64_t> largest_within(std::uint64_t n, double threshold, ProbabilityBound bound, double z) {
  if (!within(0, n, threshold, bound, z)) return std::nullopt;
  std::uint64_t lo = 0, hi = n;  // within(lo) holds; find the largest such
  while (lo < hi) {
    const std::uint64_t mid = lo + (hi - lo + 1) / 2;
    if (within(mid, n, threshold, bound, z)) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}
}  // namespace

double segment_limit(const SlipFactorCurve& curve, double threshold, ProbabilityBound bound, double z) {
  const auto m = largest_within(curve.realizations(), threshold, bound, z);
  if (!m) return 0.0;
  // P exceeds the threshold once more than m realizations slip: at the (m + 1)-th step.
  const auto& steps = curve.steps();
  const double f = *m >= steps.size() ? kInf : steps[static_cast<std::size_t>(*m)];
  // A step listed as +∞ beyond the exact range may be a finite factor there: the limit is then
  // only known to be beyond the range, which is all a caller may ask (group_factors.hpp).
  if (f > curve.exact_up_to() && !std::isinf(f))
    throw std::logic_error("segment limit beyond the curve's exact range");
  return f;
}

std::uint64_t steps_needed(std::uint64_t realizations, const std::vector<double>& thresholds, double z) {
  std::uint64_t k = 0;
  for (double th : thresholds)
    for (auto b : {ProbabilityBound::point_estimate, ProbabilityBound::wilson_upper, ProbabilityBound::wilson_lower})
      if (const auto m = largest_within(realizations, th, b, z)) k = std::max(k, std::min(realizations, *m + 1));
  return k;
}

AllowableFactor allowable_factor(const std::vector<SlipFactorCurve>& curves, double threshold, ProbabilityBound bound,
                                 double z, std::optional<ProbabilityBound> left_apart_by) {
  const ProbabilityBound apart = left_apart_by.value_or(bound);
  if (curves.empty()) throw InputError("fault segments", "(none)", "at least one segment's curve");
  if (!(threshold > 0.0 && threshold < 1.0))
    throw InputError("threshold", std::to_string(threshold), "a probability in (0, 1)");
  AllowableFactor out;
  out.limit = kInf;
  for (std::size_t s = 0; s < curves.size(); ++s) {
    if (segment_limit(curves[s], threshold, apart, z) == 0.0) {
      out.reached_without.push_back(s);
      continue;
    }
    const double lim = segment_limit(curves[s], threshold, bound, z);
    if (lim < out.limit) {
      out.limit = lim;
      out.binding = s;
    }
  }
  out.largest = std::isinf(out.limit) ? kInf : std::nextafter(out.limit, 0.0);
  return out;
}

}  // namespace slipscreen::probabilistic

namespace slipscreen::probabilistic {

double curve_end(const std::vector<SlipFactorCurve>& curves, const std::vector<double>& thresholds, double z,
                 double f_max) {
  double end = 2.0;
  for (double th : thresholds) {
    const double w = allowable_factor(curves, th, ProbabilityBound::wilson_upper, z).limit;
    const double pt =
        allowable_factor(curves, th, ProbabilityBound::point_estimate, z, ProbabilityBound::wilson_upper).limit;
    for (double f : {w, pt})
      if (!std::isinf(f)) end = std::max(end, 1.5 * f);
  }
  return std::min(end, f_max);
}

}  // namespace slipscreen::probabilistic
