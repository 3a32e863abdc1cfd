#include "core/probabilistic/allowable_factor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
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

SlipFactorCurve::SlipFactorCurve(std::vector<double> f_crit, std::uint64_t realizations)
    : sorted_(std::move(f_crit)), n_(realizations) {
  if (n_ == 0) throw InputError("realizations", "0", "at least one realization");
  if (sorted_.size() > n_)
    throw InputError("critical factors", std::to_string(sorted_.size()),
                     "at most one per realization (" + std::to_string(n_) + ")");
  for (double f : sorted_)
    if (!(f >= 0.0)) throw InputError("critical factor", std::to_string(f), "a factor >= 0 or +infinity");
  std::sort(sorted_.begin(), sorted_.end());
}

std::uint64_t SlipFactorCurve::slipped(double f) const {
  return static_cast<std::uint64_t>(std::upper_bound(sorted_.begin(), sorted_.end(), f) - sorted_.begin());
}

void SlipFactorCurve::merge(const SlipFactorCurve& other) {
  std::vector<double> both(sorted_.size() + other.sorted_.size());
  std::merge(sorted_.begin(), sorted_.end(), other.sorted_.begin(), other.sorted_.end(), both.begin());
  sorted_ = std::move(both);
  n_ += other.n_;
}

double segment_limit(const SlipFactorCurve& curve, double threshold, ProbabilityBound bound, double z) {
  const std::uint64_t n = curve.realizations();
  // The largest count m within the threshold (the bound increases with the count): a binary
  // search over [0, N]; none when 0 slips already exceed it.
  if (!within(0, n, threshold, bound, z)) return 0.0;
  std::uint64_t lo = 0, hi = n;  // within(lo) holds; find the largest such
  while (lo < hi) {
    const std::uint64_t mid = lo + (hi - lo + 1) / 2;
    if (within(mid, n, threshold, bound, z)) lo = mid;
    else hi = mid - 1;
  }
  // P exceeds the threshold once more than `lo` realizations slip: at the (lo + 1)-th step.
  const auto& steps = curve.steps();
  if (lo >= steps.size()) return kInf;
  return steps[static_cast<std::size_t>(lo)];
}

AllowableFactor allowable_factor(const std::vector<SlipFactorCurve>& curves, double threshold, ProbabilityBound bound,
                                 double z) {
  if (curves.empty()) throw InputError("fault segments", "(none)", "at least one segment's curve");
  if (!(threshold > 0.0 && threshold < 1.0))
    throw InputError("threshold", std::to_string(threshold), "a probability in (0, 1)");
  AllowableFactor out;
  out.limit = kInf;
  for (std::size_t s = 0; s < curves.size(); ++s) {
    const double lim = segment_limit(curves[s], threshold, bound, z);
    if (lim == 0.0) out.reached_without.push_back(s);
    else if (lim < out.limit) {
      out.limit = lim;
      out.binding = s;
    }
  }
  out.largest = std::isinf(out.limit) ? kInf : std::nextafter(out.limit, 0.0);
  return out;
}

}  // namespace slipscreen::probabilistic
