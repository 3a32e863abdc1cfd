#include "core/stats/wilson_interval.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"
#include "relative.hpp"

using namespace slipscreen;
using stats::test::relative_error;
using stats::wilson_interval;

TEST_CASE("Wilson interval reproduces Newcombe (1998) Table I") {
  // Newcombe (1998), Statistics in Medicine 17:857-872, Table I, method 3 (score interval
  // without continuity correction), 95 %, four decimals (from memory):
  //   81/263: 0.2553-0.3662   15/148: 0.0624-0.1605   0/20: 0.0000-0.1611   1/29: 0.0061-0.1718
  struct Row {
    std::uint64_t r, n;
    double lo, hi;
  };
  for (const Row row : {Row{81, 263, 0.2553, 0.3662}, Row{15, 148, 0.0624, 0.1605}, Row{0, 20, 0.0, 0.1611},
                        Row{1, 29, 0.0061, 0.1718}}) {
    CAPTURE(row.r);
    const auto ci = wilson_interval(row.r, row.n);
    CHECK(std::abs(ci.lower - row.lo) <= 0.00005);  // half a unit in the fourth decimal
    CHECK(std::abs(ci.upper - row.hi) <= 0.00005);
  }
}

TEST_CASE("Wilson interval matches scipy's closed form to rounding") {
  // Command run (scipy 1.10.1):
  //   /usr/bin/python3 -c "from scipy.stats import binomtest
  //   for k,n in [(81,263),(15,148),(0,20),(1,29),(29,29),(500,10000)]:
  //       ci=binomtest(k,n).proportion_ci(0.95,'wilson'); print(k,n,repr(ci.low),repr(ci.high))"
  // Output:
  //   81 263 0.2552885198782742 0.36620957698280004
  //   15 148 0.06238639953073629 0.16048724172330803
  //   0 20 0.0 0.16112515805281935
  //   1 29 0.006113214292762667 0.17175521879320282
  //   29 29 0.8830302015002592 1.0
  //   500 10000 0.04589848269058477 0.05444711584302416
  struct Row {
    std::uint64_t r, n;
    double lo, hi;
  };
  for (const Row row : {Row{81, 263, 0.2552885198782742, 0.36620957698280004},
                        Row{15, 148, 0.06238639953073629, 0.16048724172330803},
                        Row{0, 20, 0.0, 0.16112515805281935},
                        Row{1, 29, 0.006113214292762667, 0.17175521879320282},
                        Row{29, 29, 0.8830302015002592, 1.0},
                        Row{500, 10000, 0.04589848269058477, 0.05444711584302416}}) {
    CAPTURE(row.r);
    const auto ci = wilson_interval(row.r, row.n);
    // Tolerance 1e-14 relative: the two evaluate the same closed form in different orders.
    if (row.lo == 0.0)
      CHECK(ci.lower == 0.0);
    else
      CHECK(relative_error(ci.lower, row.lo) < 1e-14);
    CHECK(relative_error(ci.upper, row.hi) < 1e-14);
    CHECK(ci.estimate == static_cast<double>(row.r) / static_cast<double>(row.n));
  }
}

TEST_CASE("Wilson interval edges and other z") {
  // r = 0 and r = n: the bounds are exactly 0 and 1 (the closed form gives them exactly).
  CHECK(wilson_interval(0, 10000).lower == 0.0);
  CHECK(wilson_interval(10000, 10000).upper == 1.0);
  // The interval always holds the estimate and lies in [0, 1].
  for (std::uint64_t r = 0; r <= 40; ++r) {
    const auto ci = wilson_interval(r, 40);
    CHECK(ci.lower <= ci.estimate);
    CHECK(ci.estimate <= ci.upper);
    CHECK(ci.lower >= 0.0);
    CHECK(ci.upper <= 1.0);
  }
  // z = 1 for 1/4 (arithmetic from (2np + z² ± z√(z² + 4np(1−p)))/(2(n+z²)) with n = 4, r = 1:
  // (2 + 1 ± √(1 + 3))/10 = 0.1 and 0.5).
  const auto one = wilson_interval(1, 4, 1.0);
  CHECK(std::abs(one.lower - 0.1) < 1e-15);
  CHECK(std::abs(one.upper - 0.5) < 1e-15);
  // z for 95 %: scipy.stats.norm.ppf(0.975) = 1.959963984540054.
  CHECK(relative_error(stats::z_for_confidence(0.95), 1.959963984540054) < 1e-15);
  CHECK(stats::kZ95 == 1.959963984540054);
}

TEST_CASE("Monte Carlo standard error of a proportion") {
  // √(p(1−p)/n) = √(0.05·0.95/10000) = 0.0021794494717703367 (/usr/bin/python3 arithmetic).
  CHECK(relative_error(stats::proportion_standard_error(500, 10000), 0.0021794494717703367) < 1e-15);
  CHECK(stats::proportion_standard_error(0, 10) == 0.0);
}

TEST_CASE("bad counts are clear errors") {
  CHECK_THROWS_WITH_AS(wilson_interval(0, 0), doctest::Contains("at least one realization"), InputError);
  CHECK_THROWS_WITH_AS(wilson_interval(5, 4), doctest::Contains("at most the number of trials (4)"), InputError);
  CHECK_THROWS_AS(wilson_interval(1, 4, -1.0), InputError);
  CHECK_THROWS_AS(stats::proportion_standard_error(1, 0), InputError);
  CHECK_THROWS_AS(stats::z_for_confidence(1.0), InputError);
}
