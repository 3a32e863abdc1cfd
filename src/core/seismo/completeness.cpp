#include "core/seismo/completeness.hpp"

#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::seismo {
namespace {

void check_bin_width(double bin_width) {
  if (!(bin_width > 0.0) || !std::isfinite(bin_width))
    throw InputError("bin width", std::to_string(bin_width), "a positive magnitude bin width such as 0.1");
}

long bin_index(double magnitude, double bin_width) {
  if (!std::isfinite(magnitude))
    throw InputError("magnitude", std::to_string(magnitude), "a finite magnitude");
  const double q = magnitude / bin_width;
  // Nudge by a relative 1e-9 away from zero so decimal inputs on a half-bin edge round up.
  return std::lround(q + std::copysign(1e-9, q));
}

}  // namespace

double bin_centre(double magnitude, double bin_width) {
  check_bin_width(bin_width);
  return static_cast<double>(bin_index(magnitude, bin_width)) * bin_width;
}

std::vector<MagnitudeBin> frequency_magnitude_distribution(std::span<const double> magnitudes,
                                                           double bin_width) {
  check_bin_width(bin_width);
  std::vector<MagnitudeBin> bins;
  if (magnitudes.empty()) return bins;
  std::vector<long> idx;
  idx.reserve(magnitudes.size());
  long lo = 0, hi = 0;
  for (std::size_t i = 0; i < magnitudes.size(); ++i) {
    const long k = bin_index(magnitudes[i], bin_width);
    idx.push_back(k);
    if (i == 0 || k < lo) lo = k;
    if (i == 0 || k > hi) hi = k;
  }
  bins.resize(static_cast<std::size_t>(hi - lo + 1));
  for (std::size_t j = 0; j < bins.size(); ++j)
    bins[j].centre = static_cast<double>(lo + static_cast<long>(j)) * bin_width;
  for (long k : idx) ++bins[static_cast<std::size_t>(k - lo)].count;
  return bins;
}

Completeness maximum_curvature(std::span<const double> magnitudes, double bin_width,
                               double correction) {
  if (magnitudes.empty())
    throw InputError("catalog", "0 events", "at least one event to estimate the magnitude of completeness");
  if (!std::isfinite(correction))
    throw InputError("Mc correction", std::to_string(correction), "a finite magnitude increment such as 0.2");
  const auto bins = frequency_magnitude_distribution(magnitudes, bin_width);
  std::size_t best = 0;
  for (std::size_t j = 1; j < bins.size(); ++j)
    if (bins[j].count > bins[best].count) best = j;  // strict: ties keep the lowest magnitude
  Completeness c;
  c.mc_curvature = bins[best].centre;
  c.correction = correction;
  c.mc = c.mc_curvature + correction;
  c.modal_count = bins[best].count;
  c.events = magnitudes.size();
  return c;
}

}  // namespace slipscreen::seismo
