#include "core/geomech/horizontal_stress.hpp"

#include <doctest/doctest.h>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

TEST_CASE("uniaxial-strain Shmin, worked example") {
  // Worked by hand (arithmetic): z = 3 km, Sv = 69 MPa (23 MPa/km), p0 = 30 MPa, ν = 0.25 so
  // ν/(1−ν) = 1/3; α = 1: Shmin = (69 − 30)/3 + 30 = 43 MPa; α = 0.8: (69 − 24)/3 + 24 = 39 MPa.
  UniaxialStrainModel m;
  m.poisson = 0.25;
  m.biot = 1.0;
  auto h = horizontal_stresses_uniaxial_strain(m, 69e6, 30e6);
  CHECK_NEAR(h.shmin, 43e6, 1e-6);
  CHECK_NEAR(h.shmax, 43e6, 1e-6);  // no tectonic terms: isotropic horizontal stress
  m.biot = 0.8;
  h = horizontal_stresses_uniaxial_strain(m, 69e6, 30e6);
  CHECK_NEAR(h.shmin, 39e6, 1e-6);
  // Eaton (1969) in oilfield units (his α = 1): ν = 0.25, Sv = 1 psi/ft, p = 0.465 psi/ft gives a
  // fracture gradient (0.535/3 + 0.465) = 0.643333 psi/ft (arithmetic).
  m.biot = 1.0;
  const double g = units::kPsi / units::kFoot;
  h = horizontal_stresses_uniaxial_strain(m, 1.0 * g, 0.465 * g);
  CHECK_NEAR(h.shmin / g, 0.535 / 3.0 + 0.465, 1e-12);
}

TEST_CASE("tectonic strain and stress terms") {
  // Blanton & Olson (1999) form (from memory), arithmetic: E = 20 GPa, ν = 0.25, εH = 1e-4,
  // E/(1−ν²) = 21.3333 GPa → SHmax += 2.13333 MPa, Shmin += ν × that = 0.533333 MPa.
  UniaxialStrainModel m;
  m.poisson = 0.25;
  m.young = 20e9;
  m.strain_H = 1e-4;
  m.tectonic_h = 1e6;
  const auto h = horizontal_stresses_uniaxial_strain(m, 69e6, 30e6);
  CHECK_NEAR(h.shmax, 43e6 + 20e9 / (1 - 0.0625) * 1e-4, 1e-6);
  CHECK_NEAR(h.shmax, 45.1333333e6, 1.0);
  CHECK_NEAR(h.shmin, 43e6 + 0.25 * 20e9 / (1 - 0.0625) * 1e-4 + 1e6, 1e-6);
}

TEST_CASE("gradients") {
  const auto h = horizontal_stresses_from_gradients(30e3, 18e3, 2000.0);
  CHECK_NEAR(h.shmax, 60e6, 1e-6);
  CHECK_NEAR(h.shmin, 36e6, 1e-6);
  CHECK_THROWS_WITH_AS(horizontal_stresses_from_gradients(30e3, 18e3, -1.0), doctest::Contains("field 'depth'"), InputError);
}

TEST_CASE("uniaxial-strain bad input") {
  UniaxialStrainModel m;
  m.poisson = 0.5;
  CHECK_THROWS_WITH_AS(check(m), doctest::Contains("field 'Poisson's ratio'"), InputError);
  m.poisson = 0.25;
  m.biot = 1.2;
  CHECK_THROWS_WITH_AS(check(m), doctest::Contains("field 'Biot coefficient'"), InputError);
  m.biot = 1.0;
  m.strain_h = 1e-4;
  CHECK_THROWS_WITH_AS(check(m), doctest::Contains("field 'Young's modulus'"), InputError);
}
