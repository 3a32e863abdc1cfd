#include "core/seismo/b_value.hpp"

#include <algorithm>
#include <boost/random/mersenne_twister.hpp>
#include <boost/random/uniform_int_distribution.hpp>
#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
namespace {

constexpr double kLog10E = std::numbers::log10e;

std::vector<double> at_or_above(std::span<const double> magnitudes, double mc, double bin_width) {
  if (!std::isfinite(mc)) throw InputError("Mc", std::to_string(mc), "a finite magnitude");
  if (!(bin_width >= 0.0) || !std::isfinite(bin_width))
    throw InputError("bin width", std::to_string(bin_width), "a bin width >= 0 (0 for unrounded magnitudes)");
  const double tol = 1e-9 * std::max(bin_width, 1.0);
  std::vector<double> used;
  for (double m : magnitudes) {
    if (!std::isfinite(m)) throw InputError("magnitude", std::to_string(m), "a finite magnitude");
    if (m >= mc - tol) used.push_back(m);
  }
  return used;
}

struct Moments {
  double mean = 0.0, ssd = 0.0;
};

Moments moments(std::span<const double> m) {
  Moments r;
  for (double x : m) r.mean += x;
  r.mean /= static_cast<double>(m.size());
  for (double x : m) r.ssd += (x - r.mean) * (x - r.mean);
  return r;
}

}  // namespace

// Aki (1965) MLE with Utsu's binning correction.
double aki_utsu_b(double mean_magnitude, double mc, double bin_width) {
  const double denom = mean_magnitude - (mc - bin_width / 2.0);
  if (!(denom > 0.0) || !std::isfinite(denom))
    throw InputError("mean magnitude", util::number_text(mean_magnitude, 6),
                     "a mean above Mc - ΔM/2 = " + util::number_text(mc - bin_width / 2.0, 6) + " (events spread above Mc)");
  return kLog10E / denom;
}

// Shi & Bolt (1982) standard error of b.
double shi_bolt_sigma(double b, double sum_squared_deviation, std::size_t n) {
  if (n < 2) throw InputError("events above Mc", std::to_string(n), "at least 2 events for the Shi & Bolt uncertainty");
  const double nn = static_cast<double>(n);
  return 2.30 * b * b * std::sqrt(sum_squared_deviation / (nn * (nn - 1.0)));
}

BValueEstimate b_value(std::span<const double> magnitudes, double mc, double bin_width) {
  const auto used = at_or_above(magnitudes, mc, bin_width);
  if (used.size() < 2)
    throw InputError("events at or above Mc = " + util::number_text(mc, 6), std::to_string(used.size()),
                     "at least 2 events at or above the magnitude of completeness to estimate b");
  const auto mo = moments(used);
  BValueEstimate e;
  e.n = used.size();
  e.mean = mo.mean;
  e.mc = mc;
  e.bin_width = bin_width;
  e.b = aki_utsu_b(mo.mean, mc, bin_width);
  e.sigma = shi_bolt_sigma(e.b, mo.ssd, e.n);
  e.a = std::log10(static_cast<double>(e.n)) + e.b * mc;
  return e;
}

BootstrapInterval bootstrap_b_value(std::span<const double> magnitudes, double mc, double bin_width,
                                    std::size_t resamples, double confidence, std::uint64_t seed) {
  if (resamples < 10 || resamples > 1000000)
    throw InputError("bootstrap resamples", std::to_string(resamples), "between 10 and 1000000");
  if (!(confidence > 0.0 && confidence < 1.0))
    throw InputError("confidence", util::number_text(confidence, 6), "a fraction between 0 and 1, e.g. 0.95");
  const auto used = at_or_above(magnitudes, mc, bin_width);
  if (used.size() < 2)
    throw InputError("events at or above Mc = " + util::number_text(mc, 6), std::to_string(used.size()),
                     "at least 2 events at or above the magnitude of completeness for a bootstrap");
  boost::random::mt19937_64 rng(seed);
  boost::random::uniform_int_distribution<std::size_t> pick(0, used.size() - 1);
  std::vector<double> bs(resamples);
  for (std::size_t r = 0; r < resamples; ++r) {
    double sum = 0.0;
    for (std::size_t i = 0; i < used.size(); ++i) sum += used[pick(rng)];
    bs[r] = aki_utsu_b(sum / static_cast<double>(used.size()), mc, bin_width);
  }
  std::sort(bs.begin(), bs.end());
  auto quantile = [&](double p) {  // Hyndman & Fan type 7
    const double h = (static_cast<double>(bs.size()) - 1.0) * p;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, bs.size() - 1);
    return bs[lo] + (h - static_cast<double>(lo)) * (bs[hi] - bs[lo]);
  };
  BootstrapInterval out;
  out.lower = quantile((1.0 - confidence) / 2.0);
  out.upper = quantile(1.0 - (1.0 - confidence) / 2.0);
  out.median = quantile(0.5);
  out.confidence = confidence;
  out.resamples = resamples;
  out.seed = seed;
  return out;
}

}  // namespace slipscreen::seismo
