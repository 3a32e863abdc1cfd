#include "core/seismo/rupture_length_magnitude.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("Wells & Coppersmith (1994) length regressions") {
  // Table 2A all slip types, SRL: M = 5.08 + 1.16 log10(L km) (coefficients from memory);
  // L = 10 km -> 6.24, L = 100 km -> 7.40 (arithmetic).
  const auto s10 = magnitude_from_length(10e3, LengthRegression::surface_rupture_length_all);
  CHECK(s10.magnitude == doctest::Approx(6.24).epsilon(1e-12));
  CHECK(s10.sd == doctest::Approx(0.28).epsilon(1e-12));
  CHECK_FALSE(s10.extrapolated);
  CHECK(magnitude_from_length(100e3, LengthRegression::surface_rupture_length_all).magnitude ==
        doctest::Approx(7.40).epsilon(1e-12));
  // RLD: M = 4.38 + 1.49 log10(L km) (scanned Table 2A): 10 km -> 5.87 (arithmetic).
  const auto r10 = magnitude_from_length(10e3, LengthRegression::subsurface_rupture_length_all);
  CHECK(r10.magnitude == doctest::Approx(5.87).epsilon(1e-12));
  // A 500 m fault lies below the regressions' data range: flagged as extrapolated.
  const auto short_fault = magnitude_from_length(500.0, LengthRegression::surface_rupture_length_all);
  CHECK(short_fault.extrapolated);
  CHECK(short_fault.magnitude == doctest::Approx(5.08 + 1.16 * -0.30102999566).epsilon(1e-10));
  CHECK_THROWS_AS(magnitude_from_length(0.0, LengthRegression::surface_rupture_length_all), InputError);
}
