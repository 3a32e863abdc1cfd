#include "core/geomech/frictional_limit.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "check_near.hpp"
#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

TEST_CASE("frictional limit ratio") {
  // Zoback (2007), Reservoir Geomechanics: [√(μ²+1)+μ]² = 3.12 for μ = 0.6 (quoted to 2 decimals).
  CHECK_NEAR(frictional_limit_ratio(0.6), 3.12, 0.005);
  // Arithmetic: μ = 1 gives (√2 + 1)² = 3 + 2√2.
  CHECK_NEAR(frictional_limit_ratio(1.0), 3.0 + 2.0 * std::sqrt(2.0), 1e-14);
}

TEST_CASE("frictional limit status is reported") {
  const double q = frictional_limit_ratio(0.6);
  const double p = 20e6;
  const auto within = check_frictional_limit(p + 2.0 * 10e6, p + 10e6, p, 0.6);
  CHECK(within.status == LimitStatus::within);
  CHECK_NEAR(within.ratio, 2.0, 1e-14);
  const auto at = check_frictional_limit(p + q * 10e6, p + 10e6, p, 0.6);
  CHECK(at.status == LimitStatus::at_limit);
  const auto beyond = check_frictional_limit(p + 1.01 * q * 10e6, p + 10e6, p, 0.6);
  CHECK(beyond.status == LimitStatus::beyond);
  CHECK(std::string(to_string(beyond.status)) == "beyond");
}

TEST_CASE("frictional limit bad input") {
  CHECK_THROWS_WITH_AS(frictional_limit_ratio(0.0), doctest::Contains("field 'friction'"), InputError);
  CHECK_THROWS_WITH_AS(frictional_limit_ratio(-0.6), doctest::Contains("'-0.6"), InputError);
  CHECK_THROWS_WITH_AS(check_frictional_limit(50e6, 20e6, 20e6, 0.6), doctest::Contains("least principal stress"), InputError);
}
