#include "core/stats/wilson_interval.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <boost/math/distributions/normal.hpp>

#include "core/errors.hpp"

namespace slipscreen::stats {
namespace {

void check(std::uint64_t r, std::uint64_t n) {
  if (n == 0) throw InputError("trials", "0", "at least one realization");
  if (r > n)
    throw InputError("successes", std::to_string(r), "at most the number of trials (" + std::to_string(n) + ")");
}

}  // namespace

ProportionInterval wilson_interval(std::uint64_t successes, std::uint64_t trials, double z) {
  check(successes, trials);
  if (!(z > 0.0) || !std::isfinite(z)) throw InputError("z", std::to_string(z), "a positive normal quantile");
  const double n = static_cast<double>(trials);
  const double r = static_cast<double>(successes);
  const double p = r / n;
  // Wilson (1927) in Newcombe's (1998) form: (2np + z² ± z√(z² + 4np(1−p))) / (2(n + z²)),
  // with np = r and np(1−p) = r(n−r)/n.
  const double z2 = z * z;
  const double centre = 2.0 * r + z2;
  const double spread = z * std::sqrt(z2 + 4.0 * r * (n - r) / n);
  const double denom = 2.0 * (n + z2);
  ProportionInterval out;
  out.estimate = p;
  out.lower = successes == 0 ? 0.0 : std::clamp((centre - spread) / denom, 0.0, p);
  out.upper = successes == trials ? 1.0 : std::clamp((centre + spread) / denom, p, 1.0);
  return out;
}

double z_for_confidence(double level) {
  if (!(level > 0.0 && level < 1.0))
    throw InputError("confidence level", std::to_string(level), "a level between 0 and 1, such as 0.95");
  return boost::math::quantile(boost::math::normal_distribution<double>(0.0, 1.0), 0.5 * (1.0 + level));
}

double proportion_standard_error(std::uint64_t successes, std::uint64_t trials) {
  check(successes, trials);
  const double n = static_cast<double>(trials);
  const double p = static_cast<double>(successes) / n;
  return std::sqrt(p * (1.0 - p) / n);
}

}  // namespace slipscreen::stats
