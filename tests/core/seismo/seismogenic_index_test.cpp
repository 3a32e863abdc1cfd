#include "core/seismo/seismogenic_index.hpp"

#include <doctest/doctest.h>

#include <boost/random/mersenne_twister.hpp>
#include <boost/random/poisson_distribution.hpp>
#include <boost/random/uniform_real_distribution.hpp>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("definition and forecast of the seismogenic index") {
  // Shapiro et al. (2010): Σ = log10 N - log10 V + b M. N = 250, V = 25000 m3, b = 1, M = 0:
  // Σ = log10(0.01) = -2 (arithmetic).
  CHECK(seismogenic_index(250.0, 25000.0, 1.0, 0.0) == doctest::Approx(-2.0).epsilon(1e-14));
  // Forecast N(>=M) = V 10^(Σ - b M): Σ = -1, b = 1.2, M = 2.5, V = 1e5 -> 1e5·10^-4 = 10.
  CHECK(expected_event_count(-1.0, 1.2, 2.5, 1e5) == doctest::Approx(10.0).epsilon(1e-13));
  // Poisson P(>=1) = 1 - e^-N: N = 1 -> 0.6321205588 (1 - 1/e); N = 1e-12 -> 1e-12 to full precision.
  CHECK(probability_at_least_one(1.0) == doctest::Approx(0.6321205588285577).epsilon(1e-14));
  CHECK(probability_at_least_one(1e-12) == doctest::Approx(1e-12).epsilon(1e-10));
  CHECK(probability_at_least_one(0.0) == 0.0);
  CHECK_THROWS_AS(expected_event_count(-1.0, 1.0, 2.0, -5.0), InputError);
}

TEST_CASE("volume history interpolation and validation") {
  const VolumeHistory h{{0.0, 10.0, 30.0}, {0.0, 100.0, 100.0}};
  CHECK(cumulative_volume(h, -1.0) == 0.0);
  CHECK(cumulative_volume(h, 5.0) == doctest::Approx(50.0).epsilon(1e-15));
  CHECK(cumulative_volume(h, 20.0) == doctest::Approx(100.0).epsilon(1e-15));
  CHECK(cumulative_volume(h, 99.0) == 100.0);
  CHECK_THROWS_WITH_AS(validate(VolumeHistory{{0.0, 10.0}, {5.0, 1.0}}), doctest::Contains("non-decreasing"), InputError);
  CHECK_THROWS_AS(validate(VolumeHistory{{0.0, 0.0}, {0.0, 1.0}}), InputError);
  CHECK_THROWS_AS(validate(VolumeHistory{{0.0}, {0.0}}), InputError);
}

TEST_CASE("seismogenic index round trip: exact counts") {
  // Generate exactly N = V 10^(Σ - b Mc) events for Σ = -0.7, b = 1.3, Mc = 1.2, V = 2e5 m3:
  // N = 2e5 · 10^(-0.7 - 1.56) = 2e5 · 10^-2.26 = 1099.1 -> use V so that N is 1100 exactly.
  const double sigma = -0.7, b = 1.3, mc = 1.2;
  const double v = 1100.0 / std::pow(10.0, sigma - b * mc);
  const VolumeHistory h{{0.0, 1e6, 2e6}, {0.0, 0.4 * v, v}};
  std::vector<double> t, m;
  for (int i = 0; i < 1100; ++i) {
    t.push_back(1.0 + i * 1800.0);
    m.push_back(mc + 0.1 * (i % 7));
  }
  // Events outside the injection window or below Mc do not count.
  t.push_back(3e6); m.push_back(3.0);
  t.push_back(5e5); m.push_back(1.1);
  const auto f = fit_seismogenic_index(t, m, h, mc, b, 0.05);
  CHECK(f.events == 1100);
  CHECK(f.sigma == doctest::Approx(sigma).epsilon(1e-12));
  CHECK(f.volume == doctest::Approx(v).epsilon(1e-15));
  CHECK(f.sigma_count_se == doctest::Approx(1.0 / (std::numbers::ln10 * std::sqrt(1100.0))).epsilon(1e-14));
  CHECK(f.sigma_b_se == doctest::Approx(1.2 * 0.05).epsilon(1e-14));
}

