#include "core/stats/distribution.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <limits>

#include "core/errors.hpp"
#include "relative.hpp"

using namespace slipscreen;
using stats::Distribution;
using stats::test::relative_error;

namespace {
struct Point {
  double u, x;
};

// Reference quantiles from scipy 1.10.1, printed by
//   /usr/bin/python3 -c "from scipy.stats import norm, truncnorm, lognorm, triang; ..."
// (norm.ppf(u, 0.6, 0.05); truncnorm.ppf(u, a, b, loc, scale) with a = (min−mean)/sd,
// b = (max−mean)/sd; lognorm.ppf(u, 0.8, scale=10); triang.ppf(u, 1/3, loc=0.5, scale=0.3)).
// Tolerance: 1e-13 relative, a few hundred ulp — Boost.Math and scipy use different
// algorithms, both accurate to near machine precision.
constexpr double kTol = 1e-13;

void check_quantiles(const Distribution& d, std::initializer_list<Point> points) {
  for (const Point p : points) {
    CAPTURE(p.u);
    CHECK(relative_error(d.quantile(p.u), p.x) < kTol);
  }
}
}  // namespace

TEST_CASE("normal quantiles match scipy.stats.norm.ppf") {
  const Distribution d = Distribution::normal(0.6, 0.05);
  check_quantiles(d, {{1e-10, 0.2819329548797972}, {0.025, 0.5020018007729973},
                        {0.3, 0.5737799743645979}, {0.5, 0.6}, {0.9, 0.66407757827723},
                        {0.999999, 0.8376712154408543}});
  CHECK(d.mean() == 0.6);
  CHECK(d.standard_deviation() == 0.05);
}

TEST_CASE("truncated normal quantiles and moments match scipy.stats.truncnorm") {
  SUBCASE("two-sided, symmetric: truncnormal(mean=0.6, sd=0.1, min=0.3, max=0.9)") {
    const Distribution d = Distribution::truncated_normal(0.6, 0.1, 0.3, 0.9);
    check_quantiles(d, {{1e-10, 0.30000000225030304}, {0.025, 0.40615209657029455},
                          {0.3, 0.5477151834566211}, {0.5, 0.6}, {0.9, 0.7275422223467578},
                          {0.999999, 0.8999775045615954}});
    // scipy: truncnorm.mean = 0.6, truncnorm.std = 0.09865783925581087.
    CHECK(relative_error(d.mean(), 0.6) < 1e-14);
    CHECK(relative_error(d.standard_deviation(), 0.09865783925581087) < 1e-12);
  }
  SUBCASE("upper tail only: truncnormal(mean=0, sd=1, min=3), inverted on the complementary CDF") {
    const Distribution d = Distribution::truncated_normal(0.0, 1.0, 3.0, std::numeric_limits<double>::infinity());
    check_quantiles(d, {{1e-10, 3.000000000030459}, {0.025, 3.0077031586208176},
                          {0.3, 3.107016696637142}, {0.5, 3.2051549205989334},
                          {0.9, 3.6425222758316242}, {0.999999, 5.948882346129337}});
    // scipy: truncnorm(3, inf).mean() = 3.28309865493044, .std() = 0.2656297927290082.
    CHECK(relative_error(d.mean(), 3.28309865493044) < 1e-12);
    CHECK(relative_error(d.standard_deviation(), 0.2656297927290082) < 1e-10);
    CHECK(d.lower() == 3.0);
    CHECK(std::isinf(d.upper()));
  }
  SUBCASE("lower tail only: truncnormal(mean=2, sd=0.5, max=0)") {
    const Distribution d = Distribution::truncated_normal(2.0, 0.5, -std::numeric_limits<double>::infinity(), 0.0);
    check_quantiles(d, {{1e-10, -1.8985535454507234}, {0.025, -0.4001954608979794},
                          {0.3, -0.13814863017022327}, {0.5, -0.08055213929894034},
                          {0.9, -0.012432034332583886}});
    // Near the bound x → 0 the relative accuracy in x is limited by the cancellation
    // mean + sd·z ≈ 0 (2 − 2.0000001): absolute accuracy ~ulp(2) = 4.4e-16, checked to 1e-14.
    CHECK(std::abs(d.quantile(0.999999) - -1.1832624746688225e-07) < 1e-14);
  }
}

