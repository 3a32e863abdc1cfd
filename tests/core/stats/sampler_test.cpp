#include "core/stats/sampler.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "core/errors.hpp"
#include "core/stats/random_stream.hpp"
#include "core/stats/wilson_interval.hpp"

using namespace slipscreen;
using stats::Distribution;
using stats::RealizationCount;
using stats::Sampler;
using stats::SamplingMethod;
using stats::UncertainInput;

namespace {
std::vector<UncertainInput> five_inputs() {
  return {{"friction", Distribution::normal(0.6, 0.05)},
          {"permeability", Distribution::lognormal(1e-14, 0.8)},
          {"shmin_gradient", Distribution::uniform(15e3, 18e3)},
          {"cohesion", Distribution::fixed(0.0)},
          {"strike_perturbation", Distribution::triangular(-0.1, 0.0, 0.1)}};
}
}  // namespace

TEST_CASE("Latin hypercube: each of the N strata is hit exactly once per input") {
  // McKay, Beckman & Conover (1979): with N realizations each input's range (in u) is cut into
  // N equal strata and every stratum holds exactly one realization.
  for (std::int64_t n : {1, 2, 7, 1000}) {
    CAPTURE(n);
    const Sampler s(five_inputs(), SamplingMethod::latin_hypercube, 12345, RealizationCount(n));
    const auto N = static_cast<std::size_t>(n);
    std::vector<std::vector<int>> hits(s.input_count(), std::vector<int>(N, 0));
    std::vector<double> u(s.input_count());
    for (std::uint64_t i = 0; i < N; ++i) {
      s.uniforms(i, u);
      for (std::size_t j = 0; j < u.size(); ++j) {
        REQUIRE(u[j] > 0.0);
        REQUIRE(u[j] < 1.0);
        const auto k = static_cast<std::size_t>(std::floor(u[j] * static_cast<double>(N)));
        REQUIRE(k < N);
        CHECK(k == s.stratum(j, i));
        ++hits[j][k];
      }
    }
    for (const auto& h : hits) CHECK(std::all_of(h.begin(), h.end(), [](int c) { return c == 1; }));
  }
}

TEST_CASE("Latin hypercube: permutations differ between inputs and depend on (seed, input) alone") {
  const Sampler a(five_inputs(), SamplingMethod::latin_hypercube, 1, RealizationCount(500));
  const Sampler b(five_inputs(), SamplingMethod::latin_hypercube, 1, RealizationCount(500));
  const Sampler c(five_inputs(), SamplingMethod::latin_hypercube, 2, RealizationCount(500));
  int same_ab = 0, same_ac = 0, same_01 = 0;
  for (std::uint64_t i = 0; i < 500; ++i) {
    same_ab += a.stratum(0, i) == b.stratum(0, i);
    same_ac += a.stratum(0, i) == c.stratum(0, i);
    same_01 += a.stratum(0, i) == a.stratum(1, i);
  }
  CHECK(same_ab == 500);  // two "processes" build the same permutation
  // Two independent random permutations agree at Poisson(1) many places; < 10 with
  // probability 1 − 1e-7.
  CHECK(same_ac < 10);
  CHECK(same_01 < 10);
}

TEST_CASE("any subset of realizations, in any order, gives the same draws") {
  for (const auto method : {SamplingMethod::monte_carlo, SamplingMethod::latin_hypercube}) {
    const Sampler whole(five_inputs(), method, 777, RealizationCount(300));
    const Sampler other(five_inputs(), method, 777, RealizationCount(300));  // another process
    std::vector<std::vector<double>> forward;
    for (std::uint64_t i = 0; i < 300; ++i) forward.push_back(whole.draw(i));
    std::vector<std::vector<double>> parallel(300);
#pragma omp parallel for num_threads(2) schedule(dynamic, 3)
    for (int r = 0; r < 300; ++r) {
      const auto i = static_cast<std::uint64_t>(299 - r);
      parallel[i] = other.draw(i);
    }
    CHECK(forward == parallel);
  }
}

TEST_CASE("Monte Carlo draws are the realization stream's uniforms through each quantile") {
  const Sampler s(five_inputs(), SamplingMethod::monte_carlo, 31, RealizationCount(10));
  for (std::uint64_t i = 0; i < 10; ++i) {
    stats::RandomStream stream(31, i, stats::StreamPurpose::realization);
    const std::vector<double> x = s.draw(i);
    for (std::size_t j = 0; j < x.size(); ++j) CHECK(x[j] == s.inputs()[j].distribution.quantile(stream.uniform()));
  }
}

TEST_CASE("a fixed input still consumes its draw, so the other inputs do not shift") {
  auto inputs = five_inputs();
  const Sampler with_fixed(inputs, SamplingMethod::latin_hypercube, 4, RealizationCount(50));
  inputs[3].distribution = Distribution::uniform(0.0, 1e6);  // cohesion now uncertain
  const Sampler with_uncertain(inputs, SamplingMethod::latin_hypercube, 4, RealizationCount(50));
  for (std::uint64_t i = 0; i < 50; ++i) {
    const auto a = with_fixed.draw(i), b = with_uncertain.draw(i);
    CHECK(a[3] == 0.0);
    for (std::size_t j : {0u, 1u, 2u, 4u}) CHECK(a[j] == b[j]);
  }
}