TEST_CASE("seismogenic index round trip: Poisson counts") {
  // Poisson events from Σ = 0.5, b = 1, Mc = 1: mean 1e4·10^(-0.5) = 3162 per seed. The fitted
  // Σ must lie within 3 counting standard errors (~0.023) of the truth for each seed.
  const double sigma = 0.5, b = 1.0, mc = 1.0, v = 1e4;
  const VolumeHistory h{{0.0, 1e7}, {0.0, v}};
  for (std::uint64_t seed = 1; seed <= 5; ++seed) {
    boost::random::mt19937_64 rng(seed);
    boost::random::poisson_distribution<int> pois(expected_event_count(sigma, b, mc, v));
    boost::random::uniform_real_distribution<double> when(0.0, 1e7);
    const int n = pois(rng);
    std::vector<double> t(static_cast<std::size_t>(n)), m(static_cast<std::size_t>(n), 1.5);
    for (auto& x : t) x = when(rng);
    const auto f = fit_seismogenic_index(t, m, h, mc, b);
    CHECK(std::abs(f.sigma - sigma) < 3.0 * f.sigma_count_se);
  }
}

TEST_CASE("no event above Mc during injection is a clear input error") {
  const VolumeHistory h{{0.0, 10.0}, {0.0, 100.0}};
  const std::vector<double> t = {5.0, 50.0}, m = {0.5, 3.0};
  CHECK_THROWS_WITH_AS(fit_seismogenic_index(t, m, h, 1.0, 1.0), doctest::Contains("at least one event"), InputError);
}

TEST_CASE("a history that does not start at zero: Σ uses the volume injected within the fitted span") {
  // Events are counted from the first history sample (cumulative 1e6 m3) to the last (3e6 m3),
  // so the volume that produced them is 3e6 − 1e6 = 2e6 m3. Independent closed form, Shapiro et
  // al. (2010): Σ = log10 N(>=M) − log10 V + b M, here with N = 200, V = 2e6, b = 1.1, M = Mc = 1.
  const VolumeHistory h{{1e7, 2e7, 4e7}, {1e6, 1.5e6, 3e6}};
  const double mc = 1.0, b = 1.1;
  std::vector<double> t, m;
  for (int i = 0; i < 200; ++i) {
    t.push_back(1e7 + 1e5 * (i + 1));
    m.push_back(mc + 0.1 * (i % 9));
  }
  t.push_back(5e6);  // before the span: not counted
  m.push_back(2.0);
  const auto f = fit_seismogenic_index(t, m, h, mc, b);
  CHECK(f.events == 200);
  CHECK(f.volume == 2e6);
  const double expected = std::log10(200.0) - std::log10(2e6) + b * mc;  // = -2.9
  CHECK(std::abs(f.sigma - expected) < 1e-12);
  // The cumulative volume at the end (3e6) would have made Σ low by log10(3/2) = 0.176.
  CHECK(std::abs((std::log10(200.0) - std::log10(3e6) + b * mc) - f.sigma + std::log10(1.5)) < 1e-12);
  // Forecast: a further 1e6 m3 gives half the events of the fitted span above Mc, 100, and
  // 100 · 10^(−b·1) above M = 2 (the Gutenberg-Richter scaling).
  CHECK(std::abs(expected_event_count(f.sigma, b, mc, 1e6) - 100.0) < 1e-9);
  CHECK(std::abs(expected_event_count(f.sigma, b, 2.0, 1e6) - 100.0 * std::pow(10.0, -b)) < 1e-9);
  // No volume injected within the span: a clear input error, not an infinite Σ.
  const VolumeHistory flat{{1e7, 4e7}, {1e6, 1e6}};
  CHECK_THROWS_WITH_AS(fit_seismogenic_index(t, m, flat, mc, b), doctest::Contains("a positive volume"), InputError);
}
