#pragma once
// Spearman rank correlation, for sensitivity tables: how strongly each sampled input drives an
// output (the slip margin) across realizations.
//
// Sources:
//   Spearman (1904), Am. J. Psychol. 15:72-101: ρ = Pearson correlation of the ranks.
//   Ties get the average of the ranks they span (Kendall & Gibbons 1990, Rank Correlation
//     Methods, 5th ed., ch. 3); ρ is then computed as the Pearson correlation of those ranks
//     (the tie-exact form, not 1 − 6Σd²/(n(n²−1)), which holds only without ties).
//   Significance: t = ρ √((n−2)/(1−ρ²)) against Student's t with n−2 degrees of freedom
//     (Kendall & Gibbons 1990; the same test scipy.stats.spearmanr reports), two-sided.
//
// Symbol table (code name -> source):
//   rho        ρ (r_s)  Spearman's rank correlation coefficient
//   n          n        number of pairs (realizations)
//   t          t        Student's t statistic with n − 2 degrees of freedom
//   p_value    p        two-sided probability of |t| this large if ρ = 0
//
// Note for split runs: ranks are global, so ρ is not a mergeable sketch; a split run gathers
// the (input, output) pairs of the realizations (n doubles per input) before computing it.
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::stats {

// Ranks 1..n of the values, ties sharing the average of their ranks. Throws InputError for a
// NaN value. O(n log n).
std::vector<double> average_ranks(std::span<const double> values);

struct RankCorrelation {
  double rho = 0.0;      // in [−1, 1]; NaN when either variable is constant (no ranking)
  std::size_t n = 0;     // pairs used
  double t = 0.0;        // t statistic (±infinity when |ρ| = 1); NaN when n < 3 or ρ is NaN
  double p_value = 0.0;  // two-sided; NaN when n < 3 or ρ is NaN
};

// Spearman ρ of x and y (equal lengths, at least 2 pairs; InputError otherwise).
// Accuracy: ρ to ~1e-15 absolute (double sums of ranks); p-value to Boost.Math's Student t
// accuracy (~1e-15 relative).
RankCorrelation spearman(std::span<const double> x, std::span<const double> y);

}  // namespace slipscreen::stats