TEST_CASE("lognormal quantiles and moments match scipy.stats.lognorm") {
  const Distribution d = Distribution::lognormal(10.0, 0.8);
  check_quantiles(d, {{1e-10, 0.06163732732295166}, {0.025, 2.0846769545105075},
                        {0.3, 6.573620083645885}, {0.5, 10.0}, {0.9, 27.87767935249002},
                        {0.999999, 448.2380890631307}});
  // scipy: lognorm(0.8, scale=10).mean() = 13.771277643359571, .std() = 13.039013943793183.
  CHECK(relative_error(d.mean(), 13.771277643359571) < 1e-14);
  CHECK(relative_error(d.standard_deviation(), 13.039013943793183) < 1e-14);
  CHECK(d.lower() == 0.0);
}

TEST_CASE("lognormal from P10 and P90") {
  // median = √(2·50) = 10, σ_ln = ln(25)/(2 Φ⁻¹(0.9)) = 1.2558510759184032 (scipy:
  // np.log(25)/(2*norm.ppf(0.9))); then the 10th and 90th percentiles come back.
  const Distribution d = Distribution::lognormal_p10_p90(2.0, 50.0);
  CHECK(relative_error(d.a(), 10.0) < 1e-15);
  CHECK(relative_error(d.b(), 1.2558510759184032) < 4e-15);
  CHECK(relative_error(d.quantile(0.1), 2.0) < 1e-14);
  CHECK(relative_error(d.quantile(0.9), 50.0) < 1e-14);
}

TEST_CASE("triangular quantiles and moments match scipy.stats.triang") {
  const Distribution d = Distribution::triangular(0.5, 0.6, 0.8);
  check_quantiles(d, {{1e-10, 0.5000017320508076}, {0.025, 0.5273861278752583},
                        {0.3, 0.5948683298050513}, {0.5, 0.6267949192431123},
                        {0.9, 0.7225403330758516}, {0.999999, 0.7997550510257181}});
  // scipy: mean 0.6333333333333333, std 0.06236095644623236; mean = (a + b + c)/3 (Kotz & van Dorp 2004).
  CHECK(relative_error(d.mean(), 0.6333333333333333) < 1e-15);
  CHECK(relative_error(d.standard_deviation(), 0.06236095644623236) < 1e-14);
}

TEST_CASE("uniform and fixed") {
  const Distribution u = Distribution::uniform(20e3, 24e3);
  CHECK(u.quantile(0.25) == 21e3);  // a + u (b − a), exact here
  CHECK(u.mean() == 22e3);
  // sd = (b − a)/√12 = 1154.7005383792516 (arithmetic, /usr/bin/python3: 4000/12**0.5).
  CHECK(relative_error(u.standard_deviation(), 1154.7005383792516) < 1e-15);
  const Distribution f = Distribution::fixed(0.6);
  CHECK(f.is_fixed());
  CHECK(f.quantile(1e-9) == 0.6);
  CHECK(f.quantile(0.999) == 0.6);
  CHECK(f.standard_deviation() == 0.0);
  CHECK(f.cdf(0.59) == 0.0);
  CHECK(f.cdf(0.6) == 1.0);
}

TEST_CASE("cdf inverts quantile") {
  // F(F⁻¹(u)) = u by definition; tolerance 1e-12 absolute in u.
  for (const Distribution& d :
       {Distribution::uniform(1.0, 3.0), Distribution::normal(0.6, 0.05),
        Distribution::truncated_normal(0.6, 0.1, 0.3, 0.9),
        Distribution::truncated_normal(0.0, 1.0, 3.0, std::numeric_limits<double>::infinity()),
        Distribution::lognormal(1e-14, 0.8), Distribution::triangular(0.5, 0.6, 0.8),
        Distribution::triangular(0.0, 0.0, 1.0)}) {
    for (double u : {0.001, 0.1, 0.37, 0.5, 0.77, 0.999}) {
      CAPTURE(u);
      CHECK(std::abs(d.cdf(d.quantile(u)) - u) < 1e-12);
    }
  }
}

