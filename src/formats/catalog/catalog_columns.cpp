#include "formats/catalog/catalog_columns.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "core/util/suggest.hpp"
#include "core/util/trim.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::formats {

const CommonSpellings kCommonSpellings = {
    {"time", "origin_time"},
    {"lat", "latitude"},
    {"lon", "long", "longitude"},
    {"depth", "depth_km"},
    {"mag", "magnitude"},
    {"magtype", "mag_type", "magnitude_type"},
    {"id", "event_id", "eventid"},
    "",
};

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

std::string lower(std::string_view s) {
  std::string out = util::trim(s);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return out;
}

std::string quoted_list(const std::vector<std::string>& names, const char* last_joint) {
  std::string out;
  for (std::size_t i = 0; i < names.size(); ++i) {
    if (i > 0) out += i + 1 == names.size() ? last_joint : ", ";
    out += "'" + names[i] + "'";
  }
  return out;
}

// One attribute to find in the header.
struct Rule {
  const char* what;  // "magnitude"
  const char* key;   // its mapping key, "mag"
  const ColumnChoice& choice;
  const std::vector<std::string>& spellings;
  bool required;
};

// How to name another column: with the mapping, unless the format fixes the names.
std::string how_to_name(const Rule& r, const std::string& fixed_by) {
  if (!fixed_by.empty()) return ", as " + fixed_by + " names it";
  const std::string pair = std::string(r.key) + "=COLUMN";
  return "; name yours with --columns '" + pair + "' (in a scenario: [catalog] columns = \"" + pair + "\")";
}

struct Finder {
  const std::vector<std::string>& header;
  const std::string& header_text;
  const std::string& where;
  const std::string& fixed_by;

  // The first column of that exact name.
  std::optional<std::size_t> exact(const std::string& name) const {
    for (std::size_t i = 0; i < header.size(); ++i)
      if (header[i] == name) return i;
    return std::nullopt;
  }

  // The columns matching any spelling in any case; two different names are ambiguous.
  std::optional<std::size_t> by_spelling(const Rule& r) const {
    std::vector<std::string> wanted;
    for (const auto& s : r.spellings) wanted.push_back(lower(s));
    std::optional<std::size_t> found;
    for (std::size_t i = 0; i < header.size(); ++i) {
      if (std::find(wanted.begin(), wanted.end(), lower(header[i])) == wanted.end()) continue;
      if (!found) found = i;
      else if (header[i] != header[*found])
        throw InputError("header", header_text,
                         "one " + std::string(r.what) + " column, not both " +
                             quoted_list({header[*found], header[i]}, " and ") + how_to_name(r, fixed_by))
            .located(where);
    }
    return found;
  }

  std::optional<std::size_t> find(const Rule& r) const {
    if (r.choice.absent) return std::nullopt;
    if (r.choice.named()) {
      if (const auto i = exact(r.choice.name)) return i;
      throw InputError(std::string(r.what) + " column", r.choice.name,
                       "a column of that name in the header '" + header_text + "'" +
                           util::did_you_mean(r.choice.name, header))
          .located(where);
    }
    const auto i = by_spelling(r);
    if (!i && r.required)
      throw InputError("header", header_text,
                       "a " + std::string(r.what) + " column (" + quoted_list(r.spellings, " or ") +
                           ", in any case)" + how_to_name(r, fixed_by))
          .located(where);
    return i;
  }
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

ColumnChoice parse_choice(const std::string& key, const std::string& value, bool optional) {
  if (value != "-") return {value, false};
  if (!optional)
    throw InputError("column mapping key '" + key + "'", value,
                     "a column name: time, lat, lon and mag cannot be absent ('-' is for depth, magtype and id)");
  return {"", true};
}

char parse_delimiter(const std::string& val) {
  if (val == "tab") return '\t';
  if (val == "semicolon") return ';';
  if (val.size() == 1) return val[0];
  throw InputError("column mapping key 'delimiter'", val, "one character, 'tab' or 'semicolon'");
}

void set_key(CatalogColumns& c, const std::string& key, const std::string& val) {
  static const std::vector<std::string> keys = {"time", "lat", "lon", "x", "y", "crs", "depth", "depth_unit",
                                                "mag", "magtype", "magtype_default", "id", "delimiter"};
  if (key == "time") c.time = parse_choice(key, val, false);
  else if (key == "lat") c.latitude = parse_choice(key, val, false);
  else if (key == "lon") c.longitude = parse_choice(key, val, false);
  else if (key == "x") c.x = parse_choice(key, val, false);
  else if (key == "y") c.y = parse_choice(key, val, false);
  else if (key == "crs") c.crs = val;
  else if (key == "depth") c.depth = parse_choice(key, val, true);
  else if (key == "depth_unit") {
    units::lookup(val, units::Dimension::length, "depth_unit");
    c.depth_unit = val;
  } else if (key == "mag") c.magnitude = parse_choice(key, val, false);
  else if (key == "magtype") c.magnitude_type = parse_choice(key, val, true);
  else if (key == "magtype_default") c.magnitude_type_default = val;
  else if (key == "id") c.id = parse_choice(key, val, true);
  else if (key == "delimiter") c.delimiter = parse_delimiter(val);
  else
    throw InputError("column mapping key", key, "one of time, lat, lon, x, y, crs, depth, depth_unit, mag, magtype, "
                                                "magtype_default, id, delimiter" + util::did_you_mean(key, keys));
}

}  // namespace

