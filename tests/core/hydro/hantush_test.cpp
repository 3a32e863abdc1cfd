#include "core/hydro/hantush.hpp"

#include <doctest/doctest.h>

#include <boost/math/special_functions/bessel.hpp>
#include <cmath>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/well_function.hpp"
#include "support/python_reference.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

struct Reference {
  double u, beta, w, quad_error, k0x2;
};

// scipy.integrate.quad of the defining integral and 2·scipy.special.k0, computed now by
// tests/core/hydro/hantush_reference.py under /usr/bin/python3.
std::vector<Reference> scipy_reference(const std::vector<std::pair<double, double>>& pairs) {
  std::vector<std::string> input;
  for (const auto& [u, b] : pairs) {
    std::ostringstream line;
    line.precision(17);
    line << u << " " << b;
    input.push_back(line.str());
  }
  std::vector<Reference> out;
  for (const std::string& line : test::python_reference("tests/core/hydro/hantush_reference.py", input)) {
    Reference r{};
    std::istringstream ss(line);
    ss >> r.u >> r.beta >> r.w >> r.quad_error >> r.k0x2;
    if (ss) out.push_back(r);
  }
  REQUIRE(out.size() == pairs.size());
  return out;
}

}  // namespace

TEST_CASE("leaky well function: against scipy quad of the Hantush-Jacob integral to 1e-12 relative") {
  std::vector<std::pair<double, double>> pairs;
  for (double u : {1e-10, 1e-7, 1e-4, 1e-2, 0.1, 0.5, 1.0, 3.0, 10.0, 50.0, 200.0, 500.0})
    for (double b : {1e-6, 1e-3, 0.05, 0.3, 1.0, 2.5, 6.0, 20.0}) pairs.emplace_back(u, b);
  double worst = 0.0;
  for (const Reference& r : scipy_reference(pairs)) {
    CAPTURE(r.u);
    CAPTURE(r.beta);
    const double w = leaky_well_function(r.u, r.beta);
    REQUIRE(r.w > 0.0);
    CHECK(r.quad_error <= 1e-13 * r.w);  // the reference itself is good to better than the claim
    const double rel = std::fabs(w - r.w) / r.w;
    CHECK(rel <= 1e-12);
    worst = std::max(worst, rel);
  }
  MESSAGE("worst relative difference from scipy quad: " << worst);
}

TEST_CASE("leaky well function: steady state 2 K0(r/B) at large times; a published table value") {
  for (double b : {1e-4, 0.01, 0.2, 1.0, 4.0, 12.0}) {
    CAPTURE(b);
    const double k0x2 = 2.0 * boost::math::cyl_bessel_k(0, b);  // Boost.Math
    // Large t: u → 0 leaves W → 2K0(β) (Hantush & Jacob 1955); the remainder is about
    // E1(β²/(4u)), far below 1e-12 at u = 1e-12 for β ≥ 1e-4.
    CHECK(std::fabs(leaky_well_function(1e-12, b) - k0x2) <= 1e-12 * k0x2);
    CHECK(leaky_well_function(0.0, b) == k0x2);
  }
  // Published table value, Hantush (1956) table of W(u, r/B) (value recalled from memory, to its
  // 4 decimals): W(0.01, 0.1) = 3.8150; and the steady row W(u → 0, 0.1) = 2K0(0.1) = 4.8541.
  CHECK(std::fabs(leaky_well_function(0.01, 0.1) - 3.8150) <= 5e-5);
  CHECK(std::fabs(leaky_well_function(1e-8, 0.1) - 4.8541) <= 5e-5);
}

TEST_CASE("leaky well function: B to infinity is Theis to 1e-10; ends of the domain") {
  // A huge aquitard resistance: B = 1e12 m, so β = r/B ≤ 1e-8 for r ≤ 10 km.
  double worst = 0.0;
  for (double u = 1e-6; u <= 700.0; u *= 1.7) {
    for (double b : {1e-8, 1e-10, 0.0}) {
      const double e1 = well_function(u);
      const double rel = std::fabs(leaky_well_function(u, b) - e1) / e1;
      CHECK(rel <= 1e-10);
      worst = std::max(worst, rel);
    }
  }
  MESSAGE("worst relative difference from E1 for beta <= 1e-8: " << worst);
  CHECK(leaky_well_function(3.0, 0.0) == well_function(3.0));
  CHECK(std::isinf(leaky_well_function(0.0, 0.0)));
  CHECK(leaky_well_function(710.0, 0.5) == 0.0);
  CHECK(std::isnan(leaky_well_function(-1.0, 0.5)));
  CHECK(std::isnan(leaky_well_function(1.0, -0.5)));
  CHECK(std::isnan(leaky_well_function(std::numeric_limits<double>::quiet_NaN(), 0.5)));
  // Leakage only lowers the pressure: W(u, β) < E1(u), decreasing in β.
  CHECK(leaky_well_function(0.1, 0.5) < leaky_well_function(0.1, 0.2));
  CHECK(leaky_well_function(0.1, 0.2) < well_function(0.1));
}

TEST_CASE("leakage factor B = sqrt(k h b'/k')") {
  // k = 1e-13 m2, h = 50 m, b' = 20 m, k' = 1e-18 m2: B = sqrt(1e-13·50·20/1e-18) = sqrt(1e8) = 1e4 m (arithmetic).
  CHECK(std::fabs(leakage_factor(1e-13, 50.0, 20.0, 1e-18) - 1e4) <= 1e-9);
  CHECK_THROWS_AS(leakage_factor(1e-13, 50.0, 0.0, 1e-18), InputError);
  CHECK_THROWS_WITH(leakage_factor(1e-13, 50.0, 20.0, -1.0), doctest::Contains("aquitard_permeability"));
}
