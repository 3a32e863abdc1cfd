#include "core/stats/weighted_sketch.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <random>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::stats;

TEST_CASE("QuantileSketch::add(x, n) is n single adds") {
  QuantileSketch a, b;
  for (double x : {1.0, -2.5, 0.0, 7e6}) {
    a.add(x, 3);
    for (int k = 0; k < 3; ++k) b.add(x);
  }
  CHECK(a == b);
  CHECK_THROWS_AS(a.add(1.0, 0), InputError);
}

TEST_CASE("WeightedSketch: equal weights give the unweighted percentiles exactly") {
  std::mt19937_64 rng(5);
  std::lognormal_distribution<double> d(13.0, 1.0);  // Δp-like values, ~0.4 MPa (fictional)
  for (std::size_t n : {1u, 2u, 99u, 100u, 101u, 130u, 1000u}) {
    QuantileSketch plain;
    WeightedSketch weighted;
    const std::uint64_t u = (std::uint64_t{1} << 52) / n;
    for (std::size_t i = 0; i < n; ++i) {
      const double x = d(rng);
      plain.add(x);
      weighted.add(x, u);
    }
    CAPTURE(n);
    for (double q : {0.05, 0.25, 0.5, 0.95, 0.99}) CHECK(weighted.quantile(q) == plain.quantile(q));
  }
}

TEST_CASE("WeightedSketch: within α of the exact weighted percentile, and merges exactly") {
  std::mt19937_64 rng(9);
  std::normal_distribution<double> d(1e6, 4e5);
  std::uniform_int_distribution<std::uint64_t> w(0, 1000000);
  std::vector<double> x;
  std::vector<std::uint64_t> units;
  WeightedSketch all, left, right;
  for (int i = 0; i < 3000; ++i) {
    x.push_back(d(rng));
    units.push_back(w(rng));
    all.add(x.back(), units.back());
    (i < 1300 ? left : right).add(x.back(), units.back());
  }
  left.merge(right);
  CHECK(left == all);  // integer weights: merging is exact
  for (double q : {0.05, 0.5, 0.95}) {
    const double exact = weighted_percentile(x, units, q);
    // DDSketch relative accuracy α = 0.01 (QuantileSketch default), of the value so selected.
    CHECK(std::abs(all.quantile(q) - exact) <= 0.01 * std::abs(exact) * (1 + 1e-12));
  }
  CHECK(WeightedSketch::decode(all.encode()) == all);
}

TEST_CASE("weighted_percentile: a weight concentrated on one value selects it") {
  const std::vector<double> x{5.0, 1.0, 3.0, 2.0};
  const std::vector<std::uint64_t> u{0, 0, 100, 0};
  for (double q : {0.05, 0.5, 0.95}) CHECK(weighted_percentile(x, u, q) == 3.0);
  // Equal weights: the value of rank ⌊q(n − 1)⌋ of the sorted sample {1, 2, 3, 5}.
  const std::vector<std::uint64_t> ones(4, 1);
  CHECK(weighted_percentile(x, ones, 0.5) == 2.0);   // rank ⌊1.5⌋ = 1
  CHECK(weighted_percentile(x, ones, 0.95) == 3.0);  // rank ⌊2.85⌋ = 2
  CHECK_THROWS_AS(weighted_percentile(x, std::vector<std::uint64_t>(4, 0), 0.5), InputError);
}
