// Checked cells of the scenario's CSV tables; see csv_cells.hpp.
#include "scenario/csv_cells.hpp"

#include <charconv>
#include <cmath>

#include "core/errors.hpp"
#include "core/util/suggest.hpp"
#include "core/util/trim.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::scenario {

std::size_t need_column(const formats::CsvTable& t, std::string_view name, const std::vector<std::string>& also) {
  if (auto c = t.column(name)) return *c;
  for (const auto& a : also)
    if (auto c = t.column(a)) return *c;
  std::vector<std::string> names;
  for (const auto& h : t.header) names.push_back(formats::split_header_unit(h).name);
  throw InputError("column '" + std::string(name) + "'", "(missing)",
                   "a header column named '" + std::string(name) + "'" + util::did_you_mean(name, names),
                   t.file + " line " + std::to_string(t.header_line));
}

double cell_number(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col) {
  const std::string s = util::trim(row.fields[col]);
  double v = 0;
  const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || ptr != s.data() + s.size() || s.empty() || !std::isfinite(v))
    throw InputError(formats::split_header_unit(t.header[col]).name, s, "a plain number (coordinate)", t.where(row, col));
  return v;
}

util::CivilDate parse_date_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col, bool month) {
  const std::string s = util::trim(row.fields[col]);
  const auto d = month ? util::parse_iso_month(s) : util::parse_iso_date(s);
  if (!d)
    throw InputError(formats::split_header_unit(t.header[col]).name, s,
                     month ? "a month as YYYY-MM, e.g. 2019-07"
                           : formats::date_expectation(s, "a date as YYYY-MM-DD, e.g. 2019-07-01"),
                     t.where(row, col));
  if (!plausible::plausible_date(*d))
    throw InputError(formats::split_header_unit(t.header[col]).name, s,
                     month ? "a month from 1900-01 to 2200-12" : plausible::kDateExpected, t.where(row, col));
  return *d;
}

// A cell's quantity within its physical range (scenario/plausibility.hpp), echoed as written.
double checked_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col, units::Dimension d,
                    const plausible::Range& range) {
  const double v = formats::cell_quantity(t, row, col, d);
  if (!range.contains(v))
    throw InputError(formats::split_header_unit(t.header[col]).name, util::trim(row.fields[col]), range.expected,
                     t.where(row, col));
  return v;
}

// A coordinate cell: within the range of its CRS's kind (degrees or projected units).
double coordinate_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col,
                       const plausible::Range& range) {
  const double v = cell_number(t, row, col);
  if (!range.contains(v))
    throw InputError(formats::split_header_unit(t.header[col]).name, util::trim(row.fields[col]), range.expected,
                     t.where(row, col));
  return v;
}

}  // namespace slipscreen::scenario