CatalogColumns parse_catalog_columns(std::string_view text) {
  CatalogColumns c;
  c.text = util::trim(text);
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
    const std::string val = util::trim(pair.substr(eq + 1));
    if (val.empty()) throw InputError("column mapping key '" + key + "'", "", "a column name ('-' for none)");
    set_key(c, key, val);
  }
  if (c.x.named() != c.y.named()) throw InputError("column mapping", c.x.named() ? "x only" : "y only", "both x and y, or neither");
  if (c.x.named() && c.crs.empty())
    throw InputError("column mapping key 'crs'", "", "the CRS of the x/y columns, e.g. 'crs=EPSG:32614'");
  return c;
}

CatalogTableLayout::CatalogTableLayout(const std::vector<std::string>& header, const std::string& header_text,
                                       const CatalogColumns& cols, const CommonSpellings& sp, const std::string& where)
    : columns_(cols), fields_(header.size()) {
  depth_factor_ = units::from_unit(1.0, cols.depth_unit, units::Dimension::length);
  const Finder f{header, header_text, where, sp.fixed_by};
  const std::vector<std::string> none;
  auto take = [&](const Rule& r, Column& c) {
    c.index = f.find(r);
    if (c.index) c.name = header[*c.index];
  };
  take({"time", "time", cols.time, sp.time, true}, time_);
  take({"magnitude", "mag", cols.magnitude, sp.magnitude, true}, mag_);
  if (cols.projected()) {
    take({"x", "x", cols.x, none, true}, x_);
    take({"y", "y", cols.y, none, true}, y_);
  } else {
    take({"latitude", "lat", cols.latitude, sp.latitude, true}, lat_);
    take({"longitude", "lon", cols.longitude, sp.longitude, true}, lon_);
  }
  take({"depth", "depth", cols.depth, sp.depth, false}, depth_);
  take({"magnitude type", "magtype", cols.magnitude_type, sp.magnitude_type, false}, type_);
  take({"id", "id", cols.id, sp.id, false}, id_);
  if (!depth_.index && !cols.depth.absent)
    notes_.push_back("no depth column (looked for " + quoted_list(sp.depth, " or ") + "): depths unknown");
}

std::optional<std::string> CatalogTableLayout::read_event(const std::vector<std::string>& f, seismo::Event& e) const {
  if (f.size() != fields_)
    return std::to_string(f.size()) + " fields where the header has " + std::to_string(fields_);
  try {
    e.time = parse_iso8601_utc(f[*time_.index], time_.name);
  } catch (const InputError& err) {
    return std::string(err.what());
  }
  if (auto why = number_cell(f[*mag_.index], mag_.name, -5.0, 10.5, "a magnitude between -5 and 10.5", e.magnitude))
    return why;
  if (columns_.projected()) {
    if (auto why = number_cell(f[*x_.index], x_.name, -1e9, 1e9, "a projected coordinate in metres", e.x)) return why;
    if (auto why = number_cell(f[*y_.index], y_.name, -1e9, 1e9, "a projected coordinate in metres", e.y)) return why;
  } else {
    if (auto why = number_cell(f[*lat_.index], lat_.name, -90.0, 90.0, "a latitude between -90 and 90 degrees", e.y))
      return why;
    if (auto why = number_cell(f[*lon_.index], lon_.name, -180.0, 360.0, "a longitude between -180 and 360 degrees", e.x))
      return why;
  }
  if (depth_.index && !f[*depth_.index].empty()) {
    const std::string& cell = f[*depth_.index];
    if (const auto v = parse_number(cell)) {
      if (!std::isfinite(*v * depth_factor_))
        return "field '" + depth_.name + "' = '" + cell + "': expected a depth that stays finite in metres";
      e.depth = *v * depth_factor_;
    } else {
      try {  // a cell may state its own unit ("4100 m")
        e.depth = units::parse(cell, units::Dimension::length, depth_.name);
      } catch (const InputError& err) {
        return std::string(err.what());
      }
    }
  }
  e.magnitude_type = type_.index ? f[*type_.index] : "";
  if (e.magnitude_type.empty()) e.magnitude_type = columns_.magnitude_type_default;
  if (id_.index) e.id = f[*id_.index];
  return std::nullopt;
}

std::string CatalogTableLayout::columns_used() const {
  auto pair = [](const char* key, const Column& c) { return std::string(key) + "=" + (c.index ? c.name : "-"); };
  std::string s = pair("time", time_) + "; ";
  if (columns_.projected())
    s += pair("x", x_) + "; " + pair("y", y_) + "; crs=" + columns_.crs + "; ";
  else
    s += pair("lat", lat_) + "; " + pair("lon", lon_) + "; ";
  s += pair("depth", depth_) + (depth_.index ? " (" + columns_.depth_unit + ")" : "") + "; ";
  s += pair("mag", mag_) + "; " + pair("magtype", type_) + "; " + pair("id", id_);
  return s;
}

}  // namespace slipscreen::formats
