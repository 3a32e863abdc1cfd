#include "core/seismo/event_footprint.hpp"

#include <boost/math/distributions/binomial.hpp>
#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {

double footprint_fraction_at(std::span<const double> times, std::span<const double> fractions, double start,
                             double t) {
  if (times.size() != fractions.size() || times.empty())
    throw InputError("footprint fractions", std::to_string(fractions.size()), "one fraction per time, at least one");
  for (std::size_t k = 0; k < times.size(); ++k) {
    if (!(fractions[k] >= 0.0 && fractions[k] <= 1.0))
      throw InputError("footprint fraction", util::number_text(fractions[k], 6), "a fraction between 0 and 1");
    if (k > 0 && !(times[k] > times[k - 1]))
      throw InputError("footprint times", util::number_text(times[k], 6), "strictly increasing times");
  }
  if (t <= start) return 0.0;
  if (t >= times.back()) return fractions.back();
  double t0 = start, f0 = 0.0;
  for (std::size_t k = 0; k < times.size(); ++k) {
    if (times[k] <= start) {  // samples before the first injection carry no footprint
      t0 = std::max(t0, times[k]);
      continue;
    }
    if (t <= times[k]) return f0 + (fractions[k] - f0) * (t - t0) / (times[k] - t0);
    t0 = times[k];
    f0 = fractions[k];
  }
  return fractions.back();
}

// One-sided binomial test: P(X >= k), X ~ Binomial(n, f).
FootprintCount footprint_count(std::span<const double> dp, double threshold, double area_fraction) {
  if (!(area_fraction >= 0.0 && area_fraction <= 1.0))
    throw InputError("footprint area fraction", util::number_text(area_fraction, 6), "a fraction between 0 and 1");
  if (!std::isfinite(threshold)) throw InputError("pressure threshold", util::number_text(threshold, 6), "a finite pressure");
  FootprintCount c;
  c.events = dp.size();
  c.area_fraction = area_fraction;
  c.threshold = threshold;
  for (std::size_t i = 0; i < dp.size(); ++i) {
    if (!std::isfinite(dp[i]))
      throw InputError("modelled pressure change at event " + std::to_string(i + 1), util::number_text(dp[i], 6), "a finite value");
    if (dp[i] >= threshold) ++c.inside;
  }
  c.expected = static_cast<double>(c.events) * area_fraction;
  if (c.inside == 0 || c.events == 0) {
    c.p_value = 1.0;
  } else if (area_fraction == 0.0) {
    c.p_value = 0.0;  // any event inside a zero-area footprint is impossible by chance
  } else if (area_fraction == 1.0) {
    c.p_value = 1.0;
  } else {
    const boost::math::binomial_distribution<double> bin(static_cast<double>(c.events), area_fraction);
    c.p_value = boost::math::cdf(boost::math::complement(bin, static_cast<double>(c.inside) - 1.0));
  }
  return c;
}

FootprintCount footprint_count(const Catalog& catalog, const PressureAtEvent& pressure, double threshold,
                               double area_fraction) {
  std::vector<double> dp;
  dp.reserve(catalog.events.size());
  for (const auto& e : catalog.events) dp.push_back(pressure(e));
  return footprint_count(dp, threshold, area_fraction);
}

}  // namespace slipscreen::seismo
