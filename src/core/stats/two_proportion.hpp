#pragma once
// Is the difference between two Monte Carlo probabilities more than sampling noise?
//
// Source: the pooled two-sample z test for proportions, e.g. Fleiss, Levin & Paik (2003),
//   Statistical Methods for Rates and Proportions, 3rd ed., ch. 3, the fourfold table (chapter
//   from memory), without the continuity correction: z = (p2 − p1) / √( p̄ (1 − p̄) (1/n1 + 1/n2) ), p̄ = (n1 p1 + n2 p2)/(n1 + n2).
//   z² equals Pearson's χ² of the 2×2 table (the identity the test file checks with scipy).
//
// Symbol table (code name -> Fleiss et al. 2003):
//   p_old, n_old   p1, n1   estimate and realizations of the earlier run
//   p_new, n_new   p2, n2   estimate and realizations of the later run
//   pooled         p̄        the common proportion under the null hypothesis p1 = p2
//   z              z        the test statistic; |z| > z_crit rejects p1 = p2
//
// Domain and accuracy: p in [0, 1], n ≥ 1 (InputError otherwise); closed form, a few ulp.
// The normal approximation assumes the two samples independent and n p̄, n (1 − p̄) not small
// (common practice: at least 5 each); docs/compare.md states what that means for two runs.
#include <cstdint>

namespace slipscreen::stats {

struct TwoProportionTest {
  double change = 0.0;   // p_new − p_old
  double pooled = 0.0;   // p̄
  double z = 0.0;        // 0 when p̄ is 0 or 1 (both estimates equal: no evidence of a change)
  bool exceeds_noise = false;  // |z| > z_crit
};

// The pooled two-proportion z test at the two-sided critical value z_crit (> 0; kZ95 of
// wilson_interval.hpp for 95 %). When both estimates are 0 (or both 1) the standard error is 0
// and the difference is 0: z = 0 and the change never exceeds the noise.
TwoProportionTest two_proportion_test(double p_old, std::uint64_t n_old, double p_new, std::uint64_t n_new,
                                      double z_crit);

}  // namespace slipscreen::stats
