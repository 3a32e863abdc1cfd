#include "outputs/output_units.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include "core/util/number_text.hpp"

namespace slipscreen::outputs {
namespace {

using units::kBarrel;
using units::kDay;
using units::kFoot;
using units::kMilliDarcy;
using units::kPsi;

struct UnitText {
  std::string_view suffix, symbol;
  double size;  // in SI
};

struct KindUnits {
  Quantity kind;
  UnitText si, oilfield;
};

// The one mapping of the two systems (docs/outputs.md, "Units in names"). Factors: core/units.
const std::array kKinds = {
    KindUnits{Quantity::pressure, {"MPa", "MPa", 1.0e6}, {"psi", "psi", kPsi}},
    KindUnits{Quantity::length, {"m", "m", 1.0}, {"ft", "ft", kFoot}},
    KindUnits{Quantity::distance_long, {"km", "km", 1.0e3}, {"mi", "mi", 1609.344}},  // international mile, exact
    KindUnits{Quantity::volume, {"m3", "m3", 1.0}, {"bbl", "bbl", kBarrel}},
    KindUnits{Quantity::volume_rate, {"m3_per_d", "m3/d", 1.0 / kDay}, {"bbl_per_d", "bbl/d", kBarrel / kDay}},
    KindUnits{Quantity::pressure_gradient, {"MPa_per_km", "MPa/km", 1.0e3}, {"psi_per_ft", "psi/ft", kPsi / kFoot}},
    KindUnits{Quantity::permeability, {"m2", "m2", 1.0}, {"mD", "mD", kMilliDarcy}},
};

const KindUnits& kind_units(Quantity q) {
  return *std::find_if(kKinds.begin(), kKinds.end(), [q](const KindUnits& k) { return k.kind == q; });
}

// Every unit suffix a slipscreen table or JSON key ends in, in either system, with the SI value
// of one unit. The kinds above, then the units written the same way in both systems.
struct SuffixSize {
  std::string_view suffix;
  double to_si;
};
const std::array kOtherSuffixes = {
    SuffixSize{"Pa", 1.0},          SuffixSize{"s", 1.0},
    SuffixSize{"days", kDay},       SuffixSize{"years", units::kYear},
    SuffixSize{"deg", 3.14159265358979323846 / 180.0}, SuffixSize{"rad", 1.0},
    SuffixSize{"per_s", 1.0},       SuffixSize{"per_year", 1.0 / units::kYear},
    SuffixSize{"per_Pa", 1.0},      SuffixSize{"m2_per_s", 1.0},
    SuffixSize{"kg_per_m3", 1.0},   SuffixSize{"Pa_per_m", 1.0},
    SuffixSize{"Pa_s", 1.0},        SuffixSize{"Pa_s_per_m3", 1.0},
    SuffixSize{"N_m", 1.0},
};

}  // namespace

std::string_view OutputUnits::suffix(Quantity q) const {
  const auto& k = kind_units(q);
  return system_ == units::UnitSystem::oilfield ? k.oilfield.suffix : k.si.suffix;
}

std::string_view OutputUnits::symbol(Quantity q) const {
  const auto& k = kind_units(q);
  return system_ == units::UnitSystem::oilfield ? k.oilfield.symbol : k.si.symbol;
}

double OutputUnits::size_in_si(Quantity q) const {
  const auto& k = kind_units(q);
  return system_ == units::UnitSystem::oilfield ? k.oilfield.size : k.si.size;
}

int OutputUnits::decimals(Quantity q, int si_decimals) const {
  if (system_ == units::UnitSystem::si) return si_decimals;
  const auto& k = kind_units(q);
  const double f = k.oilfield.size / k.si.size;  // the oilfield unit in the SI column's unit
  return std::max(0, si_decimals + static_cast<int>(std::ceil(std::log10(f))));
}

std::string OutputUnits::column(std::string_view base, Quantity q) const {
  std::string c(base);
  c += '_';
  c += suffix(q);
  return c;
}

std::string OutputUnits::text(double si, Quantity q, int si_decimals) const {
  return util::fixed_decimals(value(si, q), decimals(q, si_decimals));
}

void OutputUnits::append(std::string& out, double si, Quantity q, int si_decimals) const {
  util::append_fixed(out, value(si, q), decimals(q, si_decimals));
}

std::string readme_units_line(const OutputUnits& u, std::string_view rest) {
  return "Units: " + std::string(u.system_name()) + " (tables: pressures in " + std::string(u.symbol(Quantity::pressure)) +
         ", depths and distances in " + std::string(u.symbol(Quantity::length)) + "; " + std::string(rest) + ")";
}

ColumnUnit column_unit(std::string_view header) {
  ColumnUnit best{std::string(header), "", 1.0};
  const auto consider = [&](std::string_view suffix, double to_si) {
    if (header.size() <= suffix.size() + 1 || suffix.size() <= best.suffix.size()) return;
    const std::size_t at = header.size() - suffix.size();
    if (header.substr(at) != suffix || header[at - 1] != '_') return;
    best = {std::string(header.substr(0, at - 1)), std::string(suffix), to_si};
  };
  for (const auto& k : kKinds) {
    consider(k.si.suffix, k.si.size);
    consider(k.oilfield.suffix, k.oilfield.size);
  }
  for (const auto& s : kOtherSuffixes) consider(s.suffix, s.to_si);
  return best;
}

}  // namespace slipscreen::outputs
