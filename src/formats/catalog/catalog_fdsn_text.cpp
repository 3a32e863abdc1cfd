#include "formats/catalog/catalog_fdsn_text.hpp"

#include <algorithm>
#include <cctype>
#include <fstream>
#include <optional>

#include "core/errors.hpp"
#include "formats/files/input_file.hpp"
#include "core/util/trim.hpp"
#include "formats/catalog/catalog_columns.hpp"

namespace slipscreen::formats {
namespace {

// The format's own column names (any case); depth is in km.
const CommonSpellings kFdsnNames = {{"Time"},    {"Latitude"}, {"Longitude"}, {"Depth/km"},
                                    {"Magnitude"}, {"MagType"}, {"EventID"},  "the FDSN text format"};

// The '|'-separated cells of a line, trimmed (the format has no quoting).
std::vector<std::string> cells_of(std::string_view line) {
  std::vector<std::string> cells;
  std::size_t pos = 0;
  while (true) {
    const auto bar = line.find('|', pos);
    cells.push_back(util::trim(line.substr(pos, bar == std::string_view::npos ? std::string_view::npos : bar - pos)));
    if (bar == std::string_view::npos) return cells;
    pos = bar + 1;
  }
}

std::string without_bom(std::string line) {
  if (line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);
  return line;
}

}  // namespace

bool is_fdsn_text_header(std::string_view line) {
  const std::string t = util::trim(line);
  if (t.empty() || t[0] != '#' || t.find('|') == std::string::npos) return false;
  std::string first = cells_of(std::string_view(t).substr(1)).front();
  std::transform(first.begin(), first.end(), first.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return first == "eventid";
}

CatalogReadResult read_catalog_fdsn_text(const std::string& path) {
  if (auto problem = input_file_problem(path)) throw IoError("cannot read catalog file '" + path + "': " + *problem);
  std::ifstream in(path);
  if (!in) throw IoError("cannot read catalog file '" + path + "'");
  CatalogReadResult r;
  r.path = path;
  r.format = "fdsn_text";
  r.catalog.kind = seismo::CoordinateKind::geographic;
  r.catalog.crs = "EPSG:4326";

  std::string line;
  std::size_t lineno = 0;
  std::optional<CatalogTableLayout> layout;
  while (std::getline(in, line)) {
    ++lineno;
    const std::string t = util::trim(lineno == 1 ? without_bom(line) : line);
    if (t.empty()) continue;
    const std::string where = path + " line " + std::to_string(lineno);
    if (!layout) {
      if (!is_fdsn_text_header(t))
        throw InputError("header", t, "the FDSN text header '#EventID|Time|Latitude|Longitude|Depth/km|...'")
            .located(where);
      layout.emplace(cells_of(std::string_view(t).substr(1)), t, CatalogColumns{}, kFdsnNames, where);
      r.columns = layout->columns_used();
      for (const auto& note : layout->notes()) r.warnings.push_back(path + ": " + note);
      continue;
    }
    if (t[0] == '#') continue;
    ++r.records;
    seismo::Event e;
    e.source = where;
    if (const auto reason = layout->read_event(cells_of(t), e)) r.rejected.push_back({lineno, *reason});
    else r.catalog.events.push_back(std::move(e));
  }
  if (!layout) throw InputError("catalog", path, "the FDSN text header line").located(path);
  return r;
}

}  // namespace slipscreen::formats
