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
  std::map<std::string, std::size_t> index;
  auto col = [&](const std::string& name, bool required, const char* what) -> std::optional<std::size_t> {
    if (name.empty()) return std::nullopt;
    const auto it = index.find(name);
    if (it != index.end()) return it->second;
    if (required)
      throw InputError(std::string(what) + " column", name, "a column of that name in the header" +
                                                                util::did_you_mean(name, header))
          .located(path + " line " + std::to_string(lineno));
    return std::nullopt;
  };
  std::optional<std::size_t> c_time, c_lat, c_lon, c_x, c_y, c_depth, c_mag, c_type, c_id;
  while (std::getline(in, line)) {
    ++lineno;
    if (lineno == 1 && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);  // UTF-8 byte-order mark
    const std::string t = util::trim(line);
    if (t.empty()) continue;
    if (t[0] == '#') {
      if (header.empty()) {
        const std::string text = util::trim(std::string_view(t).substr(1));
        if (!text.empty()) r.catalog.description += (r.catalog.description.empty() ? "" : " ") + text;
      }
      continue;
    }
    if (header.empty()) {
      try {
        header = split_csv_record(t, cols.delimiter);
      } catch (const InputError& e) {
        throw e.located(path + " line " + std::to_string(lineno));
      }
      for (std::size_t i = 0; i < header.size(); ++i) index.emplace(header[i], i);
      c_time = col(cols.time, true, "time");
      c_mag = col(cols.magnitude, true, "magnitude");
      if (projected) {
        c_x = col(cols.x, true, "x");
        c_y = col(cols.y, true, "y");
      } else {
        c_lat = col(cols.latitude, true, "latitude");
        c_lon = col(cols.longitude, true, "longitude");
      }
      c_depth = col(cols.depth, cols.depth_explicit, "depth");
      c_type = col(cols.magnitude_type, cols.magnitude_type_explicit, "magnitude type");
      c_id = col(cols.id, cols.id_explicit, "id");
      if (!c_depth) r.warnings.push_back(path + ": no depth column '" + cols.depth + "': depths unknown");
      continue;
    }
    ++r.records;
    const std::string where = path + " line " + std::to_string(lineno);
    auto reject = [&](const std::string& reason) { r.rejected.push_back({lineno, reason}); };
    std::vector<std::string> f;
    try {
      f = split_csv_record(t, cols.delimiter);
    } catch (const InputError& e) {
      reject(e.what());
      continue;
    }
    if (f.size() != header.size()) {
      reject(std::to_string(f.size()) + " fields where the header has " + std::to_string(header.size()));
      continue;
    }
    seismo::Event e;
    e.source = where;
    try {
      e.time = parse_iso8601_utc(f[*c_time], cols.time);
    } catch (const InputError& err) {
      reject(err.what());
      continue;
    }
    auto number = [&](std::size_t i, const std::string& name, double lo, double hi, const char* expected,
                      double& out) {
      const std::string& cell = f[i];
      if (cell.empty()) {
        reject("field '" + name + "' is empty: expected " + expected);
        return false;
      }
      const auto v = parse_number(cell);
      if (!v || *v < lo || *v > hi) {
        reject("field '" + name + "' = '" + cell + "': expected " + expected);
        return false;
      }
      out = *v;
      return true;
    };
    if (!number(*c_mag, cols.magnitude, -5.0, 10.5, "a magnitude between -5 and 10.5", e.magnitude)) continue;
    if (projected) {
      if (!number(*c_x, cols.x, -1e9, 1e9, "a projected coordinate in metres", e.x)) continue;
      if (!number(*c_y, cols.y, -1e9, 1e9, "a projected coordinate in metres", e.y)) continue;
    } else {
      if (!number(*c_lat, cols.latitude, -90.0, 90.0, "a latitude between -90 and 90 degrees", e.y)) continue;
      if (!number(*c_lon, cols.longitude, -180.0, 360.0, "a longitude between -180 and 360 degrees", e.x)) continue;
    }
    if (c_depth && !f[*c_depth].empty()) {
      const std::string& cell = f[*c_depth];
      if (const auto v = parse_number(cell)) {
        e.depth = *v * depth_factor;
      } else {
        try {
          e.depth = units::parse(cell, units::Dimension::length, cols.depth);
        } catch (const InputError& err) {
          reject(err.what());
          continue;
        }
      }
    }
    e.magnitude_type = c_type ? f[*c_type] : "";
    if (e.magnitude_type.empty()) e.magnitude_type = cols.magnitude_type_default;
    if (c_id) e.id = f[*c_id];
    r.catalog.events.push_back(std::move(e));
  }
  if (header.empty()) throw InputError("catalog", path, "a header line naming the columns").located(path);
  return r;
}

}  // namespace slipscreen::formats
