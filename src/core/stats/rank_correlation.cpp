#include "core/stats/rank_correlation.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <string>

#include <boost/math/distributions/students_t.hpp>

#include "core/errors.hpp"

namespace slipscreen::stats {

std::vector<double> average_ranks(std::span<const double> values) {
  const std::size_t n = values.size();
  for (std::size_t i = 0; i < n; ++i)
    if (std::isnan(values[i])) throw InputError("value " + std::to_string(i), "nan", "a number to rank");
  std::vector<std::size_t> order(n);
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
  std::vector<double> ranks(n);
  for (std::size_t first = 0; first < n;) {
    std::size_t last = first + 1;
    while (last < n && values[order[last]] == values[order[first]]) ++last;
    // Positions first..last−1 (0-based) hold ranks first+1..last: their average.
    const double rank = 0.5 * static_cast<double>(first + 1 + last);
    for (std::size_t k = first; k < last; ++k) ranks[order[k]] = rank;
    first = last;
  }
  return ranks;
}

RankCorrelation spearman(std::span<const double> x, std::span<const double> y) {
  if (x.size() != y.size())
    throw InputError("sample sizes", std::to_string(x.size()) + " and " + std::to_string(y.size()), "equal lengths");
  if (x.size() < 2) throw InputError("sample size", std::to_string(x.size()), "at least 2 pairs");
  const std::vector<double> rx = average_ranks(x);
  const std::vector<double> ry = average_ranks(y);
  const std::size_t n = x.size();
  const double mean = 0.5 * static_cast<double>(n + 1);  // mean rank, with or without ties
  double sxy = 0.0, sxx = 0.0, syy = 0.0;
  for (std::size_t i = 0; i < n; ++i) {
    const double dx = rx[i] - mean, dy = ry[i] - mean;
    sxy += dx * dy;
    sxx += dx * dx;
    syy += dy * dy;
  }
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  RankCorrelation out;
  out.n = n;
  if (sxx == 0.0 || syy == 0.0) {
    out.rho = out.t = out.p_value = nan;
    return out;
  }
  // Spearman (1904): Pearson correlation of the (average) ranks.
  out.rho = std::clamp(sxy / std::sqrt(sxx * syy), -1.0, 1.0);
  if (n < 3) {
    out.t = out.p_value = nan;
    return out;
  }
  const double dof = static_cast<double>(n - 2);
  const double one_minus = (1.0 - out.rho) * (1.0 + out.rho);
  if (one_minus <= 0.0) {
    out.t = std::copysign(std::numeric_limits<double>::infinity(), out.rho);
    out.p_value = 0.0;
    return out;
  }
  // t = ρ √((n−2)/(1−ρ²)), two-sided p from Student's t with n−2 dof (Kendall & Gibbons 1990).
  out.t = out.rho * std::sqrt(dof / one_minus);
  const boost::math::students_t_distribution<double> student(dof);
  out.p_value = 2.0 * boost::math::cdf(boost::math::complement(student, std::abs(out.t)));
  return out;
}

}  // namespace slipscreen::stats
