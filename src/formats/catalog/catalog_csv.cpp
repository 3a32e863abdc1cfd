#include "formats/catalog/catalog_csv.hpp"

#include <charconv>
#include <cmath>
#include <fstream>
#include <map>
#include <optional>

#include "core/util/trim.hpp"
#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "core/util/suggest.hpp"
#include "formats/catalog/catalog_records.hpp"
#include "formats/table/csv_fields.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::formats {
namespace {

std::optional<double> parse_number(const std::string& s) {
  double v = 0.0;
  const char* b = s.data();
  const char* e = s.data() + s.size();
  if (b != e && *b == '+') ++b;
  const auto [p, ec] = std::from_chars(b, e, v);
  if (ec != std::errc() || p != e || !std::isfinite(v)) return std::nullopt;
  return v;
}

// A comment line before the header adds its text to the catalog's description.
void append_description(std::string& description, const std::string& comment_line) {
  const std::string text = util::trim(std::string_view(comment_line).substr(1));
  if (!text.empty()) description += (description.empty() ? "" : " ") + text;
}

std::vector<std::string> read_header(const std::string& line, char delimiter, const std::string& where) {
  try {
    return split_csv_record(line, delimiter);
  } catch (const InputError& e) {
    throw e.located(where);
  }
}

// Where the mapped columns stand in the header (empty: not mapped, or optional and absent).
struct ColumnIndex {
  std::optional<std::size_t> time, lat, lon, x, y, depth, mag, type, id;
};

// Finds the mapped columns in the header; a required column that is missing is an InputError
// located at the header line, with a "did you mean".
ColumnIndex find_columns(const std::vector<std::string>& header, const CatalogColumns& cols, bool projected,
                         const std::string& where) {
  std::map<std::string, std::size_t> index;  // the first column of a name wins
  for (std::size_t i = 0; i < header.size(); ++i) index.emplace(header[i], i);
  auto col = [&](const std::string& name, bool required, const char* what) -> std::optional<std::size_t> {
    if (name.empty()) return std::nullopt;
    const auto it = index.find(name);
    if (it != index.end()) return it->second;
    if (required)
      throw InputError(std::string(what) + " column", name, "a column of that name in the header" +
                                                                util::did_you_mean(name, header))
          .located(where);
    return std::nullopt;
  };
  ColumnIndex at;
  at.time = col(cols.time, true, "time");
  at.mag = col(cols.magnitude, true, "magnitude");
  if (projected) {
    at.x = col(cols.x, true, "x");
    at.y = col(cols.y, true, "y");
  } else {
    at.lat = col(cols.latitude, true, "latitude");
    at.lon = col(cols.longitude, true, "longitude");
  }
  at.depth = col(cols.depth, cols.depth_explicit, "depth");
  at.type = col(cols.magnitude_type, cols.magnitude_type_explicit, "magnitude type");
  at.id = col(cols.id, cols.id_explicit, "id");
  return at;
}

// What reading a data row needs to know about the file.
struct RowLayout {
  const CatalogColumns& cols;
  const ColumnIndex& at;
  std::size_t fields;   // in the header
  bool projected;
  double depth_factor;  // metres per unit of a bare depth number
};

// The cell as a number in [lo, hi] into `out`; otherwise the reason the row is unusable.
std::optional<std::string> number_cell(const std::string& cell, const std::string& name, double lo, double hi,
                                       const char* expected, double& out) {
  if (cell.empty()) return "field '" + name + "' is empty: expected " + expected;
  const auto v = parse_number(cell);
  if (!v || *v < lo || *v > hi) return "field '" + name + "' = '" + cell + "': expected " + expected;
  out = *v;
  return std::nullopt;
}

// A bare number takes the mapped depth unit; a cell may state its own unit instead.
std::optional<std::string> depth_cell(const std::string& cell, const RowLayout& layout, std::optional<double>& out) {
  if (const auto v = parse_number(cell)) {
    out = *v * layout.depth_factor;
    return std::nullopt;
  }
  try {
    out = units::parse(cell, units::Dimension::length, layout.cols.depth);
  } catch (const InputError& err) {
    return std::string(err.what());
  }
  return std::nullopt;
}

// One data row as the event `e` (its source already set); otherwise the reason the row is unusable.
std::optional<std::string> read_event(const std::string& line, const RowLayout& layout, seismo::Event& e) {
  const CatalogColumns& cols = layout.cols;
  const ColumnIndex& at = layout.at;
  std::vector<std::string> f;
  try {
    f = split_csv_record(line, cols.delimiter);
  } catch (const InputError& err) {
    return std::string(err.what());
  }
  if (f.size() != layout.fields)
    return std::to_string(f.size()) + " fields where the header has " + std::to_string(layout.fields);
  try {
    e.time = parse_iso8601_utc(f[*at.time], cols.time);
  } catch (const InputError& err) {
    return std::string(err.what());
  }
  if (auto why = number_cell(f[*at.mag], cols.magnitude, -5.0, 10.5, "a magnitude between -5 and 10.5", e.magnitude))
    return why;
  if (layout.projected) {
    if (auto why = number_cell(f[*at.x], cols.x, -1e9, 1e9, "a projected coordinate in metres", e.x)) return why;
    if (auto why = number_cell(f[*at.y], cols.y, -1e9, 1e9, "a projected coordinate in metres", e.y)) return why;
  } else {
    if (auto why = number_cell(f[*at.lat], cols.latitude, -90.0, 90.0, "a latitude between -90 and 90 degrees", e.y))
      return why;
    if (auto why =
            number_cell(f[*at.lon], cols.longitude, -180.0, 360.0, "a longitude between -180 and 360 degrees", e.x))
      return why;
  }
  if (at.depth && !f[*at.depth].empty())
    if (auto why = depth_cell(f[*at.depth], layout, e.depth)) return why;
  e.magnitude_type = at.type ? f[*at.type] : "";
  if (e.magnitude_type.empty()) e.magnitude_type = cols.magnitude_type_default;
  if (at.id) e.id = f[*at.id];
  return std::nullopt;
}

}  // namespace

