#pragma once
// The units a run's tables and console summary are written in: SI or oilfield
// ([output] units, `--units`; docs/outputs.md, "Units in names"). One table per quantity kind
// holds the column suffix, the size of the unit in SI and how the number of printed decimals
// follows from the SI column's, so every writer names and formats a quantity the same way.
//
// Decimals: a kind's SI column prints d decimals of its SI unit (say 6 decimals of MPa, 1 Pa).
// The oilfield column prints d + ceil(log10(f)) decimals, f being the oilfield unit's size in
// the SI column's unit (psi = 6.894757e-3 MPa: 6 - 2 = 4 decimals, 1e-4 psi = 0.69 Pa), so its
// last printed digit is never coarser than the SI column's.
//
// Working-CRS coordinates (x, y) are not a quantity kind here: they stay in the CRS's own unit.
#include <optional>
#include <string>
#include <string_view>

#include "core/units/units.hpp"

namespace slipscreen::outputs {

// The kinds of quantity whose unit depends on the unit system. Durations (days), angles (deg),
// rates per year and diffusivities (m2/s) are written the same way in both systems.
enum class Quantity {
  pressure,           // stress, Δp, Δp_crit, ΔCFF: MPa | psi
  length,             // depth, distance, segment length: m | ft
  distance_long,      // console distances: km | mi
  volume,             // m3 | bbl
  volume_rate,        // m3/d | bbl/d
  pressure_gradient,  // MPa/km | psi/ft
  permeability,       // m2 | mD
};

class OutputUnits {
 public:
  explicit OutputUnits(units::UnitSystem system = units::UnitSystem::si) : system_(system) {}

  units::UnitSystem system() const { return system_; }
  std::string_view system_name() const { return units::unit_system_name(system_); }

  // The column-name suffix without its underscore ("MPa", "psi", "bbl_per_d").
  std::string_view suffix(Quantity q) const;
  // The unit as written in text and on the console ("MPa", "psi", "bbl/d").
  std::string_view symbol(Quantity q) const;
  // The unit's size in SI (1e6 for MPa, 6894.757... for psi).
  double size_in_si(Quantity q) const;
  // The decimals to print in this system for a column printing `si_decimals` in SI.
  int decimals(Quantity q, int si_decimals) const;

  // "<base>_<suffix>": column("dp", pressure) is "dp_MPa" or "dp_psi".
  std::string column(std::string_view base, Quantity q) const;
  // An SI value in this system's unit (si / size, so that SI tables keep their bytes).
  double value(double si, Quantity q) const { return si / size_in_si(q); }
  // An SI value as table text in this system: fixed decimals (util::fixed_decimals).
  std::string text(double si, Quantity q, int si_decimals) const;
  void append(std::string& out, double si, Quantity q, int si_decimals) const;

 private:
  units::UnitSystem system_;
};

// README.txt's line naming the unit system of the tables: "Units: SI (tables: pressures in MPa,
// depths and distances in m; <rest>)".
std::string readme_units_line(const OutputUnits& u, std::string_view rest);

// A table header read back: `dp_psi` is base "dp" with unit "psi", 6894.757293168361 Pa per psi.
struct ColumnUnit {
  std::string base;    // the name without its unit suffix (the whole name when it has none)
  std::string suffix;  // "psi", "MPa", "m2_per_s", ...; empty when the column has no unit
  double to_si = 1.0;  // SI value of one unit of the column (1 when it has none)
};

// Splits a header cell written by slipscreen in either system into its base name and unit, so a
// reader (the report, a user's script) accepts `dp_MPa` and `dp_psi` alike: value * to_si is SI
// (Pa, m, m3, m3/s, Pa/m, m2, s, rad, 1/s ...). The longest known suffix wins (`diffusivity_m2_per_s`
// is m2/s, not "_s"). A name with no known unit suffix has base = the name, suffix "", to_si 1.
ColumnUnit column_unit(std::string_view header);

}  // namespace slipscreen::outputs
