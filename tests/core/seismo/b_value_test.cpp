#include "core/seismo/b_value.hpp"

#include <doctest/doctest.h>

#include <boost/random/exponential_distribution.hpp>
#include <boost/random/mersenne_twister.hpp>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "core/seismo/completeness.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
// Gutenberg-Richter sample: continuous magnitudes above Mc - ΔM/2 are exponential with rate
// β = b ln 10; rounding them to ΔM gives the binned catalog Utsu's correction is made for.
std::vector<double> gr_sample(double b, double mc, double dm, std::size_t n, std::uint64_t seed) {
  boost::random::mt19937_64 rng(seed);
  boost::random::exponential_distribution<double> expo(b * std::numbers::ln10);
  std::vector<double> m(n);
  for (auto& x : m) x = bin_centre(mc - dm / 2.0 + expo(rng), dm);
  return m;
}
}  // namespace

TEST_CASE("Aki-Utsu formula on a worked example") {
  // Arithmetic: M = {2.0, 2.1, 2.3, 2.5, 3.1}, Mc = 2.0, ΔM = 0.1: M̄ = 12.0/5 = 2.4,
  // b = log10(e)/(2.4 - 1.95) = 0.4342944819/0.45 = 0.96509885 (Aki 1965, Utsu correction).
  // Σ(M - M̄)² = 0.16 + 0.09 + 0.01 + 0.01 + 0.49 = 0.76; Shi & Bolt (1982):
  // σ = 2.30 · 0.96509885² · sqrt(0.76/20) = 0.41760263.
  const std::vector<double> m = {2.0, 2.1, 2.3, 2.5, 3.1};
  const auto e = b_value(m, 2.0, 0.1);
  CHECK(e.n == 5);
  CHECK(e.mean == doctest::Approx(2.4).epsilon(1e-14));
  CHECK(e.b == doctest::Approx(0.965098848673894).epsilon(1e-12));
  CHECK(e.sigma == doctest::Approx(0.41760263408736).epsilon(1e-12));
  // a-value: log10(5) + b·Mc = 0.69897 + 1.93020 = 2.62917 (arithmetic).
  CHECK(e.a == doctest::Approx(0.698970004336 + 2.0 * 0.965098848673894).epsilon(1e-12));
  // Without binning (ΔM = 0) Aki's original form: log10(e)/(2.4 - 2.0) = 1.08573620 (arithmetic).
  CHECK(aki_utsu_b(2.4, 2.0, 0.0) == doctest::Approx(1.0857362047581).epsilon(1e-12));
  // Events below Mc are left out: adding 1.5 and 1.9 changes nothing.
  const std::vector<double> m2 = {1.5, 2.0, 2.1, 1.9, 2.3, 2.5, 3.1};
  CHECK(b_value(m2, 2.0, 0.1).b == doctest::Approx(e.b).epsilon(1e-14));
}

TEST_CASE("the MLE recovers a known b within its Shi & Bolt interval") {
  // Reasoning: for n = 2000 events the MLE is close to normal with standard error
  // σ_b ≈ b/sqrt(n) ≈ 0.022 (Aki 1965; Shi & Bolt 1982). For a fixed seed the check is
  // deterministic; across seeds the true b lies inside ±1σ about 68 % of the time, so out of
  // 60 seeded catalogs between 30 and 52 must cover it (binomial(60, 0.68): mean 40.8,
  // sd 3.6, so the bounds are about ±3 sd) — a wrong σ formula (e.g. without the b² factor or
  // off by sqrt(n)) fails this.
  const double b_true = 1.0, mc = 1.5, dm = 0.1;
  const auto e = b_value(gr_sample(b_true, mc, dm, 2000, 42), mc, dm);
  CHECK(std::abs(e.b - b_true) <= 2.0 * e.sigma);
  CHECK(e.sigma == doctest::Approx(2.30 * b_true / std::sqrt(2000.0) / std::numbers::ln10).epsilon(0.1));
  int covered1 = 0, covered2 = 0;
  for (std::uint64_t seed = 1; seed <= 60; ++seed) {
    const auto s = b_value(gr_sample(0.8, 2.0, dm, 500, seed), 2.0, dm);
    if (std::abs(s.b - 0.8) <= s.sigma) ++covered1;
    if (std::abs(s.b - 0.8) <= 2.0 * s.sigma) ++covered2;
  }
  CHECK(covered1 >= 30);
  CHECK(covered1 <= 52);
  CHECK(covered2 >= 52);  // 95 % nominal: binomial(60, 0.95) mean 57, sd 1.7
}

TEST_CASE("bootstrap interval is seeded and brackets the estimate") {
  const auto m = gr_sample(1.1, 1.0, 0.1, 400, 7);
  const auto e = b_value(m, 1.0, 0.1);
  const auto ci = bootstrap_b_value(m, 1.0, 0.1, 2000, 0.95, 99);
  CHECK(ci.lower < e.b);
  CHECK(ci.upper > e.b);
  // Common practice: the percentile interval width ≈ 2·1.96 σ_b for a near-normal estimator.
  CHECK((ci.upper - ci.lower) == doctest::Approx(2.0 * 1.96 * e.sigma).epsilon(0.25));
  const auto again = bootstrap_b_value(m, 1.0, 0.1, 2000, 0.95, 99);
  CHECK(again.lower == ci.lower);
  CHECK(again.upper == ci.upper);
  const auto other = bootstrap_b_value(m, 1.0, 0.1, 2000, 0.95, 100);
  CHECK(other.lower != ci.lower);
}

TEST_CASE("too few events above Mc are a clear input error, never NaN") {
  const std::vector<double> m = {1.0, 1.2, 1.4, 2.6};
  CHECK_THROWS_WITH_AS(b_value(m, 2.5, 0.1), doctest::Contains("at least 2 events at or above"), InputError);
  CHECK_THROWS_WITH_AS(b_value(m, 3.0, 0.1), doctest::Contains("= '0'"), InputError);
  const std::vector<double> none;
  CHECK_THROWS_AS(b_value(none, 1.0, 0.1), InputError);
  // All events exactly at Mc with ΔM = 0: the MLE has no finite value.
  const std::vector<double> flat = {2.0, 2.0, 2.0};
  CHECK_THROWS_AS(b_value(flat, 2.0, 0.0), InputError);
  CHECK_THROWS_AS(bootstrap_b_value(m, 1.0, 0.1, 5, 0.95, 1), InputError);
  CHECK_THROWS_AS(bootstrap_b_value(m, 1.0, 0.1, 100, 1.5, 1), InputError);
}
