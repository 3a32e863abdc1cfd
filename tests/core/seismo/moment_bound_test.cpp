#include "core/seismo/moment_bound.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("McGarr bound and IASPEI moment magnitude") {
  // McGarr (2014): M0 = G ΔV = 30e9 Pa · 1e6 m3 = 3e16 N·m.
  const double m0 = mcgarr_max_moment(30e9, 1e6);
  CHECK(m0 == doctest::Approx(3e16).epsilon(1e-15));
  // IASPEI (2013): Mw = (2/3)(log10 3e16 - 9.1) = (2/3)(16.4771213 - 9.1) = 4.9180808 (arithmetic).
  CHECK(moment_magnitude(m0) == doctest::Approx(4.918080836479775).epsilon(1e-13));
  CHECK(std::abs(moment_magnitude(m0) - 4.92) < 0.005);
  // Round trip and a fixed point: Mw 6 is 10^(9 + 9.1) = 1.2589e18 N·m (arithmetic).
  CHECK(seismic_moment(6.0) == doctest::Approx(1.2589254117941673e18).epsilon(1e-13));
  CHECK(moment_magnitude(seismic_moment(3.3)) == doctest::Approx(3.3).epsilon(1e-13));
  CHECK(mcgarr_max_moment(30e9, 0.0) == 0.0);
}

TEST_CASE("bad moduli, volumes and moments are input errors") {
  CHECK_THROWS_WITH_AS(mcgarr_max_moment(0.0, 1e6), doctest::Contains("shear modulus"), InputError);
  CHECK_THROWS_WITH_AS(mcgarr_max_moment(30e9, -1.0), doctest::Contains("net injected volume"), InputError);
  CHECK_THROWS_AS(moment_magnitude(0.0), InputError);
}
