#pragma once
// Gutenberg-Richter b-value by maximum likelihood, its uncertainty, and a bootstrap interval.
//
// Sources:
//   Aki, K. (1965), "Maximum likelihood estimate of b in the formula log N = a - bM and its
//     confidence limits", Bull. Earthq. Res. Inst. Tokyo Univ. 43, 237-239:  b = log10(e) / (M̄ - Mmin).
//   Utsu, T. (1965/1966) binning correction for magnitudes rounded to ΔM:
//     b = log10(e) / (M̄ - (Mc - ΔM/2)).
//   Shi, Y. & Bolt, B. A. (1982), "The standard error of the magnitude-frequency b value",
//     BSSA 72(5), 1677-1687:  σ_b = 2.30 b² sqrt( Σ(M_i - M̄)² / (n(n-1)) ).
//   Efron, B. (1979), "Bootstrap methods: another look at the jackknife", Ann. Stat. 7(1):
//     percentile interval of b over resamples with replacement.
//
// Symbol table (code -> paper):
//   magnitudes    M_i       event magnitudes (only M_i >= Mc are used)
//   mc            Mc        magnitude of completeness (a bin centre)
//   bin_width     ΔM        magnitude rounding interval (0 for unrounded magnitudes)
//   mean          M̄         mean magnitude of the events used
//   n             n         number of events used
//   b             b         Gutenberg-Richter b-value
//   sigma         σ_b       Shi & Bolt (1982) standard error
//   a             a         Gutenberg-Richter a-value for the sample: log10 N(>=Mc) + b Mc
#include <cstddef>
#include <cstdint>
#include <span>

namespace slipscreen::seismo {

// Aki (1965) with Utsu's correction: log10(e) / (mean - (mc - bin_width/2)).
// Valid domain: mean > mc - bin_width/2 (else InputError). Exact arithmetic.
double aki_utsu_b(double mean_magnitude, double mc, double bin_width);

// Shi & Bolt (1982): 2.30 b² sqrt(sum_sq_dev / (n (n-1))), n >= 2 (else InputError).
double shi_bolt_sigma(double b, double sum_squared_deviation, std::size_t n);

struct BValueEstimate {
  double b = 0.0;
  double sigma = 0.0;       // Shi & Bolt standard error
  double a = 0.0;           // log10 N(>=Mc) + b Mc
  double mean = 0.0;        // M̄ of the events used
  double mc = 0.0;
  double bin_width = 0.0;
  std::size_t n = 0;        // events with M >= Mc
};

// Maximum-likelihood b-value of the magnitudes at or above mc (a relative tolerance of
// 1e-9 ΔM admits magnitudes stored as 1.9999999 for Mc = 2.0).
// Valid domain: n >= 2 events at or above Mc, not all of them equal to Mc - ΔM/2; otherwise
// InputError naming the count ("no event above Mc" is reported this way, never as NaN).
// Accuracy: the MLE has a relative bias of about 1/n and a relative standard error of about
// 1/sqrt(n) (Aki 1965); σ_b estimates the latter.
BValueEstimate b_value(std::span<const double> magnitudes, double mc, double bin_width);

struct BootstrapInterval {
  double lower = 0.0;       // percentile bounds of b over the resamples
  double upper = 0.0;
  double median = 0.0;
  double confidence = 0.0;  // e.g. 0.95
  std::size_t resamples = 0;
  std::uint64_t seed = 0;
};

// Percentile bootstrap of the b-value with Mc held fixed: `resamples` samples of size n drawn
// with replacement from the events at or above Mc, by a boost::random::mt19937_64 stream seeded
// with `seed` (same seed -> same interval on every platform). With ΔM > 0 every resample has a
// finite b (all used magnitudes exceed Mc - ΔM/2); with ΔM = 0 a resample made only of events
// at exactly Mc has no finite b and raises InputError. Percentiles by linear interpolation between order statistics
// (Hyndman & Fan 1996 type 7). Valid domain: as b_value, 10 <= resamples <= 1e6,
// 0 < confidence < 1. Accuracy: Monte Carlo error of the bounds ~ 1/sqrt(resamples).
BootstrapInterval bootstrap_b_value(std::span<const double> magnitudes, double mc, double bin_width,
                                    std::size_t resamples, double confidence, std::uint64_t seed);

}  // namespace slipscreen::seismo