CatalogColumns parse_catalog_columns(std::string_view text) {
  CatalogColumns c;
  const std::vector<std::string> keys = {"time", "lat", "lon", "x", "y", "crs", "depth", "depth_unit",
                                         "mag", "magtype", "magtype_default", "id", "delimiter"};
  const char sep = text.find(';') != std::string_view::npos ? ';' : ',';
  std::size_t pos = 0;
  while (pos <= text.size()) {
    const auto next = text.find(sep, pos);
    const std::string pair = util::trim(text.substr(pos, next == std::string_view::npos ? std::string_view::npos : next - pos));
    pos = next == std::string_view::npos ? text.size() + 1 : next + 1;
    if (pair.empty()) continue;
    const auto eq = pair.find('=');
    if (eq == std::string::npos)
      throw InputError("column mapping", pair, "key=column pairs such as 'time=origin_time'");
    const std::string key = util::trim(pair.substr(0, eq));
    std::string val = util::trim(pair.substr(eq + 1));
    if (val.empty()) throw InputError("column mapping key '" + key + "'", "", "a column name ('-' for none)");
    if (val == "-") val.clear();
    if (key == "time") c.time = val;
    else if (key == "lat") c.latitude = val;
    else if (key == "lon") c.longitude = val;
    else if (key == "x") c.x = val;
    else if (key == "y") c.y = val;
    else if (key == "crs") c.crs = val;
    else if (key == "depth") { c.depth = val; c.depth_explicit = true; }
    else if (key == "depth_unit") {
      units::lookup(val, units::Dimension::length, "depth_unit");
      c.depth_unit = val;
    }
    else if (key == "mag") c.magnitude = val;
    else if (key == "magtype") { c.magnitude_type = val; c.magnitude_type_explicit = true; }
    else if (key == "magtype_default") c.magnitude_type_default = val;
    else if (key == "id") { c.id = val; c.id_explicit = true; }
    else if (key == "delimiter") {
      if (val == "tab") c.delimiter = '\t';
      else if (val == "semicolon") c.delimiter = ';';
      else if (val.size() == 1) c.delimiter = val[0];
      else throw InputError("column mapping key 'delimiter'", val, "one character, 'tab' or 'semicolon'");
    } else {
      throw InputError("column mapping key", key, "one of time, lat, lon, x, y, crs, depth, depth_unit, mag, magtype, "
                                                  "magtype_default, id, delimiter" + util::did_you_mean(key, keys));
    }
  }
  if (c.x.empty() != c.y.empty()) throw InputError("column mapping", c.x.empty() ? "y only" : "x only", "both x and y, or neither");
  if (!c.x.empty() && c.crs.empty())
    throw InputError("column mapping key 'crs'", "", "the CRS of the x/y columns, e.g. 'crs=EPSG:32614'");
  if (c.time.empty() || c.magnitude.empty() || (c.x.empty() && (c.latitude.empty() || c.longitude.empty())))
    throw InputError("column mapping", std::string(text), "columns for time, magnitude and coordinates");
  return c;
}

CatalogReadResult read_catalog_csv(const std::string& path, const CatalogColumns& cols) {
  std::ifstream in(path);
  if (!in) throw IoError("cannot read catalog file '" + path + "'");
  CatalogReadResult r;
  r.path = path;
  r.format = "csv";
  const bool projected = !cols.x.empty();
  r.catalog.kind = projected ? seismo::CoordinateKind::projected : seismo::CoordinateKind::geographic;
  r.catalog.crs = cols.crs.empty() ? "EPSG:4326" : cols.crs;
  const double depth_factor = units::from_unit(1.0, cols.depth_unit, units::Dimension::length);

  std::string line;
  std::size_t lineno = 0;
  std::vector<std::string> header;
  ColumnIndex at;
  while (std::getline(in, line)) {
    ++lineno;
    if (lineno == 1 && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);  // UTF-8 byte-order mark
    const std::string t = util::trim(line);
    if (t.empty()) continue;
    if (t[0] == '#') {
      if (header.empty()) append_description(r.catalog.description, t);
      continue;
    }
    const std::string where = path + " line " + std::to_string(lineno);
    if (header.empty()) {
      header = read_header(t, cols.delimiter, where);
      at = find_columns(header, cols, projected, where);
      if (!at.depth) r.warnings.push_back(path + ": no depth column '" + cols.depth + "': depths unknown");
      continue;
    }
    ++r.records;
    const RowLayout layout{cols, at, header.size(), projected, depth_factor};
    seismo::Event e;
    e.source = where;
    if (const auto reason = read_event(t, layout, e))
      r.rejected.push_back({lineno, *reason});
    else
      r.catalog.events.push_back(std::move(e));
  }
  if (header.empty()) throw InputError("catalog", path, "a header line naming the columns").located(path);
  return r;
}

}  // namespace slipscreen::formats
