#pragma once
// Small pieces the stress and catalog figures share (docs/report.md, "Stress and catalog
// figures"): the unit a figure shows a run's quantity in, numbers and times read from run
// tables, and the text of a figure's data CSV.
#include <cstddef>
#include <string>
#include <string_view>

#include "formats/gis/run_layers.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {

// The unit a figure shows a quantity in: the unit the run wrote it in (the column's suffix), so
// an oilfield run's figures are in psi and a SI run's in MPa.
struct DisplayUnit {
  std::string suffix;  // as in column names: "MPa", "psi", "m3", "bbl"
  double factor = 1;   // SI per display unit: shown value = SI value / factor
  double shown(double si) const { return si / factor; }
};

// The unit of the run's column `<base>_<unit>` in `table` (InputError when absent).
DisplayUnit unit_of(const RunTable& table, std::string_view base);

// The quantity `<base>_<unit>` in SI, where the cell "inf" (a Δp_crit that no pressure reaches,
// status `never`) is +∞ and an empty cell NaN.
double si_or_infinite(const RunTable& table, std::size_t row, std::string_view base);

// A time column (ISO 8601, UTC) as days since 1970-01-01, the date axes' unit; an empty cell is
// NaN. InputError naming the file and line otherwise.
double table_days(const RunTable& table, std::size_t row, std::string_view column);

// A GeoPackage feature's attribute as text ("" when the layer has no such field).
std::string feature_field(const formats::LayerFeature& f, const std::string& name);
// Whether a feature of the run's `wells` layer is a proposed well (its `proposed` field).
bool proposed_well(const formats::LayerFeature& f);

// A number as a figure's data CSV writes it: shortest text that reads back to the same double
// for the values the run tables hold (10 significant digits); NaN and ±∞ as an empty cell.
std::string data_number(double v);

}  // namespace slipscreen::outputs::report
