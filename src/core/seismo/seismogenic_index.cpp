#include "core/seismo/seismogenic_index.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
void validate(const VolumeHistory& h) {
  if (h.time.size() != h.volume.size())
    throw InputError("volume history", std::to_string(h.time.size()) + " times, " + std::to_string(h.volume.size()) + " volumes",
                     "one volume per time");
  if (h.time.size() < 2)
    throw InputError("volume history", std::to_string(h.time.size()) + " samples", "at least 2 (start and end of injection)");
  for (std::size_t i = 0; i < h.time.size(); ++i) {
    const std::string where = "sample " + std::to_string(i + 1);
    if (!std::isfinite(h.time[i])) throw InputError("time", util::number_text(h.time[i], 6), "a finite time").located(where);
    if (!std::isfinite(h.volume[i]) || h.volume[i] < 0.0)
      throw InputError("cumulative volume", util::number_text(h.volume[i], 6), "a finite volume >= 0 m3").located(where);
    if (i > 0 && !(h.time[i] > h.time[i - 1]))
      throw InputError("time", util::number_text(h.time[i], 6), "times in increasing order").located(where);
    if (i > 0 && h.volume[i] < h.volume[i - 1])
      throw InputError("cumulative volume", util::number_text(h.volume[i], 6),
                       "a non-decreasing cumulative volume (net injection)").located(where);
  }
  if (!(h.volume.back() > 0.0))
    throw InputError("cumulative volume", util::number_text(h.volume.back(), 6), "a positive total injected volume");
}

double cumulative_volume(const VolumeHistory& h, double t) {
  if (h.time.empty() || t < h.time.front()) return 0.0;
  if (t >= h.time.back()) return h.volume.back();
  const auto it = std::upper_bound(h.time.begin(), h.time.end(), t);
  const auto j = static_cast<std::size_t>(it - h.time.begin());  // h.time[j-1] <= t < h.time[j]
  const double w = (t - h.time[j - 1]) / (h.time[j] - h.time[j - 1]);
  return h.volume[j - 1] + w * (h.volume[j] - h.volume[j - 1]);
}

// Shapiro et al. (2010): Σ = log10 N(>=M) - log10 V + b M.
double seismogenic_index(double count, double volume, double b, double magnitude) {
  if (!(count > 0.0)) throw InputError("event count", util::number_text(count, 6), "at least one event");
  if (!(volume > 0.0)) throw InputError("injected volume", util::number_text(volume, 6), "a positive volume in m3");
  return std::log10(count) - std::log10(volume) + b * magnitude;
}

SeismogenicIndexFit fit_seismogenic_index(std::span<const double> event_times,
                                          std::span<const double> magnitudes,
                                          const VolumeHistory& history, double mc, double b,
                                          double b_sigma) {
  if (event_times.size() != magnitudes.size())
    throw InputError("events", std::to_string(event_times.size()) + " times, " + std::to_string(magnitudes.size()) + " magnitudes",
                     "one magnitude per event time");
  validate(history);
  SeismogenicIndexFit f;
  f.window_start = history.time.front();
  f.window_end = history.time.back();
  // The volume injected within the window in which the events are counted (a history may
  // start after injection began, at a cumulative volume above zero).
  f.volume = history.volume.back() - history.volume.front();
  f.mc = mc;
  f.b = b;
  const double tol = 1e-9 * std::max(1.0, std::abs(mc));
  for (std::size_t i = 0; i < event_times.size(); ++i)
    if (magnitudes[i] >= mc - tol && event_times[i] >= f.window_start && event_times[i] <= f.window_end) ++f.events;
  if (f.events == 0)
    throw InputError("events at or above Mc = " + util::number_text(mc, 6) + " during injection", "0",
                     "at least one event to fit the seismogenic index");
  if (!(f.volume > 0.0))
    throw InputError("volume injected from the first to the last history sample", util::number_text(f.volume, 6),
                     "a positive volume in m3 to fit the seismogenic index");
  const double n = static_cast<double>(f.events);
  f.sigma = seismogenic_index(n, f.volume, b, mc);
  f.sigma_count_se = 1.0 / (std::numbers::ln10 * std::sqrt(n));
  f.sigma_b_se = std::abs(mc) * b_sigma;
  return f;
}

// Shapiro et al. (2010): N(>=M) = V 10^(Σ - b M).
double expected_event_count(double sigma, double b, double magnitude, double volume) {
  if (!(volume >= 0.0) || !std::isfinite(volume))
    throw InputError("planned volume", util::number_text(volume, 6), "a finite volume >= 0 m3");
  return volume * std::pow(10.0, sigma - b * magnitude);
}

// Poisson: P(N >= 1) = 1 - exp(-N).
double probability_at_least_one(double expected_count) {
  if (!(expected_count >= 0.0)) throw InputError("expected count", util::number_text(expected_count, 6), "a count >= 0");
  return -std::expm1(-expected_count);
}

}  // namespace slipscreen::seismo