TEST_CASE("quantiles are non-decreasing and stay in the support") {
  const Distribution d = Distribution::truncated_normal(0.6, 0.1, 0.55, 0.58);
  double last = -1.0;
  for (int k = 1; k < 1000; ++k) {
    const double x = d.quantile(k / 1000.0);
    CHECK(x >= last);
    CHECK(x >= 0.55);
    CHECK(x <= 0.58);
    last = x;
  }
}

TEST_CASE("bad parameters are clear input errors") {
  CHECK_THROWS_WITH_AS(Distribution::uniform(5.0, 3.0, "friction"),
                       "field 'friction' = 'uniform(min=5, max=3)': expected min < max (for a single value write the value alone)",
                       InputError);
  CHECK_THROWS_WITH_AS(Distribution::normal(0.6, -0.1, "friction"), doctest::Contains("positive standard deviation"),
                       InputError);
  CHECK_THROWS_AS(Distribution::normal(0.6, 0.0), InputError);
  CHECK_THROWS_WITH_AS(Distribution::lognormal(0.0, 0.8, "permeability"), doctest::Contains("a positive median"),
                       InputError);
  CHECK_THROWS_AS(Distribution::lognormal(-1e-15, 0.8), InputError);
  CHECK_THROWS_AS(Distribution::lognormal(1e-15, 0.0), InputError);
  CHECK_THROWS_WITH_AS(Distribution::lognormal_p10_p90(5.0, 2.0), doctest::Contains("0 < p10 < p90"), InputError);
  CHECK_THROWS_WITH_AS(Distribution::triangular(0.5, 0.9, 0.8), doctest::Contains("min <= mode <= max"), InputError);
  CHECK_THROWS_AS(Distribution::triangular(0.8, 0.8, 0.5), InputError);
  CHECK_THROWS_WITH_AS(Distribution::truncated_normal(0.6, 0.1, 0.9, 0.3), doctest::Contains("min < max"), InputError);
  CHECK_THROWS_AS(Distribution::truncated_normal(0.6, -0.1, 0.3, 0.9), InputError);
  // 30 sd above the mean holds 4.9e-198 of the probability (below the 1e-100 limit).
  CHECK_THROWS_WITH_AS(Distribution::truncated_normal(0.0, 1.0, 30.0, 31.0), doctest::Contains("21 sd"), InputError);
  CHECK_THROWS_AS(Distribution::fixed(std::numeric_limits<double>::quiet_NaN()), InputError);
  CHECK_THROWS_AS(Distribution::normal(0.6, 0.05).quantile(0.0), InputError);
  CHECK_THROWS_AS(Distribution::normal(0.6, 0.05).quantile(1.0), InputError);
}

TEST_CASE("the extreme variates of a random stream give finite values inside the support") {
  // RandomStream's uniforms lie in [2⁻⁵³, 1 − 2⁻⁵³] (random_stream.hpp): no quantile may
  // overflow there.
  constexpr double inf = std::numeric_limits<double>::infinity();
  for (const Distribution& d :
       {Distribution::uniform(1.0, 3.0), Distribution::normal(0.6, 0.05),
        Distribution::truncated_normal(0.6, 0.1, 0.3, 0.9), Distribution::truncated_normal(0.0, 1.0, 3.0, inf),
        Distribution::truncated_normal(0.0, 1.0, -inf, -20.0), Distribution::lognormal(1e-14, 2.0),
        Distribution::triangular(0.5, 0.8, 0.8)}) {
    for (double u : {0x1p-53, 1.0 - 0x1p-53}) {
      CAPTURE(u);
      const double x = d.quantile(u);
      CHECK(std::isfinite(x));
      CHECK(x >= d.lower());
      CHECK(x <= d.upper());
    }
  }
}
