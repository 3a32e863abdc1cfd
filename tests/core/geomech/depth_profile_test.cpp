#include "core/geomech/depth_profile.hpp"

#include <doctest/doctest.h>

#include <vector>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

TEST_CASE("stress from a constant gradient") {
  // Common practice: an overburden gradient of 1 psi/ft gives 10 000 psi at 10 000 ft.
  const double g = units::kPsi / units::kFoot;
  CHECK_NEAR(from_gradient(g, 10000 * units::kFoot, "Sv gradient") / units::kPsi, 10000.0, 1e-9);
  CHECK(from_gradient(g, 0.0, "Sv gradient") == 0.0);
}

TEST_CASE("hydrostatic pore pressure") {
  // Common practice: fresh-water hydrostatic gradient ≈ 0.433 psi/ft ≈ 9.8 MPa/km.
  CHECK_NEAR(kHydrostaticGradient / (units::kPsi / units::kFoot), 0.433, 0.001);
  // Arithmetic: 1000 kg/m3 × 9.80665 m/s2 × 2000 m = 19.6133 MPa.
  CHECK_NEAR(hydrostatic_pressure(2000.0), 19.6133e6, 1e-6);
}

TEST_CASE("Sv integrated through a layered density table") {
  const std::vector<DensityLayer> layers = {{0.0, 2000.0}, {1000.0, 2500.0}};
  // Arithmetic: 9.80665 × (2000 × 1000 + 2500 × 2000) = 68.64655 MPa at 3000 m.
  CHECK_NEAR(vertical_stress_from_layers(layers, 3000.0), 68.64655e6, 1e-6);
  // Inside the first layer: 9.80665 × 2000 × 500 = 9.80665 MPa.
  CHECK_NEAR(vertical_stress_from_layers(layers, 500.0), 9.80665e6, 1e-6);
  // At the boundary: 9.80665 × 2000 × 1000 = 19.6133 MPa.
  CHECK_NEAR(vertical_stress_from_layers(layers, 1000.0), 19.6133e6, 1e-6);
  // One layer is the gradient ρ g.
  const std::vector<DensityLayer> one = {{0.0, 2300.0}};
  CHECK_NEAR(vertical_stress_from_layers(one, 2500.0), from_gradient(2300.0 * units::kStandardGravity, 2500.0, "g"), 1e-6);
}

TEST_CASE("bad depth profiles name the field") {
  CHECK_THROWS_WITH_AS(from_gradient(1.0, -5.0, "Sv gradient"), doctest::Contains("field 'depth'"), InputError);
  CHECK_THROWS_WITH_AS(from_gradient(-1.0, 5.0, "Sv gradient"), doctest::Contains("field 'Sv gradient'"), InputError);
  const std::vector<DensityLayer> unsorted = {{0.0, 2000.0}, {1000.0, 2400.0}, {800.0, 2500.0}};
  CHECK_THROWS_WITH_AS(vertical_stress_from_layers(unsorted, 100.0), doctest::Contains("density layer 3 top"), InputError);
  const std::vector<DensityLayer> no_surface = {{10.0, 2000.0}};
  CHECK_THROWS_WITH_AS(vertical_stress_from_layers(no_surface, 100.0), doctest::Contains("density layer 1 top"), InputError);
  const std::vector<DensityLayer> bad_density = {{0.0, 2000.0}, {100.0, 0.0}};
  CHECK_THROWS_WITH_AS(vertical_stress_from_layers(bad_density, 50.0), doctest::Contains("density layer 2 density"), InputError);
  CHECK_THROWS_AS(vertical_stress_from_layers({}, 50.0), InputError);
}
