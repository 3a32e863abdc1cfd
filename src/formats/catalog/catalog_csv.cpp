#include "formats/catalog/catalog_csv.hpp"

#include <fstream>
#include <optional>

#include "core/errors.hpp"
#include "formats/files/input_file.hpp"
#include "core/util/trim.hpp"
#include "formats/table/csv_fields.hpp"

namespace slipscreen::formats {
namespace {

// A comment line before the header adds its text to the catalog's description.
void append_description(std::string& description, const std::string& comment_line) {
  const std::string text = util::trim(std::string_view(comment_line).substr(1));
  if (!text.empty()) description += (description.empty() ? "" : " ") + text;
}

std::vector<std::string> split_located(const std::string& line, char delimiter, const std::string& where) {
  try {
    return split_csv_record(line, delimiter);
  } catch (const InputError& e) {
    throw e.located(where);
  }
}

// One data row as an event into `r` (or its reason to be unusable).
void read_row(const std::string& line, std::size_t lineno, const std::string& where, const CatalogTableLayout& layout,
              char delimiter, CatalogReadResult& r) {
  ++r.records;
  seismo::Event e;
  e.source = where;
  std::optional<std::string> reason;
  try {
    reason = layout.read_event(split_csv_record(line, delimiter), e);
  } catch (const InputError& err) {
    reason = err.what();
  }
  if (reason) r.rejected.push_back({lineno, *reason});
  else r.catalog.events.push_back(std::move(e));
}

}  // namespace

CatalogReadResult read_catalog_csv(const std::string& path, const CatalogColumns& cols) {
  if (auto problem = input_file_problem(path)) throw IoError("cannot read catalog file '" + path + "': " + *problem);
  std::ifstream in(path);
  if (!in) throw IoError("cannot read catalog file '" + path + "'");
  CatalogReadResult r;
  r.path = path;
  r.format = "csv";
  r.catalog.kind = cols.projected() ? seismo::CoordinateKind::projected : seismo::CoordinateKind::geographic;
  r.catalog.crs = cols.crs.empty() ? "EPSG:4326" : cols.crs;

  std::string line;
  std::size_t lineno = 0;
  std::optional<CatalogTableLayout> layout;
  while (std::getline(in, line)) {
    ++lineno;
    if (lineno == 1 && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);  // UTF-8 byte-order mark
    const std::string t = util::trim(line);
    if (t.empty()) continue;
    if (t[0] == '#') {
      if (!layout) append_description(r.catalog.description, t);
      continue;
    }
    const std::string where = path + " line " + std::to_string(lineno);
    if (layout) {
      read_row(t, lineno, where, *layout, cols.delimiter, r);
      continue;
    }
    layout.emplace(split_located(t, cols.delimiter, where), t, cols, kCommonSpellings, where);
    r.columns = layout->columns_used();
    for (const auto& note : layout->notes()) r.warnings.push_back(path + ": " + note);
  }
  if (!layout) throw InputError("catalog", path, "a header line naming the columns").located(path);
  return r;
}

}  // namespace slipscreen::formats
