#include "core/stats/quantile_sketch.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "core/errors.hpp"
#include "core/stats/distribution.hpp"
#include "core/stats/random_stream.hpp"

using namespace slipscreen;
using stats::QuantileSketch;

namespace {

// Values like Δp_crit across realizations: mostly positive over three decades (Pa), some
// negative (already critical), some exactly zero.
std::vector<double> sample(std::size_t n, std::uint64_t seed) {
  stats::RandomStream s(seed, 0);
  const auto pos = stats::Distribution::lognormal(2e6, 1.2);
  const auto neg = stats::Distribution::lognormal(3e5, 0.9);
  std::vector<double> v(n);
  for (auto& x : v) {
    const double pick = s.uniform(), u = s.uniform();
    x = pick < 0.15 ? -neg.quantile(u) : pick < 0.18 ? 0.0 : pos.quantile(u);
  }
  return v;
}

// The exact value of rank ⌊q(n−1)⌋ (0-based), the quantile definition of Masson et al. (2019).
double exact(std::vector<double> v, double q) {
  std::sort(v.begin(), v.end());
  return v[static_cast<std::size_t>(std::floor(q * static_cast<double>(v.size() - 1)))];
}

}  // namespace

TEST_CASE("quantiles are within the relative accuracy of the exact sorted quantiles") {
  // Masson, Rim & Lee (2019), Theorem/§2: |x̃_q − x_q| ≤ α|x_q|. Slack 1e-12 relative for the
  // evaluation of γ^i.
  const std::vector<double> v = sample(20000, 11);
  for (double alpha : {0.01, 0.002}) {
    QuantileSketch s(alpha);
    for (double x : v) s.add(x);
    CHECK(s.count() == v.size());
    for (double q : {0.0, 0.001, 0.05, 0.1, 0.15, 0.16, 0.17, 0.5, 0.9, 0.95, 0.999, 1.0}) {
      CAPTURE(alpha);
      CAPTURE(q);
      const double x = exact(v, q);
      CHECK(std::abs(s.quantile(q) - x) <= alpha * std::abs(x) * (1.0 + 1e-12));
    }
    CHECK(s.quantile(0.0) == *std::min_element(v.begin(), v.end()));
    CHECK(s.quantile(1.0) == *std::max_element(v.begin(), v.end()));
  }
}

TEST_CASE("merge equals processing every value in one sketch, bit for bit") {
  const std::vector<double> v = sample(9000, 5);
  QuantileSketch whole(0.01, 1e-12, 2048);
  for (double x : v) whole.add(x);
  // Three parts, filled in a different order, merged in yet another order.
  QuantileSketch a, b, c;
  for (std::size_t k = v.size(); k-- > 0;) (k % 3 == 0 ? a : k % 7 == 1 ? b : c).add(v[k]);
  QuantileSketch merged = c;
  merged.merge(a);
  merged.merge(b);
  CHECK(merged == whole);
  CHECK(merged.encode() == whole.encode());
  for (double q : {0.05, 0.5, 0.95}) CHECK(merged.quantile(q) == whole.quantile(q));  // bit-identical
  // Merging an empty sketch changes nothing; merging into an empty one copies.
  QuantileSketch empty;
  merged.merge(empty);
  CHECK(merged == whole);
  empty.merge(whole);
  CHECK(empty == whole);
}

TEST_CASE("bounded memory: collapsing the smallest magnitudes keeps merges exact") {
  // 16 buckets per store at α = 0.05 cover a factor γ^15 = 4.5 only: the wide sample collapses.
  const std::vector<double> v = sample(5000, 9);
  QuantileSketch whole(0.05, 1e-12, 16);
  for (double x : v) whole.add(x);
  QuantileSketch a(0.05, 1e-12, 16), b(0.05, 1e-12, 16);
  for (std::size_t k = 0; k < v.size(); ++k) (k < 1234 ? b : a).add(v[k]);
  a.merge(b);
  CHECK(a == whole);
  // The encoding has at most 2m buckets; the top quantiles keep their accuracy.
  CHECK(whole.encode().size() <= 8 + 2 * (2 + 16));
  // Values within γ^15 of the largest keep their buckets: there the accuracy α holds.
  const double gamma = 1.05 / 0.95, kept_from = whole.max() / std::pow(gamma, 15);
  for (double q : {0.9995, 0.9999}) {
    const double x = exact(v, q);
    REQUIRE(x > kept_from);
    CHECK(std::abs(whole.quantile(q) - x) <= 0.05 * std::abs(x) * (1.0 + 1e-12));
  }
}

TEST_CASE("all-negative and zero values (already critical faults)") {
  QuantileSketch s(0.01, 1.0);  // |x| ≤ 1 Pa counts as zero
  for (int k = 1; k <= 100; ++k) s.add(-1e5 * k);
  for (int k = 0; k < 50; ++k) s.add(0.5 * (k % 2 == 0 ? 1 : -1));
  // 150 values: ranks 0..99 are −1e7..−1e5 (most negative first), ranks 100..149 near zero.
  CHECK(std::abs(s.quantile(0.0) - -1e7) == 0.0);
  const double q10 = s.quantile(10.0 / 149.0);  // rank 10 -> −9.0e6
  CHECK(std::abs(q10 - -9.0e6) <= 0.01 * 9.0e6 * (1.0 + 1e-12));
  CHECK(s.quantile(0.9) == 0.0);  // rank 134: in the zero bucket
  CHECK(s.max() == 0.5);
}

TEST_CASE("encoding round trip and bad use") {
  const std::vector<double> v = sample(500, 2);
  QuantileSketch s;
  for (double x : v) s.add(x);
  CHECK(QuantileSketch::decode(s.encode()) == s);
  auto cut = s.encode();
  cut.pop_back();
  CHECK_THROWS_AS(QuantileSketch::decode(cut), InputError);
  CHECK_THROWS_AS(QuantileSketch(0.0), InputError);
  CHECK_THROWS_AS(QuantileSketch(1.0), InputError);
  CHECK_THROWS_AS(QuantileSketch(0.01, -1.0), InputError);
  CHECK_THROWS_AS(QuantileSketch(0.01, 0.0, 1), InputError);
  CHECK_THROWS_AS(s.add(std::numeric_limits<double>::quiet_NaN()), NumericalError);
  CHECK_THROWS_AS(s.quantile(1.5), InputError);
  CHECK_THROWS_AS(QuantileSketch().quantile(0.5), InputError);
  QuantileSketch other(0.02);
  CHECK_THROWS_AS(s.merge(other), InputError);
}

TEST_CASE("values on bucket boundaries stay within the accuracy") {
  // x = γ^k lies on the upper edge of bucket k; log rounding may put it in bucket k + 1,
  // whose representative 2γ^(k+1)/(γ+1) is then exactly α above it (Masson et al. 2019 §2).
  const double alpha = 0.01, gamma = (1 + alpha) / (1 - alpha);
  for (int k = -60; k <= 60; k += 7) {
    QuantileSketch s(alpha);
    const double x = std::pow(gamma, k);
    for (double v : {0.1 * x, x, x, x, 10.0 * x}) s.add(v);  // min and max apart: no clamping
    CAPTURE(k);
    CHECK(std::abs(s.quantile(0.5) - x) <= alpha * x * (1.0 + 1e-12));
  }
}
