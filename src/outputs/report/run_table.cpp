#include "outputs/report/run_table.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <limits>
#include <utility>

#include "core/errors.hpp"
#include "core/units/units.hpp"

namespace slipscreen::outputs::report {
namespace {

struct Suffix {
  std::string_view name;
  double factor;
};
// Column-name unit suffixes (docs/outputs.md, "Units in names") and their factors to SI.
constexpr std::array<Suffix, 24> kSuffixes = {{
    {"Pa", 1.0}, {"kPa", 1e3}, {"MPa", 1e6}, {"psi", units::kPsi},
    {"m", 1.0}, {"km", 1e3}, {"ft", units::kFoot}, {"mi", 1609.344},
    {"m2", 1.0}, {"m3", 1.0}, {"bbl", units::kBarrel},
    {"s", 1.0}, {"days", 86400.0}, {"years", units::kYear},
    {"deg", 1.0}, {"rad", 1.0},
    {"Pa_per_m", 1.0}, {"MPa_per_km", 1e3}, {"psi_per_ft", units::kPsi / units::kFoot},
    {"m3_per_s", 1.0}, {"m3_per_d", 1.0 / 86400.0}, {"bbl_per_d", units::kBarrel / 86400.0},
    {"m2_per_s", 1.0}, {"N_m", 1.0},
}};

}  // namespace

std::optional<double> suffix_factor(std::string_view suffix) {
  for (const auto& s : kSuffixes)
    if (s.name == suffix) return s.factor;
  return std::nullopt;
}

bool RunTable::exists(const std::filesystem::path& folder, const std::string& file) {
  std::error_code ec;
  return std::filesystem::is_regular_file(folder / file, ec);
}

RunTable RunTable::read(const std::filesystem::path& folder, const std::string& file) {
  RunTable t;
  t.table_ = formats::read_csv(folder / file, file);
  return t;
}

std::size_t RunTable::column(std::string_view name) const {
  if (const auto c = table_.column(name)) return *c;
  throw InputError("column", std::string(name), "a column of the run's table (is this run folder complete?)",
                   table_.file + " line " + std::to_string(table_.header_line));
}

bool RunTable::has_quantity(std::string_view base) const {
  for (const auto& h : table_.header)
    if (h.size() > base.size() + 1 && h.compare(0, base.size(), base) == 0 && h[base.size()] == '_' &&
        suffix_factor(std::string_view(h).substr(base.size() + 1)))
      return true;
  return false;
}

std::pair<std::size_t, double> RunTable::quantity_column(std::string_view base) const {
  for (std::size_t i = 0; i < table_.header.size(); ++i) {
    const auto& h = table_.header[i];
    if (h.size() > base.size() + 1 && h.compare(0, base.size(), base) == 0 && h[base.size()] == '_')
      if (const auto f = suffix_factor(std::string_view(h).substr(base.size() + 1))) return {i, *f};
  }
  throw InputError("column", std::string(base) + "_<unit>", "a column of the run's table with its unit",
                   table_.file + " line " + std::to_string(table_.header_line));
}

std::string RunTable::quantity_unit(std::string_view base) const {
  return table_.header[quantity_column(base).first].substr(base.size() + 1);
}

std::optional<std::size_t> RunTable::find_row(std::string_view name, std::string_view value) const {
  const std::size_t c = column(name);
  for (std::size_t i = 0; i < table_.rows.size(); ++i)
    if (table_.rows[i].fields[c] == value) return i;
  return std::nullopt;
}

const std::string& RunTable::text(std::size_t row, std::string_view name) const {
  return table_.rows.at(row).fields[column(name)];
}

double RunTable::number(std::size_t row, std::size_t col) const {
  const auto& r = table_.rows.at(row);
  const std::string& cell = r.fields[col];
  if (cell.empty()) return std::numeric_limits<double>::quiet_NaN();
  double v = 0;
  const auto [end, ec] = std::from_chars(cell.data(), cell.data() + cell.size(), v);
  if (ec != std::errc() || end != cell.data() + cell.size() || !std::isfinite(v))
    throw InputError(table_.header[col], cell, "a number", table_.where(r, col));
  return v;
}

double RunTable::si(std::size_t row, std::string_view base) const {
  const auto [col, factor] = quantity_column(base);
  return number(row, col) * factor;
}

}  // namespace slipscreen::outputs::report
