#include "outputs/report/figure_support.hpp"

#include <cmath>
#include <limits>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::outputs::report {

DisplayUnit unit_of(const RunTable& table, std::string_view base) {
  // The units a run writes its quantities in (docs/outputs.md, "Units in names").
  static const char* const kWritten[] = {"MPa", "psi", "kPa", "Pa", "m3", "bbl", "m", "ft", "km", "days", "s"};
  for (const char* suffix : kWritten)
    if (table.has_column(std::string(base) + "_" + suffix)) return {suffix, *suffix_factor(suffix)};
  table.quantity_column(base);  // InputError when the table has no such quantity
  throw InputError("column", std::string(base) + "_<unit>", "a unit the report shows (MPa, psi, m3, bbl, m, ft...)",
                   table.file());
}

double si_or_infinite(const RunTable& table, std::size_t row, std::string_view base) {
  const auto [col, factor] = table.quantity_column(base);
  if (table.text(row, col) == "inf") return std::numeric_limits<double>::infinity();
  return table.number(row, col) * factor;
}

double table_days(const RunTable& table, std::size_t row, std::string_view column) {
  const std::string& cell = table.text(row, column);
  if (cell.empty()) return std::numeric_limits<double>::quiet_NaN();
  try {
    return formats::parse_iso8601_utc(cell, column) / 86400.0;
  } catch (InputError& e) {
    throw e.located(table.file() + " line " + std::to_string(row + 2));
  }
}

std::string data_number(double v) { return std::isfinite(v) ? util::number_text(v, 10) : std::string(); }

std::string feature_field(const formats::LayerFeature& f, const std::string& name) {
  const auto it = f.fields.find(name);
  return it == f.fields.end() ? std::string() : it->second;
}

bool proposed_well(const formats::LayerFeature& f) {
  const std::string p = feature_field(f, "proposed");
  return p == "1" || p == "yes" || p == "true";
}

}  // namespace slipscreen::outputs::report
