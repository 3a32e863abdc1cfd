#include "core/stats/rank_correlation.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <vector>

#include "core/errors.hpp"
#include "relative.hpp"

using namespace slipscreen;
using stats::spearman;
using stats::test::relative_error;

TEST_CASE("average ranks share tied positions") {
  // Kendall & Gibbons (1990): tied values get the mean of the ranks they occupy.
  const std::vector<double> x = {1, 2, 2, 3, 4};
  CHECK(stats::average_ranks(x) == std::vector<double>{1, 2.5, 2.5, 4, 5});
  const std::vector<double> y = {7.7, 3.2, 7.7, 7.7, 1.0};
  CHECK(stats::average_ranks(y) == std::vector<double>{4, 2, 4, 4, 1});
}

TEST_CASE("Spearman with ties: a hand-computed example") {
  // x = 1 2 2 3 4 -> ranks 1 2.5 2.5 4 5; y = 2 1 3 3 5 -> ranks 2 1 3.5 3.5 5. Mean rank 3.
  // Σdx·dy = (−2)(−1) + (−0.5)(−2) + (−0.5)(0.5) + (1)(0.5) + (2)(2) = 7.25,
  // Σdx² = Σdy² = 9.5, so ρ = 7.25/9.5 = 29/38 = 0.7631578947368421.
  // scipy.stats.spearmanr([1,2,2,3,4],[2,1,3,3,5]) (scipy 1.10.1, /usr/bin/python3):
  //   correlation 0.7631578947368421, pvalue 0.1333391195318063.
  const std::vector<double> x = {1, 2, 2, 3, 4}, y = {2, 1, 3, 3, 5};
  const auto r = spearman(x, y);
  CHECK(std::abs(r.rho - 29.0 / 38.0) < 1e-15);
  CHECK(r.n == 5);
  CHECK(relative_error(r.p_value, 0.1333391195318063) < 1e-12);
}

TEST_CASE("Spearman matches scipy.stats.spearmanr on ten pairs with ties") {
  // /usr/bin/python3 -c "from scipy.stats import spearmanr; x=[10.5,3.2,7.7,7.7,1.0,4.4,9.9,7.7,2.5,6.0];
  //   y=[0.3,-1.2,0.8,0.1,-2.0,-0.5,0.9,0.8,-1.1,0.0]; r=spearmanr(x,y); print(r.correlation, r.pvalue)"
  //   -> 0.8923457102129049 0.0005150690741484771
  const std::vector<double> x = {10.5, 3.2, 7.7, 7.7, 1.0, 4.4, 9.9, 7.7, 2.5, 6.0};
  const std::vector<double> y = {0.3, -1.2, 0.8, 0.1, -2.0, -0.5, 0.9, 0.8, -1.1, 0.0};
  const auto r = spearman(x, y);
  CHECK(relative_error(r.rho, 0.8923457102129049) < 1e-14);
  CHECK(relative_error(r.p_value, 0.0005150690741484771) < 1e-11);
  // Symmetric in its arguments, and the sign flips with the order of y.
  CHECK(spearman(y, x).rho == r.rho);
  std::vector<double> neg(y);
  for (auto& v : neg) v = -v;
  CHECK(std::abs(spearman(x, neg).rho + r.rho) < 1e-15);
}

TEST_CASE("monotone relations and constant inputs") {
  // Any strictly increasing transform ranks identically: ρ = 1, p = 0 (definition).
  std::vector<double> x, y;
  for (int i = 1; i <= 50; ++i) {
    x.push_back(i * 0.1);
    y.push_back(std::exp(i * 0.1));
  }
  const auto r = spearman(x, y);
  CHECK(r.rho == 1.0);
  CHECK(r.p_value == 0.0);
  // A fixed input has no ranking: ρ is NaN (as in scipy), never a spurious 0.
  const std::vector<double> constant(50, 0.6);
  CHECK(std::isnan(spearman(constant, y).rho));
  CHECK(std::isnan(spearman(constant, y).p_value));
}

TEST_CASE("bad samples are clear errors") {
  const std::vector<double> a = {1, 2, 3}, b = {1, 2};
  CHECK_THROWS_WITH_AS(spearman(a, b), doctest::Contains("equal lengths"), InputError);
  CHECK_THROWS_AS(spearman(std::vector<double>{1}, std::vector<double>{1}), InputError);
  const std::vector<double> with_nan = {1, std::numeric_limits<double>::quiet_NaN(), 3};
  CHECK_THROWS_AS(spearman(with_nan, a), InputError);
}
