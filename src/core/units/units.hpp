#pragma once
// Units layer: values with a unit written beside them ("2e4 bbl/d", "10 mD", "0.7 psi/ft")
// become SI doubles, and SI doubles are reported in any known unit of the same dimension.
//
// Internal units (SI): m, s, Pa, Pa/m, m², Pa·s, 1/Pa, m³/s, m³, kg/m³, m²/s, rad.
// Conversion factors are exact definitions where one exists (NIST SP 811, 2008 edition,
// Appendix B: ft = 0.3048 m, lbf = 4.4482216152605 N, so psi = lbf/in² = 6894.757293168 Pa;
// bbl = 42 US gal = 0.158987294928 m³; US gal = 231 in³ = 3.785411784e-3 m³; lb = 0.45359237 kg;
// cP = 1e-3 Pa·s); the darcy is 9.869233e-13 m² (common practice).
//
// Mud weight: `ppg` (pounds per US gallon) is read as the pressure gradient of a fluid column of
// that density under standard gravity, g · 0.45359237 kg / 3.785411784e-3 m³ = 1175.0958 Pa/m,
// which is 12/231 = 0.0519481 psi/ft exactly. The rounded 0.052 psi/ft of common practice is
// 0.1 % larger; the exact value is used (docs/scenario.md).
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::units {

enum class Dimension {
  dimensionless,      // plain numbers, fractions ("0.2", "20 %")
  length,             // m
  time,               // s
  pressure,           // Pa (also stress)
  pressure_gradient,  // Pa/m (stress and pore-pressure gradients)
  permeability,       // m²
  viscosity,          // Pa·s
  compressibility,    // 1/Pa
  volume_rate,        // m³/s
  volume,             // m³
  density,            // kg/m³
  diffusivity,        // m²/s (hydraulic diffusivity, transmissivity)
  angle,              // rad
  inverse_time,       // 1/s (event rates)
};

struct Unit {
  std::string_view symbol;
  Dimension dimension;
  double to_si;  // SI value of one of this unit
};

// Human name of a dimension, e.g. "volume rate".
std::string_view dimension_name(Dimension d);

// The SI symbol used in column names and JSON, e.g. "Pa", "m3/s".
std::string_view si_symbol(Dimension d);

// All unit symbols accepted for a dimension, in table order.
std::vector<std::string> symbols_for(Dimension d);

// Look up a unit symbol for an expected dimension. Throws InputError naming `field` when the
// symbol is unknown ("did you mean") or belongs to another dimension.
const Unit& lookup(std::string_view symbol, Dimension expected, std::string_view field);

// Parse "<number> <unit>" (space optional: "10mD" works) into SI. A bare number is accepted
// only for dimensionless values. Throws InputError naming `field` for a missing number, NaN or
// infinity, a missing unit, an unknown unit, or a unit of another dimension.
double parse(std::string_view text, Dimension expected, std::string_view field);

// SI value expressed in `unit` (e.g. to_unit(6.894757e6, "psi", pressure) == 1000).
double to_unit(double si_value, std::string_view unit, Dimension expected);

// Value in `unit` expressed in SI.
double from_unit(double value, std::string_view unit, Dimension expected);

// Common constants in SI (exact by definition unless noted).
inline constexpr double kFoot = 0.3048;                       // m
inline constexpr double kPsi = 6894.757293168361;             // Pa (lbf/in²)
inline constexpr double kBarrel = 0.158987294928;             // m³ (42 US gal)
inline constexpr double kDay = 86400.0;                       // s
inline constexpr double kHour = 3600.0;                       // s
inline constexpr double kYear = 365.25 * 86400.0;             // s (Julian year)
inline constexpr double kMilliDarcy = 9.869233e-16;           // m² (common practice)
inline constexpr double kCentiPoise = 1.0e-3;                 // Pa·s
inline constexpr double kStandardGravity = 9.80665;           // m/s² (CGPM 1901)
inline constexpr double kPound = 0.45359237;                  // kg (NIST SP 811, exact)
inline constexpr double kUsGallon = 3.785411784e-3;           // m³ (231 in³, exact)
inline constexpr double kPoundPerGallonGradient = kStandardGravity * kPound / kUsGallon;  // Pa/m per ppg

// The unit systems a run's outputs can be written in (docs/outputs.md, "Units in names").
enum class UnitSystem { si, oilfield };

// "SI" or "oilfield".
std::string_view unit_system_name(UnitSystem u);
// The system named `name` ("SI" or "oilfield", exactly as written); nothing for other text.
std::optional<UnitSystem> unit_system_named(std::string_view name);
// Every accepted name, for messages: {"SI", "oilfield"}.
std::vector<std::string> unit_system_names();

}  // namespace slipscreen::units
