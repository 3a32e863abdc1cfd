#include "core/hydro/well_function.hpp"

#include <doctest/doctest.h>

#include <boost/math/special_functions/expint.hpp>
#include <cfloat>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

using slipscreen::hydro::kWellFunctionUnderflow;
using slipscreen::hydro::well_function;

namespace {

double rel_err(double got, double want) { return std::abs(got / want - 1.0); }

double boost_e1(double u) { return boost::math::expint(1, u); }

// Log-spaced arguments over [lo, hi], plus the points just around the piece boundary at u = 1.
std::vector<double> sweep(double lo, double hi, std::size_t n) {
  std::vector<double> u;
  for (std::size_t i = 0; i < n; ++i)
    u.push_back(n == 1 ? lo : std::exp(std::log(lo) + (std::log(hi) - std::log(lo)) * double(i) / double(n - 1)));
  u.push_back(std::nextafter(1.0, 0.0));
  u.push_back(1.0);
  u.push_back(std::nextafter(1.0, 2.0));
  return u;
}

}  // namespace

TEST_CASE("well function matches a published table of W(u) = E1(u)") {
  // Abramowitz & Stegun (1964), Table 5.1 (E1(x) to 10 digits for x <= 2, x e^x E1(x) beyond),
  // the same values as the hydrogeologists' W(u) tables (e.g. Freeze & Cherry 1979,
  // Appendix IV, to 3-4 digits). Values below are recalled (from memory) to the digits shown;
  // each is also checked against Boost.Math so a slip of memory cannot pass silently.
  struct Row {
    double u, w, digits_tol;
  };
  const Row table[] = {
      {1e-5, 10.9357, 5e-6},         // (from memory) W(1e-5) = 10.9357
      {1e-4, 8.633225, 1e-6},        // (from memory) W(1e-4) = 8.6332
      {1e-3, 6.331539, 1e-6},        // (from memory) W(1e-3) = 6.3315
      {0.01, 4.037930, 1e-6},        // (from memory) A&S: 4.0379 2958
      {0.1, 1.822924, 1e-6},         // (from memory) A&S: 1.8229 2396
      {0.5, 0.5597736, 1e-6},        // (from memory) A&S: 0.5597 7359
      {1.0, 0.2193839344, 1e-9},     // (from memory) A&S: 0.2193 8393 44
      {2.0, 0.04890051071, 1e-9},    // (from memory) A&S: 0.0489 0051 07
      {5.0, 1.148295591e-3, 1e-8},   // (from memory) A&S: 1.1482 9559 1e-3
      {10.0, 4.156968930e-6, 1e-8},  // (from memory) A&S: 4.1569 6893 0e-6
  };
  for (const Row& r : table) {
    CAPTURE(r.u);
    CHECK(rel_err(well_function(r.u), r.w) <= r.digits_tol);
    CHECK(rel_err(boost_e1(r.u), r.w) <= r.digits_tol);  // the recalled value agrees with Boost
  }
}

TEST_CASE("well function agrees with Boost.Math expint to 1e-13 over 1e-12 <= u <= 700") {
  const auto u = sweep(1e-12, 700.0, 40000);
  std::vector<double> batched(u.size());
  well_function(u.data(), batched.data(), u.size());
  double worst_scalar = 0, worst_batched = 0;
  for (std::size_t i = 0; i < u.size(); ++i) {
    const double ref = boost_e1(u[i]);  // Boost.Math, the general-purpose reference
    worst_scalar = std::max(worst_scalar, rel_err(well_function(u[i]), ref));
    worst_batched = std::max(worst_batched, rel_err(batched[i], ref));
  }
  MESSAGE("max relative error vs Boost.Math: scalar " << worst_scalar << ", batched " << worst_batched);
  CHECK(worst_scalar <= 1e-13);
  CHECK(worst_batched <= 1e-13);
  // The stated accuracy in well_function.hpp (1e-15) holds too.
  CHECK(worst_scalar <= 1e-15);
  CHECK(worst_batched <= 1e-15);
}

TEST_CASE("batched and scalar forms agree, including in place and odd lengths") {
  for (std::size_t n : {1u, 3u, 7u, 17u, 1001u}) {
    auto u = sweep(1e-6, 650.0, n);
    std::vector<double> out(u.size());
    well_function(u.data(), out.data(), u.size());
    for (std::size_t i = 0; i < u.size(); ++i)
      CHECK(rel_err(out[i], well_function(u[i])) <= 1e-15);
    std::vector<double> copy = u;
    well_function(copy.data(), copy.data(), copy.size());  // in place
    CHECK(copy == out);
  }
}

TEST_CASE("well function end behaviour: u -> 0, u = 0, underflow, bad arguments") {
  const double inf = std::numeric_limits<double>::infinity();
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double gamma = std::numbers::egamma;
  // u -> 0: E1(u) = -gamma - ln u + u - ... (A&S 1964, eq. 5.1.11); below 1e-17 the series
  // beyond the logarithm is below rounding.
  for (double u : {1e-17, 1e-100, 1e-300, 4.9e-324, 1e-310}) {
    CAPTURE(u);
    CHECK(rel_err(well_function(u), -gamma - std::log(u)) <= 3e-16);
  }
  CHECK(well_function(0.0) == inf);
  // Large u: e^(-u)/u (1 - 1/u + 2/u² ...) (A&S eq. 5.1.51); at 700 the result is still normal.
  const double w700 = well_function(700.0);
  CHECK(w700 >= DBL_MIN);
  CHECK(rel_err(w700, boost_e1(700.0)) <= 1e-15);
  // Just below the flush point the value is the smallest normals; above it exactly 0, never
  // subnormal, never NaN.
  const double below = std::nextafter(kWellFunctionUnderflow, 0.0);
  CHECK(well_function(below) >= DBL_MIN);
  CHECK(well_function(701.85) == 0.0);
  CHECK(well_function(1e6) == 0.0);
  CHECK(well_function(inf) == 0.0);
  for (double u = 700.0; u < 720.0; u += 0.01) {
    const double w = well_function(u);
    CHECK((w == 0.0 || w >= DBL_MIN));
  }
  CHECK(std::isnan(well_function(-1.0)));
  CHECK(std::isnan(well_function(nan)));
  // The batched form has the same end behaviour.
  std::vector<double> u = {0.0, 1e-310, 701.85, inf, -1.0, nan, 700.0, 1.0};
  std::vector<double> out(u.size());
  well_function(u.data(), out.data(), u.size());
  CHECK(out[0] == inf);
  CHECK(rel_err(out[1], -gamma - std::log(1e-310)) <= 3e-16);
  CHECK(out[2] == 0.0);
  CHECK(out[3] == 0.0);
  CHECK(std::isnan(out[4]));
  CHECK(std::isnan(out[5]));
  CHECK(rel_err(out[6], boost_e1(700.0)) <= 1e-15);
  CHECK(rel_err(out[7], 0.21938393439552027368) <= 1e-15);  // A&S Table 5.1 (from memory)
}
