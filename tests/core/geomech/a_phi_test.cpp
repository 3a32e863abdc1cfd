#include "core/geomech/a_phi.hpp"

#include <doctest/doctest.h>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/frictional_limit.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

TEST_CASE("A_phi from magnitudes") {
  // Simpson (1997): φ = (S2−S3)/(S1−S3), A_φ = (n+0.5) + (−1)^n (φ−0.5); arithmetic on round numbers.
  CHECK_NEAR(a_phi(60e6, 50e6, 40e6), 0.5, 1e-15);   // normal, φ = 0.5
  CHECK_NEAR(a_phi(60e6, 55e6, 40e6), 0.75, 1e-15);  // normal, φ = 0.75
  CHECK_NEAR(a_phi(50e6, 60e6, 40e6), 1.5, 1e-15);   // strike-slip, φ = 0.5
  CHECK_NEAR(a_phi(55e6, 60e6, 40e6), 1.25, 1e-15);  // strike-slip, φ = 0.75 → 2 − 0.75
  CHECK_NEAR(a_phi(40e6, 60e6, 50e6), 2.5, 1e-15);   // reverse, φ = 0.5
  CHECK_NEAR(a_phi(40e6, 60e6, 45e6), 2.25, 1e-15);  // reverse, φ = 0.25
  // Regime boundaries: SHmax = Sv is A_φ = 1 (from either side); Shmin = Sv is A_φ = 2.
  CHECK_NEAR(a_phi(60e6, 60e6, 40e6), 1.0, 1e-15);
  CHECK_NEAR(a_phi(40e6, 60e6, 40e6), 2.0, 1e-15);
  CHECK_NEAR(a_phi(60e6, 40e6, 40e6), 0.0, 1e-15);  // SHmax = Shmin under Sv = S1
  CHECK_NEAR(a_phi(40e6, 60e6, 60e6), 3.0, 1e-15);  // SHmax = Shmin above Sv = S3
  CHECK(regime_of_a_phi(0.5) == FaultingRegime::normal);
  CHECK(regime_of_a_phi(1.5) == FaultingRegime::strike_slip);
  CHECK(regime_of_a_phi(2.5) == FaultingRegime::reverse);
}

TEST_CASE("A_phi round trip at frictional equilibrium, all regimes") {
  const double sv = 70e6, p0 = 30e6, mu = 0.6;
  const double q = frictional_limit_ratio(mu);
  for (int i = 0; i <= 300; ++i) {
    const double a = i / 100.0;
    CAPTURE(a);
    const auto h = horizontal_stresses_from_a_phi(a, sv, p0, mu);
    CHECK(h.shmax >= h.shmin);
    CHECK_NEAR(a_phi(sv, h.shmax, h.shmin), a, 1e-12);
    // S1 and S3 sit exactly on the frictional limit (Zoback 2007).
    const double s1 = std::max(sv, h.shmax), s3 = std::min(sv, h.shmin);
    CHECK_NEAR((s1 - p0) / (s3 - p0), q, 1e-12);
    CHECK(check_frictional_limit(s1, s3, p0, mu).status == LimitStatus::at_limit);
  }
  // Boundaries are continuous: A_φ = 1 has SHmax = Sv, A_φ = 2 has Shmin = Sv, from both sides.
  const auto at1 = horizontal_stresses_from_a_phi(1.0, sv, p0, mu);
  CHECK_NEAR(at1.shmax, sv, 1e-6);
  const auto near1 = horizontal_stresses_from_a_phi(1.0 + 1e-12, sv, p0, mu);
  CHECK_NEAR(near1.shmax, at1.shmax, 1.0);
  CHECK_NEAR(near1.shmin, at1.shmin, 1.0);
  const auto at2 = horizontal_stresses_from_a_phi(2.0, sv, p0, mu);
  CHECK_NEAR(at2.shmin, sv, 1e-6);
  const auto near2 = horizontal_stresses_from_a_phi(2.0 - 1e-12, sv, p0, mu);
  CHECK_NEAR(near2.shmax, at2.shmax, 1.0);
  CHECK_NEAR(near2.shmin, at2.shmin, 1.0);
  // Normal faulting, A_φ = 0 (arithmetic): Shmin = p0 + (Sv − p0)/q = SHmax.
  const auto at0 = horizontal_stresses_from_a_phi(0.0, sv, p0, mu);
  CHECK_NEAR(at0.shmin, p0 + (sv - p0) / q, 1e-6);
  CHECK_NEAR(at0.shmax, at0.shmin, 1e-6);
}

TEST_CASE("A_phi bad input") {
  CHECK_THROWS_WITH_AS(horizontal_stresses_from_a_phi(3.5, 70e6, 30e6, 0.6), doctest::Contains("field 'A_phi' = '3.5"), InputError);
  CHECK_THROWS_WITH_AS(horizontal_stresses_from_a_phi(-0.1, 70e6, 30e6, 0.6), doctest::Contains("field 'A_phi'"), InputError);
  CHECK_THROWS_WITH_AS(horizontal_stresses_from_a_phi(1.0, 70e6, 30e6, 0.0), doctest::Contains("field 'friction'"), InputError);
  CHECK_THROWS_WITH_AS(horizontal_stresses_from_a_phi(1.0, 20e6, 30e6, 0.6), doctest::Contains("field 'Sv'"), InputError);
  CHECK_THROWS_WITH_AS(a_phi(60e6, 40e6, 50e6), doctest::Contains("field 'Shmin'"), InputError);
  CHECK_THROWS_AS(a_phi(50e6, 50e6, 50e6), InputError);
}
