#include "core/units/units.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <numbers>

#include "core/util/trim.hpp"
#include "core/errors.hpp"
#include "core/util/suggest.hpp"

namespace slipscreen::units {
namespace {

using D = Dimension;
constexpr double kBar = 1.0e5;
constexpr double kDeg = std::numbers::pi / 180.0;

// One table of every accepted symbol. Aliases are listed beside the main symbol.
const std::array kUnits = {
    Unit{"1", D::dimensionless, 1.0},
    Unit{"%", D::dimensionless, 0.01},
    Unit{"fraction", D::dimensionless, 1.0},

    Unit{"m", D::length, 1.0},
    Unit{"km", D::length, 1000.0},
    Unit{"cm", D::length, 0.01},
    Unit{"ft", D::length, kFoot},
    Unit{"mi", D::length, 1609.344},

    Unit{"s", D::time, 1.0},
    Unit{"min", D::time, 60.0},
    Unit{"h", D::time, kHour},
    Unit{"hr", D::time, kHour},
    Unit{"d", D::time, kDay},
    Unit{"day", D::time, kDay},
    Unit{"days", D::time, kDay},
    Unit{"yr", D::time, kYear},
    Unit{"year", D::time, kYear},
    Unit{"years", D::time, kYear},

    Unit{"Pa", D::pressure, 1.0},
    Unit{"kPa", D::pressure, 1.0e3},
    Unit{"MPa", D::pressure, 1.0e6},
    Unit{"GPa", D::pressure, 1.0e9},
    Unit{"bar", D::pressure, kBar},
    Unit{"psi", D::pressure, kPsi},
    Unit{"atm", D::pressure, 101325.0},

    Unit{"Pa/m", D::pressure_gradient, 1.0},
    Unit{"kPa/m", D::pressure_gradient, 1.0e3},
    Unit{"MPa/km", D::pressure_gradient, 1.0e3},
    Unit{"MPa/m", D::pressure_gradient, 1.0e6},
    Unit{"bar/m", D::pressure_gradient, kBar},
    Unit{"psi/ft", D::pressure_gradient, kPsi / kFoot},
    Unit{"ppg", D::pressure_gradient, kPoundPerGallonGradient},  // mud weight, see units.hpp

    Unit{"m2", D::permeability, 1.0},
    Unit{"m²", D::permeability, 1.0},
    Unit{"D", D::permeability, 1000.0 * kMilliDarcy},
    Unit{"darcy", D::permeability, 1000.0 * kMilliDarcy},
    Unit{"mD", D::permeability, kMilliDarcy},
    Unit{"md", D::permeability, kMilliDarcy},

    Unit{"Pa.s", D::viscosity, 1.0},
    Unit{"Pa·s", D::viscosity, 1.0},
    Unit{"mPa.s", D::viscosity, 1.0e-3},
    Unit{"mPa·s", D::viscosity, 1.0e-3},
    Unit{"cP", D::viscosity, kCentiPoise},
    Unit{"cp", D::viscosity, kCentiPoise},

    Unit{"1/Pa", D::compressibility, 1.0},
    Unit{"1/kPa", D::compressibility, 1.0e-3},
    Unit{"1/MPa", D::compressibility, 1.0e-6},
    Unit{"1/GPa", D::compressibility, 1.0e-9},
    Unit{"1/bar", D::compressibility, 1.0 / kBar},
    Unit{"1/psi", D::compressibility, 1.0 / kPsi},

    Unit{"m3/s", D::volume_rate, 1.0},
    Unit{"m³/s", D::volume_rate, 1.0},
    Unit{"m3/h", D::volume_rate, 1.0 / kHour},
    Unit{"m3/d", D::volume_rate, 1.0 / kDay},
    Unit{"m³/d", D::volume_rate, 1.0 / kDay},
    Unit{"m3/day", D::volume_rate, 1.0 / kDay},
    Unit{"L/s", D::volume_rate, 1.0e-3},
    Unit{"bbl/d", D::volume_rate, kBarrel / kDay},
    Unit{"bbl/day", D::volume_rate, kBarrel / kDay},
    Unit{"bpd", D::volume_rate, kBarrel / kDay},
    Unit{"Mbbl/d", D::volume_rate, 1.0e3 * kBarrel / kDay},

    Unit{"m3", D::volume, 1.0},
    Unit{"m³", D::volume, 1.0},
    Unit{"L", D::volume, 1.0e-3},
    Unit{"bbl", D::volume, kBarrel},
    Unit{"Mbbl", D::volume, 1.0e3 * kBarrel},
    Unit{"MMbbl", D::volume, 1.0e6 * kBarrel},

    Unit{"kg/m3", D::density, 1.0},
    Unit{"kg/m³", D::density, 1.0},
    Unit{"g/cm3", D::density, 1000.0},
    Unit{"g/cc", D::density, 1000.0},

    Unit{"m2/s", D::diffusivity, 1.0},
    Unit{"m²/s", D::diffusivity, 1.0},
    Unit{"m2/d", D::diffusivity, 1.0 / kDay},
    Unit{"ft2/d", D::diffusivity, kFoot * kFoot / kDay},

    Unit{"deg", D::angle, kDeg},
    Unit{"°", D::angle, kDeg},
    Unit{"rad", D::angle, 1.0},

    Unit{"1/s", D::inverse_time, 1.0},
    Unit{"1/d", D::inverse_time, 1.0 / kDay},
    Unit{"1/yr", D::inverse_time, 1.0 / kYear},
};

std::string example_for(Dimension d) {
  switch (d) {
    case D::dimensionless: return "'0.2' or '20 %'";
    case D::length: return "'3000 ft' or '2.5 km'";
    case D::time: return "'30 d' or '10 yr'";
    case D::pressure: return "'25 MPa' or '3500 psi'";
    case D::pressure_gradient: return "'0.7 psi/ft', '23 MPa/km' or '9 ppg'";
    case D::permeability: return "'10 mD' or '1e-14 m2'";
    case D::viscosity: return "'0.5 cP' or '5e-4 Pa.s'";
    case D::compressibility: return "'1e-9 1/Pa' or '6e-6 1/psi'";
    case D::volume_rate: return "'2e4 bbl/d' or '3000 m3/d'";
    case D::volume: return "'1e6 bbl' or '2e5 m3'";
    case D::density: return "'2400 kg/m3' or '2.4 g/cc'";
    case D::diffusivity: return "'0.1 m2/s'";
    case D::angle: return "'35 deg'";
    case D::inverse_time: return "'0.5 1/yr'";
  }
  return "a value with a unit";
}

std::string units_list(Dimension d) {
  std::string s;
  for (const auto& sym : symbols_for(d)) s += (s.empty() ? "" : ", ") + sym;
  return s;
}

}  // namespace

std::string_view dimension_name(Dimension d) {
  switch (d) {
    case D::dimensionless: return "dimensionless";
    case D::length: return "length";
    case D::time: return "time";
    case D::pressure: return "pressure";
    case D::pressure_gradient: return "pressure gradient";
    case D::permeability: return "permeability";
    case D::viscosity: return "viscosity";
    case D::compressibility: return "compressibility";
    case D::volume_rate: return "volume rate";
    case D::volume: return "volume";
    case D::density: return "density";
    case D::diffusivity: return "diffusivity";
    case D::angle: return "angle";
    case D::inverse_time: return "rate per time";
  }
  return "unknown";
}

std::string_view si_symbol(Dimension d) {
  switch (d) {
    case D::dimensionless: return "1";
    case D::length: return "m";
    case D::time: return "s";
    case D::pressure: return "Pa";
    case D::pressure_gradient: return "Pa/m";
    case D::permeability: return "m2";
    case D::viscosity: return "Pa.s";
    case D::compressibility: return "1/Pa";
    case D::volume_rate: return "m3/s";
    case D::volume: return "m3";
    case D::density: return "kg/m3";
    case D::diffusivity: return "m2/s";
    case D::angle: return "rad";
    case D::inverse_time: return "1/s";
  }
  return "?";
}

std::vector<std::string> symbols_for(Dimension d) {
  std::vector<std::string> out;
  for (const auto& u : kUnits)
    if (u.dimension == d) out.emplace_back(u.symbol);
  return out;
}

const Unit& lookup(std::string_view symbol, Dimension expected, std::string_view field) {
  const std::string sym_text = util::trim(symbol);
  const std::string_view sym = sym_text;
  for (const auto& u : kUnits) {
    if (u.symbol != sym) continue;
    if (u.dimension == expected) return u;
    throw InputError(std::string(field), std::string(sym),
                     "a " + std::string(dimension_name(expected)) + " unit (" +
                         units_list(expected) + "), not a " +
                         std::string(dimension_name(u.dimension)) + " unit");
  }
  std::vector<std::string> all;
  for (const auto& u : kUnits) all.emplace_back(u.symbol);
  throw InputError(std::string(field), std::string(sym),
                   "a known " + std::string(dimension_name(expected)) + " unit (" +
                       units_list(expected) + ")" + util::did_you_mean(sym, symbols_for(expected)));
}

double parse(std::string_view text, Dimension expected, std::string_view field) {
  const std::string s_text = util::trim(text);
  const std::string_view s = s_text;
  const std::string expectation =
      "a number with a " + std::string(dimension_name(expected)) + " unit, such as " + example_for(expected);
  double value = 0.0;
  const char* begin = s.data();
  const char* end = s.data() + s.size();
  const auto [ptr, ec] = std::from_chars(begin, end, value);
  if (ec != std::errc{} || ptr == begin) throw InputError(std::string(field), std::string(s), expectation);
  if (!std::isfinite(value)) throw InputError(std::string(field), std::string(s), "a finite number");
  const std::string unit_text = util::trim(std::string_view(ptr, static_cast<std::size_t>(end - ptr)));
  const std::string_view unit = unit_text;
  if (unit.empty()) {
    if (expected == D::dimensionless) return value;
    throw InputError(std::string(field), std::string(s),
                     expectation + " (the unit is missing)");
  }
  const double si = value * lookup(unit, expected, field).to_si;
  if (!std::isfinite(si))
    throw InputError(std::string(field), std::string(s),
                     "a value that stays finite when converted to " + std::string(si_symbol(expected)) + " (this one overflows)");
  return si;
}

std::string_view unit_system_name(UnitSystem u) { return u == UnitSystem::oilfield ? "oilfield" : "SI"; }

std::optional<UnitSystem> unit_system_named(std::string_view name) {
  if (name == "SI") return UnitSystem::si;
  if (name == "oilfield") return UnitSystem::oilfield;
  return std::nullopt;
}

std::vector<std::string> unit_system_names() { return {"SI", "oilfield"}; }

double to_unit(double si_value, std::string_view unit, Dimension expected) {
  return si_value / lookup(unit, expected, "unit").to_si;
}

double from_unit(double value, std::string_view unit, Dimension expected) {
  return value * lookup(unit, expected, "unit").to_si;
}

}  // namespace slipscreen::units
