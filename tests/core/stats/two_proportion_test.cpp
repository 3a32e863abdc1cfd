#include "core/stats/two_proportion.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"
#include "core/stats/wilson_interval.hpp"

using namespace slipscreen;
using stats::two_proportion_test;

TEST_CASE("pooled two-proportion z equals scipy's Pearson chi-square of the 2x2 table") {
  // Reference: scipy 1.10.1, scipy.stats.chi2_contingency([[x1, n1-x1], [x2, n2-x2]],
  // correction=False)[0] = z², signed as p2 - p1 (the two statistics are the same test).
  struct Row {
    std::uint64_t x1, n1, x2, n2;
    double z;
  };
  for (const Row r : {Row{80, 400, 54, 400, -2.4616643017312496}, Row{0, 100, 1, 100, 1.002509414234171},
                      Row{3, 100, 10, 2000, -3.11051108355429}, Row{1999, 2000, 2000, 2000, 1.000125023442384}}) {
    CAPTURE(r.x1);
    const double p1 = static_cast<double>(r.x1) / static_cast<double>(r.n1);
    const double p2 = static_cast<double>(r.x2) / static_cast<double>(r.n2);
    const auto t = two_proportion_test(p1, r.n1, p2, r.n2, stats::kZ95);
    CHECK(std::abs(t.z - r.z) <= 1e-12 * std::abs(r.z));  // closed form on both sides: a few ulp
    CHECK(t.change == doctest::Approx(p2 - p1).epsilon(1e-15));
    CHECK(t.exceeds_noise == (std::abs(r.z) > 1.959963984540054));
  }
}

TEST_CASE("a change is called beyond noise only past the critical value, both ways") {
  // 80/400 -> 54/400: |z| = 2.46 > 1.96 (scipy, above); 0/100 -> 1/100: |z| = 1.00 < 1.96.
  CHECK(two_proportion_test(0.2, 400, 0.135, 400, stats::kZ95).exceeds_noise);
  CHECK(two_proportion_test(0.135, 400, 0.2, 400, stats::kZ95).z > 0.0);
  CHECK_FALSE(two_proportion_test(0.0, 100, 0.01, 100, stats::kZ95).exceeds_noise);
  // The same pair at a 99 % critical value (2.5758, scipy.stats.norm.ppf(0.995)) is noise.
  CHECK_FALSE(two_proportion_test(0.2, 400, 0.135, 400, 2.5758293035489004).exceeds_noise);
}

TEST_CASE("equal estimates, and P = 0 or 1 in both runs, are no change (z = 0, no division by zero)") {
  for (const double p : {0.0, 1.0, 0.37}) {
    CAPTURE(p);
    const auto t = two_proportion_test(p, 100, p, 2000, stats::kZ95);
    CHECK(t.z == 0.0);
    CHECK(t.change == 0.0);
    CHECK_FALSE(t.exceeds_noise);
    CHECK(std::isfinite(t.z));
  }
  // One run at 0, the other at 1: the pooled proportion is 1/2 and the change is certain.
  const auto all = two_proportion_test(0.0, 100, 1.0, 100, stats::kZ95);
  CHECK(all.pooled == 0.5);
  CHECK(all.exceeds_noise);
  CHECK(all.z == doctest::Approx(std::sqrt(200.0)).epsilon(1e-14));  // 1 / sqrt(0.25 * 0.02), by hand
}

TEST_CASE("probabilities outside [0, 1], no realizations or a bad critical value are input errors") {
  CHECK_THROWS_AS(two_proportion_test(-0.1, 100, 0.2, 100, stats::kZ95), InputError);
  CHECK_THROWS_AS(two_proportion_test(0.1, 100, 1.2, 100, stats::kZ95), InputError);
  CHECK_THROWS_AS(two_proportion_test(std::nan(""), 100, 0.2, 100, stats::kZ95), InputError);
  CHECK_THROWS_AS(two_proportion_test(0.1, 0, 0.2, 100, stats::kZ95), InputError);
  CHECK_THROWS_AS(two_proportion_test(0.1, 100, 0.2, 100, 0.0), InputError);
}
