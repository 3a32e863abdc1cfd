#pragma once
// The tables of a finished run folder, read back for the report (docs/report.md). Strict: a table
// the report needs that is missing or malformed is an InputError naming the file, line and column;
// the report never draws a figure from half a table.
//
// Quantities are returned in SI whatever the run's output units: the unit is the column name's
// suffix (docs/outputs.md, "Units in names"): `dp_MPa` and `dp_psi` both answer si(row, "dp").
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "formats/table/csv.hpp"

namespace slipscreen::outputs::report {

// The factor to SI of a column-name unit suffix ("MPa" -> 1e6, "psi", "ft", "bbl", "m3", "days"...);
// nothing when the suffix is not a unit.
std::optional<double> suffix_factor(std::string_view suffix);

class RunTable {
 public:
  // Reads `folder`/`file`. Throws InputError/IoError naming the file.
  static RunTable read(const std::filesystem::path& folder, const std::string& file);
  // Whether the run wrote this table.
  static bool exists(const std::filesystem::path& folder, const std::string& file);

  const std::string& file() const { return table_.file; }
  std::size_t rows() const { return table_.rows.size(); }
  // The column named exactly `name`; InputError naming the file when absent.
  std::size_t column(std::string_view name) const;
  bool has_column(std::string_view name) const { return table_.column(name).has_value(); }
  // The column `<base>_<unit>` and its factor to SI; InputError when absent.
  std::pair<std::size_t, double> quantity_column(std::string_view base) const;
  bool has_quantity(std::string_view base) const;
  // The unit suffix of the column `<base>_<unit>` as the run wrote it ("MPa", "psi"); InputError when absent.
  std::string quantity_unit(std::string_view base) const;
  // The first row whose column `name` holds `value` exactly; nothing when none.
  std::optional<std::size_t> find_row(std::string_view name, std::string_view value) const;
  const std::vector<std::string>& header() const { return table_.header; }

  const std::string& text(std::size_t row, std::string_view column) const;
  const std::string& text(std::size_t row, std::size_t col) const { return table_.rows[row].fields[col]; }
  // A plain number; an empty cell is NaN; anything else not a number is an InputError at the cell.
  double number(std::size_t row, std::size_t col) const;
  double number(std::size_t row, std::string_view column) const { return number(row, this->column(column)); }
  // The quantity `<base>_<unit>` in SI (NaN for an empty cell).
  double si(std::size_t row, std::string_view base) const;

 private:
  formats::CsvTable table_;
};

}  // namespace slipscreen::outputs::report