TEST_CASE("Latin hypercube estimates a mean more closely than the stratum width") {
  // Stratification leaves only within-stratum variation: for a uniform(0, 1) input the sample
  // mean of N LHS points differs from 1/2 by less than 1/(2N) (each point within its stratum,
  // and the stratum midpoints average exactly 1/2), whereas Monte Carlo's sd is √(1/(12N)).
  constexpr std::int64_t n = 1000;
  const Sampler s({{"u", Distribution::uniform(0.0, 1.0)}}, SamplingMethod::latin_hypercube, 8, RealizationCount(n));
  double sum = 0.0;
  for (std::uint64_t i = 0; i < n; ++i) sum += s.draw(i)[0];
  CHECK(std::abs(sum / n - 0.5) < 0.5 / n);
}

TEST_CASE("the descriptor records what the manifest needs") {
  const Sampler s(five_inputs(), SamplingMethod::latin_hypercube, 2026, RealizationCount(64));
  CHECK(s.descriptor().method == SamplingMethod::latin_hypercube);
  CHECK(s.descriptor().seed == 2026);
  CHECK(s.descriptor().realizations == 64);
  CHECK(s.descriptor().inputs == 5);
  CHECK(s.descriptor().stream == stats::kStreamVersion);
  CHECK(stats::sampling_method_name(SamplingMethod::latin_hypercube) == "latin-hypercube");
  CHECK(stats::parse_sampling_method("LHS") == SamplingMethod::latin_hypercube);
  CHECK(stats::parse_sampling_method("monte-carlo") == SamplingMethod::monte_carlo);
}

TEST_CASE("bad sampler input is a clear error") {
  CHECK_THROWS_WITH_AS(RealizationCount(0),
                       "field 'realizations' = '0': expected a whole number of realizations from 1 to 100000000",
                       InputError);
  CHECK_THROWS_AS(RealizationCount(-5), InputError);
  CHECK_THROWS_AS(RealizationCount(100'000'001), InputError);
  CHECK(RealizationCount(1).value() == 1);
  CHECK_THROWS_WITH_AS(stats::parse_sampling_method("latin-hypercub"), doctest::Contains("did you mean 'latin-hypercube'"),
                       InputError);
  CHECK_THROWS_WITH_AS(Sampler({{"mu", Distribution::fixed(0.6)}, {"mu", Distribution::fixed(0.7)}},
                               SamplingMethod::monte_carlo, 1, RealizationCount(3)),
                       doctest::Contains("given twice"), InputError);
  const Sampler s(five_inputs(), SamplingMethod::monte_carlo, 1, RealizationCount(3));
  CHECK_THROWS_AS(s.draw(3), InputError);
  std::vector<double> wrong(2);
  CHECK_THROWS_AS(s.draw(0, wrong), InputError);
  CHECK_THROWS_AS(s.stratum(0, 0), InputError);  // Monte Carlo has no strata
}

TEST_CASE("Latin hypercube: the k-th smallest value lies in the k-th probability stratum") {
  // Stratification in value space (McKay et al. 1979): sorted, the N values x_(k) satisfy
  // F⁻¹(k/N) ≤ x_(k) ≤ F⁻¹((k+1)/N), since F⁻¹ is increasing and each stratum holds one point.
  constexpr std::int64_t n = 400;
  const Distribution d = Distribution::lognormal(1e-14, 0.8);
  const Sampler s({{"k", d}}, SamplingMethod::latin_hypercube, 55, RealizationCount(n));
  std::vector<double> x;
  for (std::uint64_t i = 0; i < n; ++i) x.push_back(s.draw(i)[0]);
  std::sort(x.begin(), x.end());
  for (std::int64_t k = 0; k < n; ++k) {
    const double lo = k == 0 ? 0.0 : d.quantile(static_cast<double>(k) / n);
    const double hi = k == n - 1 ? std::numeric_limits<double>::infinity() : d.quantile((k + 1.0) / n);
    CAPTURE(k);
    CHECK(x[static_cast<std::size_t>(k)] >= lo * (1 - 1e-14));
    CHECK(x[static_cast<std::size_t>(k)] <= hi * (1 + 1e-14));
  }
}

TEST_CASE("a closed-form probability is recovered within its Wilson interval") {
  // P(X < 0.55) for X ~ normal(0.6, 0.05) is Φ(−1) = 0.15865525393145707 (scipy.stats.norm.cdf(-1)).
  // With 20000 realizations the 99.9 % Wilson interval (z = 3.2905267314919255, scipy
  // norm.ppf(0.9995)) must hold it — for both samplers (the seed is fixed: deterministic).
  for (const auto method : {SamplingMethod::monte_carlo, SamplingMethod::latin_hypercube}) {
    constexpr std::int64_t n = 20000;
    const Sampler s({{"friction", Distribution::normal(0.6, 0.05)}}, method, 9, RealizationCount(n));
    std::uint64_t below = 0;
    for (std::uint64_t i = 0; i < n; ++i) below += s.draw(i)[0] < 0.55;
    const auto ci = stats::wilson_interval(below, n, 3.2905267314919255);
    CAPTURE(stats::sampling_method_name(method));
    CHECK(ci.lower <= 0.15865525393145707);
    CHECK(0.15865525393145707 <= ci.upper);
    // LHS: the count below the 0.15865…-quantile is fixed by the strata up to one stratum:
    // ⌊N·p⌋ or ⌈N·p⌉ (N·p = 3173.1).
    if (method == SamplingMethod::latin_hypercube) CHECK((below == 3173 || below == 3174));
  }
}
