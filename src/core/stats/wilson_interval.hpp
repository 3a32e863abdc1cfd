#pragma once
// Confidence intervals for a probability estimated as a fraction of realizations.
//
// Sources:
//   Score interval: Wilson (1927), J. Am. Stat. Assoc. 22:209-212; in the form of
//     Newcombe (1998), Statistics in Medicine 17:857-872, method 3:
//     (2np + z² ± z √(z² + 4np(1−p))) / (2(n + z²)).
//   Standard error of a proportion √(p(1−p)/n): binomial variance (any textbook, e.g.
//     Agresti & Coull 1998, Am. Stat. 52:119).
//
// Symbol table (code name -> Newcombe 1998):
//   successes  r   realizations in which the event happened (e.g. the segment slipped)
//   trials     n   realizations
//   p          p = r/n, the point estimate
//   z          z   standard normal quantile 1 − α/2 (1.959963984540054 for 95 %)
#include <cstdint>

namespace slipscreen::stats {

// z for a two-sided 95 % interval: Φ⁻¹(0.975) (Boost.Math; 1.959963984540054).
inline constexpr double kZ95 = 1.959963984540054;

struct ProportionInterval {
  double estimate = 0.0;  // p = r/n
  double lower = 0.0;
  double upper = 0.0;
};

// Wilson score interval for r successes in n trials with normal quantile z (> 0).
// Requires n ≥ 1 and r ≤ n (InputError otherwise). The bounds lie in [0, 1]; they are exactly
// 0 for r = 0 and exactly 1 for r = n. Accuracy: a few ulp (closed form).
ProportionInterval wilson_interval(std::uint64_t successes, std::uint64_t trials, double z = kZ95);

// z = Φ⁻¹((1 + level)/2) for a two-sided confidence level in (0, 1), e.g. 0.95 -> 1.95996.
double z_for_confidence(double level);

// Monte Carlo standard error of the proportion, √(p(1−p)/n). Requires n ≥ 1, r ≤ n.
double proportion_standard_error(std::uint64_t successes, std::uint64_t trials);

}  // namespace slipscreen::stats
