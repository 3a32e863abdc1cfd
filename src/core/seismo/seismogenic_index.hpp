#pragma once
// Seismogenic index Σ: fit from a catalog and an injected-volume history, and forecasts.
//
// Source: Shapiro, S. A., Dinske, C., Langenbruch, C. & Wenzel, F. (2010), "Seismogenic index
//   and magnitude probability of earthquakes induced during reservoir fluid stimulations",
//   The Leading Edge 29(3), 304-309:
//     log10 N(>=M, t) = Σ + log10 V(t) - b M          (during injection)
//   The number of events is a Poisson process, so P(at least one event >= M) = 1 - exp(-N).
//
// Symbol table (code -> paper):
//   sigma          Σ        seismogenic index (dimensionless; V in m³)
//   volume         V(t)     cumulative injected fluid volume, m³
//   count          N(>=M)   number of events at or above magnitude M
//   b              b        Gutenberg-Richter b-value
//   magnitude      M        magnitude threshold (Mc when fitting)
//
// Estimator: with events at or above Mc following a Poisson process whose mean is
// V(t)·10^(Σ - b Mc), the maximum-likelihood estimate from the count n observed while the
// volume V_obs was injected is Σ = log10(n / V_obs) + b Mc. The count and the volume cover the
// same span: n counts the events within [first, last] history sample and V_obs is the volume
// injected within it, V(last) − V(first) — not the cumulative V(last), which would also count
// the volume injected before the span when the history does not start at zero. Its standard
// error from the count alone is 1/(ln10 · sqrt(n)); the b uncertainty adds Mc·σ_b (both given
// separately).
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::seismo {

// Cumulative injected volume V(t) as a piecewise-linear curve through (time, volume) samples:
// times in s on any fixed axis (the catalog's epoch seconds, say), strictly increasing;
// volumes in m³, non-decreasing (net injection; back-flow is outside the model). Before the
// first sample V is 0 (the first sample is the start of injection, usually with volume 0),
// after the last it stays at the last value. A history may also start later, at the
// cumulative volume injected by then (a catalog reviewed from a date after injection began):
// the fit then uses only the volume injected from the first sample on.
struct VolumeHistory {
  std::vector<double> time;    // s
  std::vector<double> volume;  // m³, cumulative
};

// Throws InputError unless the history has >= 2 samples, increasing times, finite
// non-decreasing non-negative volumes and a positive final volume.
void validate(const VolumeHistory& h);

// V(t) by linear interpolation (0 before the first sample). Exact for the piecewise-linear curve.
double cumulative_volume(const VolumeHistory& h, double t);

// Σ from its definition, given a count N(>=M), a volume V (m³) and b. Requires N > 0, V > 0.
double seismogenic_index(double count, double volume, double b, double magnitude);

struct SeismogenicIndexFit {
  double sigma = 0.0;            // Σ
  double sigma_count_se = 0.0;   // 1/(ln10 sqrt(n)): Poisson counting error of Σ
  double sigma_b_se = 0.0;       // Mc·σ_b: the part carried by the b uncertainty
  std::size_t events = 0;        // n: events >= Mc inside the injection window
  double volume = 0.0;           // V_obs, m³: volume injected within the window, V(end) − V(start)
  double window_start = 0.0;     // s: first history sample
  double window_end = 0.0;       // s: last history sample
  double mc = 0.0, b = 0.0;
};

// Fit Σ from event times and magnitudes (same time axis as the history): events at or above
// Mc (relative tolerance 1e-9) with times inside [first, last] history sample are counted,
// against the volume injected between those samples. Valid domain: injection-period
// seismicity (Shapiro et al. 2010 do not cover post-shut-in events); n >= 1 (else InputError
// "no event at or above Mc during injection"); a positive volume injected within the window
// (else InputError). Accuracy: the MLE; its counting error is sigma_count_se (large for small n).
SeismogenicIndexFit fit_seismogenic_index(std::span<const double> event_times,
                                          std::span<const double> magnitudes,
                                          const VolumeHistory& history, double mc, double b,
                                          double b_sigma = 0.0);

// Expected number of events at or above `magnitude` for a further injected volume (m³):
// N = V · 10^(Σ - b M). Valid: volume >= 0. Exact for the model.
double expected_event_count(double sigma, double b, double magnitude, double volume);

// Poisson probability of at least one event: 1 - exp(-N), computed as -expm1(-N) so that small
// N keep full relative precision. Valid: N >= 0. Accurate to rounding.
double probability_at_least_one(double expected_count);

}  // namespace slipscreen::seismo
