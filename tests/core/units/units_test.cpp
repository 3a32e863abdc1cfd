#include "core/units/units.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;
using units::Dimension;

TEST_CASE("conversion factors match their definitions") {
  // NIST SP 811 (2008), Appendix B.8: 1 psi = 6.894 757 E+03 Pa; 1 ft = 0.3048 m (exact);
  // 1 barrel (42 US gal) = 1.589 873 E-01 m3; 1 cP = 1.0 E-03 Pa s (exact).
  CHECK(units::parse("1 psi", Dimension::pressure, "p") == doctest::Approx(6894.757).epsilon(1e-7));
  CHECK(units::parse("1 ft", Dimension::length, "z") == 0.3048);
  CHECK(units::parse("1 bbl", Dimension::volume, "v") == doctest::Approx(0.1589873).epsilon(1e-7));
  CHECK(units::parse("0.5 cP", Dimension::viscosity, "mu") == doctest::Approx(5e-4).epsilon(1e-15));
  // Common practice: 1 mD = 9.869233e-16 m2.
  CHECK(units::parse("10 mD", Dimension::permeability, "k") == doctest::Approx(9.869233e-15).epsilon(1e-12));
  // Common practice: hydrostatic 0.433 psi/ft is about 9.79 MPa/km.
  CHECK(units::parse("0.433 psi/ft", Dimension::pressure_gradient, "g") ==
        doctest::Approx(9794.7).epsilon(1e-4));
  // 2e4 bbl/d = 2e4 * 0.158987294928 / 86400 m3/s = 0.036802614566 m3/s (arithmetic).
  CHECK(units::parse("2e4 bbl/d", Dimension::volume_rate, "q") ==
        doctest::Approx(0.036802614566).epsilon(1e-10));
  CHECK(units::parse("1e-9 1/Pa", Dimension::compressibility, "ct") == 1e-9);
  CHECK(units::parse("20 %", Dimension::dimensionless, "phi") == doctest::Approx(0.2).epsilon(1e-15));
  CHECK(units::parse("0.2", Dimension::dimensionless, "phi") == 0.2);
  CHECK(units::parse("10mD", Dimension::permeability, "k") == doctest::Approx(9.869233e-15).epsilon(1e-12));
}

TEST_CASE("values are reported in any unit of their dimension") {
  CHECK(units::to_unit(6894.757293168361e3, "psi", Dimension::pressure) == doctest::Approx(1000).epsilon(1e-14));
  CHECK(units::to_unit(1.0e6, "MPa", Dimension::pressure) == 1.0);
  CHECK(units::from_unit(3000, "ft", Dimension::length) == doctest::Approx(914.4).epsilon(1e-14));
}

TEST_CASE("unknown, missing and incompatible units are clear errors") {
  CHECK_THROWS_WITH_AS(units::parse("10", Dimension::permeability, "permeability"),
                       doctest::Contains("unit is missing"), InputError);
  CHECK_THROWS_WITH_AS(units::parse("10 furlong", Dimension::length, "depth"),
                       doctest::Contains("field 'depth' = 'furlong'"), InputError);
  CHECK_THROWS_WITH_AS(units::parse("10 MPA", Dimension::pressure, "p"),
                       doctest::Contains("did you mean 'MPa'"), InputError);
  CHECK_THROWS_WITH_AS(units::parse("10 psi", Dimension::length, "depth"),
                       doctest::Contains("not a pressure unit"), InputError);
  CHECK_THROWS_AS(units::parse("abc psi", Dimension::pressure, "p"), InputError);
  CHECK_THROWS_AS(units::parse("nan psi", Dimension::pressure, "p"), InputError);
  CHECK_THROWS_AS(units::parse("", Dimension::pressure, "p"), InputError);
  // A finite number whose SI value overflows (1e308 km is 1e311 m) is refused, not returned as inf.
  CHECK_THROWS_WITH_AS(units::parse("1e308 km", Dimension::length, "depth"),
                       doctest::Contains("field 'depth' = '1e308 km'"), InputError);
}

TEST_CASE("mud weight in ppg is the gradient of that fluid column under standard gravity") {
  // NIST SP 811 Appendix B: lb = 0.45359237 kg, US gal = 3.785411784e-3 m3 (both exact), and
  // g = 9.80665 m/s2 (CGPM 1901): 1 ppg = 9.80665 * 0.45359237 / 3.785411784e-3 Pa/m
  // = 1175.0958334 Pa/m (arithmetic, python3).
  CHECK(units::parse("1 ppg", Dimension::pressure_gradient, "g") ==
        doctest::Approx(1175.0958334472443).epsilon(1e-14));
  // Since 1 US gal = 231 in3 (exact), 1 ppg is 12/231 psi/ft exactly; the field's rounding of it
  // is 0.052 psi/ft (common practice), 0.1 % above the exact value used here.
  CHECK(units::to_unit(units::parse("1 ppg", Dimension::pressure_gradient, "g"), "psi/ft",
                       Dimension::pressure_gradient) == doctest::Approx(12.0 / 231.0).epsilon(1e-14));
  const double ppg_in_psi_per_ft =
      units::to_unit(units::parse("9 ppg", Dimension::pressure_gradient, "g"), "psi/ft", Dimension::pressure_gradient) / 9;
  CHECK(std::abs(ppg_in_psi_per_ft - 0.052) / 0.052 < 1.0e-3);
  CHECK(std::abs(ppg_in_psi_per_ft - 0.052) / 0.052 > 0.9e-3);  // exact, not the rounding
  // A mud weight is a gradient, never a density or a volume rate.
  CHECK_THROWS_WITH_AS(units::parse("9 ppg", Dimension::density, "rho"),
                       doctest::Contains("not a pressure gradient unit"), InputError);
}

TEST_CASE("bpd is barrels per day") {
  CHECK(units::parse("2e4 bpd", Dimension::volume_rate, "q") == units::parse("2e4 bbl/d", Dimension::volume_rate, "q"));
  // 2e4 bbl/d = 0.036802614566 m3/s (arithmetic from NIST SP 811's barrel, as above).
  CHECK(units::parse("2e4 bpd", Dimension::volume_rate, "q") == doctest::Approx(0.036802614566).epsilon(1e-10));
  CHECK_THROWS_WITH_AS(units::parse("100 bpd", Dimension::volume, "v"), doctest::Contains("not a volume rate unit"),
                       InputError);
}

TEST_CASE("unit systems are named SI and oilfield") {
  CHECK(units::unit_system_named("SI") == units::UnitSystem::si);
  CHECK(units::unit_system_named("oilfield") == units::UnitSystem::oilfield);
  CHECK_FALSE(units::unit_system_named("si").has_value());
  CHECK_FALSE(units::unit_system_named("imperial").has_value());
  CHECK(units::unit_system_name(units::UnitSystem::oilfield) == "oilfield");
  CHECK(units::unit_system_name(units::UnitSystem::si) == "SI");
}
