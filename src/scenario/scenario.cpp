#include "scenario/scenario.hpp"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "core/util/trim.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/table/iso_time.hpp"
#include "formats/toml/toml_section.hpp"
#include "scenario/capacity_section.hpp"
#include "scenario/catalog_section.hpp"
#include "scenario/observations_section.hpp"
#include "scenario/what_if_section.hpp"
#include "formats/gis/crs.hpp"
#include "scenario/plausibility.hpp"
#include "scenario/region_reader.hpp"
#include "scenario/uncertainty_reader.hpp"
#include "scenario/wells.hpp"

namespace slipscreen::scenario {

using units::Dimension;
namespace fs = std::filesystem;

namespace {

// A file name inside the run folder: relative, no "..", no network or virtual path
// (formats/files/path_policy.hpp), refused with the place of the key.
void check_output_name(const formats::Section& s, std::string_view key, const std::string& name) {
  const auto f = s.find(key);
  try {
    formats::safe_relative_output(s.key_path(*f, key), name);
  } catch (const RefusedError& e) {
    throw RefusedError(s.where(*f) + ": refused: key " + e.what());
  }
}

// How relative output path `a` clashes with `b`: "" when it does not; else the same file, a
// folder holding it, or a path inside it.
std::string clash(const fs::path& a, const fs::path& b) {
  auto ai = a.begin(), bi = b.begin();
  for (; ai != a.end() && bi != b.end(); ++ai, ++bi)
    if (*ai != *bi) return "";
  if (ai == a.end() && bi == b.end()) return "the same file as ";
  return ai == a.end() ? "a folder holding " : "a path inside ";
}

// [output.files] names that would overwrite each other or a file the run writes itself
// (manifest.json, README.txt), compared after normalising: refused naming the keys and values.
void check_distinct_output_names(const formats::Section& s, const OutputFiles& files) {
  const std::vector<std::pair<std::string_view, const std::string*>> named = {
      {"segment_times", &files.segment_times}, {"segments", &files.segments},
      {"pressure_raster", &files.pressure_raster}, {"geopackage", &files.geopackage}};
  const auto refuse = [&](std::string_view key, const std::string& value, const std::string& why) {
    const auto f = s.find(key);
    throw RefusedError(s.where(*f) + ": refused: key " + s.key_path(*f, key) + " = '" + value + "': " + why +
                       "; each output needs its own file name in the run folder");
  };
  // Another output as the user reads it: its key path, or the default it keeps.
  const auto shown = [&](std::string_view key, const std::string& value, std::string_view reported) {
    if (const auto f = s.find(key)) return s.key_path(*f, key) + " = '" + value + "'";
    const std::string path = s.key_path(*s.find(reported), reported);
    return path.substr(0, path.size() - reported.size()) + std::string(key) + " (default '" + value + "')";
  };
  for (std::size_t i = 0; i < named.size(); ++i) {
    const auto& [key, value] = named[i];
    const fs::path norm = fs::path(*value).lexically_normal();
    for (const char* own : {"manifest.json", "README.txt"}) {
      const std::string how = clash(norm, own);
      if (!how.empty()) refuse(key, *value, how + "the run's own " + own);
    }
    for (std::size_t j = 0; j < i; ++j) {
      const auto& [other, other_value] = named[j];
      const fs::path other_norm = fs::path(*other_value).lexically_normal();
      if (clash(norm, other_norm).empty()) continue;
      if (s.has(key)) refuse(key, *value, clash(norm, other_norm) + shown(other, *other_value, key));
      refuse(other, *other_value, clash(other_norm, norm) + shown(key, *value, other));
    }
  }
}

struct Step {
  int months = 0;
  int days = 0;
};

Step parse_step(const formats::Section& s, std::string_view key) {
  const std::string text = s.string(key);
  const std::string expected = "a calendar step such as '1 year', '6 months', '30 days' or '1 week'";
  std::size_t pos = 0;
  int n = 0;
  try {
    n = std::stoi(text, &pos);
  } catch (...) {
    s.fail(key, text, expected);
  }
  std::string unit = util::trim(std::string_view(text).substr(pos));
  if (n <= 0) s.fail(key, text, "a positive whole number of days, weeks, months or years");
  // The plausible dates span 301 years: a longer step gives one output time, a much longer one
  // overflows the calendar arithmetic.
  const int max_n = (unit == "year" || unit == "years" || unit == "yr") ? 300
                    : (unit == "month" || unit == "months" || unit == "mo") ? 3600
                    : (unit == "week" || unit == "weeks") ? 15700
                                                          : 110000;
  if (n > max_n) s.fail(key, text, "a step of at most 300 years");
  if (unit == "year" || unit == "years" || unit == "yr") return {12 * n, 0};
  if (unit == "month" || unit == "months" || unit == "mo") return {n, 0};
  if (unit == "week" || unit == "weeks") return {0, 7 * n};
  if (unit == "day" || unit == "days" || unit == "d") return {0, n};
  s.fail(key, text, expected);
}

// A date within the plausible span (scenario/plausibility.hpp), refused with its text as written.
util::CivilDate plausible_date(const util::CivilDate& d, const std::string& text, const std::string& where,
                               const std::string& field) {
  if (!plausible::plausible_date(d)) throw InputError(field, text, plausible::kDateExpected, where);
  return d;
}

util::CivilDate parse_date_value(const std::string& text, const std::string& where, const std::string& field) {
  if (auto d = util::parse_iso_date(text)) return plausible_date(*d, text, where, field);
  throw InputError(field, text, formats::date_expectation(text, "a date as YYYY-MM-DD, e.g. 2030-01-01"), where);
}

// A TOML local date (2030-01-01 without quotes) or a date string.
std::optional<util::CivilDate> toml_date(const toml::node& n, const std::string& where, const std::string& field) {
  if (auto d = n.as_date()) {
    const util::CivilDate c{d->get().year, d->get().month, d->get().day};
    return plausible_date(c, formats::toml_value_text(n), where, field);
  }
  if (auto str = n.as_string()) return parse_date_value(str->get(), where, field);
  return std::nullopt;
}

std::vector<util::CivilDate> read_times(const formats::Section& s) {
  s.allow({"dates", "start", "end", "step"});
  std::vector<util::CivilDate> dates;
  if (s.has("dates")) {
    for (auto k : {"start", "end", "step"})
      if (s.has(k)) s.fail(k, "(set)", "either 'dates' or 'start', 'end' and 'step', not both");
    const auto f = *s.find("dates");
    // TOML local dates (2030-01-01 without quotes) and strings are both accepted.
    if (const toml::array* arr = f.node->as_array()) {
      for (std::size_t i = 0; i < arr->size(); ++i) {
        const toml::node& n = *arr->get(i);
        const std::string w = formats::toml_where(f.layer->file, n.source());
        const std::string field = s.key_path(f, "dates") + "[" + std::to_string(i) + "]";
        if (auto d = toml_date(n, w, field)) dates.push_back(*d);
        else throw InputError(field, formats::toml_value_text(n), "a date YYYY-MM-DD", w);
      }
    } else {
      s.fail("dates", formats::toml_value_text(*f.node), "a list of dates [\"2030-01-01\", ...]");
    }
  } else {
    const auto date_of = [&](std::string_view key) -> util::CivilDate {
      const auto f = s.find(key);
      if (!f) throw Error(ErrorCategory::input, s.where_missing(key) + ": missing (expected 'dates', or 'start', 'end' and 'step')");
      if (auto d = toml_date(*f->node, s.where(*f), s.key_path(*f, key))) return *d;
      return parse_date_value(s.string(key), s.where(*f), s.key_path(*f, key));
    };
    const util::CivilDate start = date_of("start");
    const util::CivilDate end = date_of("end");
    const Step step = parse_step(s, "step");
    if (!(end > start)) s.fail("end", util::format_iso_date(end), "a date after 'start'");
    for (int i = 0;; ++i) {
      util::CivilDate d = step.months ? util::add_months(start, step.months * i)
                                      : util::civil_from_days(util::days_from_civil(start) + static_cast<std::int64_t>(step.days) * i);
      if (d > end) break;
      dates.push_back(d);
      if (dates.size() > 1000) s.fail("step", s.string("step"), "at most 1000 output times");
    }
  }
  if (dates.empty()) s.fail("dates", "[]", "at least one output date");
  for (std::size_t i = 1; i < dates.size(); ++i)
    if (!(dates[i] > dates[i - 1]))
      s.fail("dates", util::format_iso_date(dates[i]), "dates in increasing order, each once");
  return dates;
}

OutputGrid read_grid(const formats::Section& s) {
  s.allow({"extent", "margin", "cell_size", "crs"});
  OutputGrid g;
  g.cell_size = s.quantity_or("cell_size", Dimension::length, g.cell_size);
  plausible::check(s, "cell_size", g.cell_size, plausible::kCellSize);
  g.margin = s.quantity_or("margin", Dimension::length, g.margin);
  plausible::check(s, "margin", g.margin, plausible::kGridMargin);
  g.crs = s.optional_string("crs").value_or("");
  if (auto f = s.find("extent")) {
    if (auto str = f->node->as_string(); str && str->get() == "auto") return g;
    const toml::array* a = f->node->as_array();
    bool ok = a && a->size() == 4;
    for (std::size_t i = 0; ok && i < 4; ++i)
      ok = a->get(i)->is_number() && plausible::kProjectedCoordinate.contains(a->get(i)->value<double>().value());
    if (!ok)
      s.fail("extent", formats::toml_value_text(*f->node),
             std::string("\"auto\" or [xmin, ymin, xmax, ymax] in the grid CRS, each ") +
                 plausible::kProjectedCoordinate.expected);
    g.automatic_extent = false;
    g.xmin = a->get(0)->value<double>().value();
    g.ymin = a->get(1)->value<double>().value();
    g.xmax = a->get(2)->value<double>().value();
    g.ymax = a->get(3)->value<double>().value();
    if (!(g.xmax > g.xmin && g.ymax > g.ymin)) s.fail("extent", formats::toml_value_text(*f->node), "xmax > xmin and ymax > ymin");
    const double cells = std::ceil((g.xmax - g.xmin) / g.cell_size) * std::ceil((g.ymax - g.ymin) / g.cell_size);
    if (cells > 2.5e7)
      s.fail(s.has("cell_size") ? "cell_size" : "extent", plausible::written(s, s.has("cell_size") ? "cell_size" : "extent"),
             "at most 25 million cells over the extent (" + util::number_text(cells, 3) + " cells)");
  }
  return g;
}

OutputSpec read_output(const formats::Section& s) {
  s.allow({"folder", "tables", "rasters", "geopackage", "cog", "units", "footprint", "report", "page", "report_maps",
           "times", "grid", "files"});
  OutputSpec o;
  o.folder = s.optional_string("folder").value_or("");
  if (!o.folder.empty()) check_output_name(s, "folder", o.folder);
  o.tables = s.boolean_or("tables", true);
  o.rasters = s.boolean_or("rasters", true);
  o.geopackage = s.boolean_or("geopackage", true);
  o.cog = s.boolean_or("cog", false);
  if (o.cog && !o.rasters) s.fail("cog", "true", "rasters = true (a COG is a raster output)");
  if (const auto u = s.optional_string("units")) {
    const auto system = units::unit_system_named(*u);
    if (!system) s.fail("units", *u, "\"SI\" or \"oilfield\"" + util::did_you_mean(*u, units::unit_system_names()));
    o.units = *system;
  }
  if (s.has("footprint")) {
    o.footprint = s.quantity_or("footprint", Dimension::pressure, o.footprint);
    if (!(o.footprint > 0))
      s.fail("footprint", plausible::written(s, "footprint"), "a pressure change above zero (e.g. '0.1 MPa')");
    o.footprint_given = true;
  }
  o.report = s.boolean_or("report", o.tables);  // the report is drawn from the run's tables
  if (o.report && !o.tables) s.fail("report", "true", "tables = true (the report is drawn from the run's tables)");
  if (const auto page = s.optional_string("page")) {
    if (*page != "A4" && *page != "Letter") s.fail("page", *page, "\"A4\" or \"Letter\" (the PDF report's page size)");
    o.page = *page;
  }
  if (const auto maps = s.optional_string("report_maps")) {
    if (*maps != "last" && *maps != "each")
      s.fail("report_maps", *maps, "\"last\" or \"each\" (the report's area map at the last output time or at each)");
    o.report_maps = *maps;
  }
  o.dates = read_times(s.child("times"));
  for (const auto& d : o.dates) o.times.push_back(util::to_seconds(d));
  o.grid = read_grid(s.child("grid"));
  const formats::Section f = s.child("files");
  f.allow({"segment_times", "segments", "pressure_raster", "geopackage"});
  const auto name = [&](std::string_view key, std::string& target) {
    if (!f.has(key)) return;
    target = f.string(key);
    check_output_name(f, key, target);
  };
  name("segment_times", o.files.segment_times);
  name("segments", o.files.segments);
  name("pressure_raster", o.files.pressure_raster);
  name("geopackage", o.files.geopackage);
  check_distinct_output_names(f, o.files);
  return o;
}

// The kind of a CRS as written: projected, geographic, or unknown (text OSR does not know; the
// run names it when it reprojects the well).
enum class CrsKind { projected, geographic, unknown };
CrsKind crs_kind(const std::string& crs) {
  try {
    const formats::Crs c = formats::Crs::from_user_string(crs);
    return c.is_projected() ? CrsKind::projected : c.is_geographic() ? CrsKind::geographic : CrsKind::unknown;
  } catch (const InputError&) {
    return CrsKind::unknown;
  }
}

// A proposed well's location: lon/lat (degrees, geographic CRS only) or x/y in `crs`, each
// within its CRS's range; x/y that look like degrees under a projected CRS are refused.
void read_location(const formats::Section& s, const std::string& default_crs, WellSpec& w) {
  const bool lonlat = s.has("lon") || s.has("lat");
  const char* kx = lonlat ? "lon" : "x";
  const char* ky = lonlat ? "lat" : "y";
  w.x = s.number(kx);
  w.y = s.number(ky);
  w.crs = s.optional_string("crs").value_or(lonlat ? "EPSG:4326" : default_crs);
  const CrsKind kind = crs_kind(w.crs);
  if (lonlat && kind == CrsKind::projected)
    s.fail("crs", w.crs,
           "a geographic CRS (such as EPSG:4326) with 'lon' and 'lat', or 'x' and 'y' in this projected CRS "
           "(lon and lat are degrees, never metres)");
  if (lonlat || kind == CrsKind::geographic) {
    plausible::check(s, kx, w.x, plausible::kLongitude);
    plausible::check(s, ky, w.y, plausible::kLatitude);
    return;
  }
  plausible::check(s, kx, w.x, plausible::kProjectedCoordinate);
  plausible::check(s, ky, w.y, plausible::kProjectedCoordinate);
  if (kind == CrsKind::projected && plausible::looks_like_degrees(w.x, w.y))
    s.fail(kx, plausible::written(s, kx) + ", " + plausible::written(s, ky),
           "x and y in " + w.crs + " (a projected CRS): |x| <= 180 and |y| <= 90 look like longitude and latitude "
           "in degrees; write lon = ..., lat = ... (WGS 84) or give x and y in the CRS's unit");
}

WellSpec read_proposed(const formats::Section& s, const std::string& default_crs) {
  s.allow({"id", "x", "y", "lon", "lat", "crs", "top", "bottom", "radius", "schedule"});
  WellSpec w;
  w.id = s.string("id");
  w.proposed = true;
  w.status = WellStatus::proposed;
  read_location(s, default_crs, w);
  w.top = s.quantity("top", Dimension::length);
  plausible::check(s, "top", w.top, plausible::kWellTop);
  w.bottom = s.quantity("bottom", Dimension::length);
  plausible::check(s, "bottom", w.bottom, plausible::kWellBottom);
  if (!(w.bottom > w.top))
    s.fail("bottom", plausible::written(s, "bottom"), "a depth below 'top' (" + plausible::written(s, "top") + ")");
  w.radius = s.quantity("radius", Dimension::length);
  plausible::check(s, "radius", w.radius, plausible::kWellRadius);
  const auto f = *s.find("id");
  w.source = s.where(f);
  const auto entries = s.string_list("schedule");
  for (std::size_t i = 0; i < entries.size(); ++i)
    w.periods.push_back(parse_schedule_entry(entries[i].first, entries[i].second,
                                             s.key_path(f, "schedule") + "[" + std::to_string(i) + "]"));
  check_periods(w);
  return w;
}

// `memory_limit = "8 GB"`: bytes, with a decimal (kB, MB, GB, TB) or binary (KiB ... TiB) unit.
double read_memory_limit(const formats::Section& s) {
  const std::string text = s.string("memory_limit");
  const char* expected = "a memory size such as '8 GB' or '512 MiB' (B, kB, MB, GB, TB, KiB, MiB, GiB, TiB), at least 1 MB";
  std::size_t pos = 0;
  double n = 0;
  try {
    n = std::stod(text, &pos);
  } catch (...) {
    s.fail("memory_limit", text, expected);
  }
  const std::string unit = util::trim(std::string_view(text).substr(pos));
  static const std::pair<const char*, double> kUnits[] = {{"B", 1.0},     {"kB", 1e3},          {"MB", 1e6},
                                                         {"GB", 1e9},    {"TB", 1e12},         {"KiB", 1024.0},
                                                         {"MiB", 1048576.0}, {"GiB", 1073741824.0},
                                                         {"TiB", 1099511627776.0}};
  for (const auto& [symbol, factor] : kUnits)
    if (unit == symbol) {
      const double bytes = n * factor;
      if (!(bytes >= 1e6 && bytes <= 1e18)) s.fail("memory_limit", text, expected);
      return bytes;
    }
  s.fail("memory_limit", text, expected);
}

UncertaintyContext uncertainty_context(const ResolvedScenario& sc) {
  UncertaintyContext c;
  c.file = sc.file;
  c.seed = sc.seed;
  c.stress_model = sc.region.stress.model;
  c.poroelastic_path = sc.region.stress.poroelastic_path;
  c.density_layers = !sc.region.stress.density_layers.empty();
  c.from_transmissivity = sc.region.formation.from_transmissivity;
  c.leaky = sc.region.formation.leaky;
  c.poroelastic_3d = sc.region.formation.poroelastic_3d;
  for (const auto& w : sc.wells) c.well_ids.push_back(w.id);
  return c;
}

// [region]: the region file, with any overrides from [region.override].
void read_region(const formats::Section& top, const fs::path& dir, ResolvedScenario& sc) {
  const formats::Section reg = top.child("region");
  reg.allow({"file", "override"});
  const fs::path region_path = reg.input_path("file");
  const formats::Section over = reg.child("override");
  sc.region = load_region(region_path, formats::display_name(region_path), over.layers().front().table, sc.file,
                          "region.override", dir);
  sc.inputs.push_back(region_path);
}

// [wells] and [histories]: the existing wells and their injection histories. Returns the wells' CRS
// as written ("" when the file names its own).
std::string read_existing_wells(const formats::Section& top, ResolvedScenario& sc) {
  const formats::Section wells = top.child("wells");
  wells.allow({"file", "crs", "allow_outside"});
  const std::string wells_crs = wells.optional_string("crs").value_or("");
  sc.allow_outside = wells.boolean_or("allow_outside", false);
  if (wells.has("file")) {
    const fs::path p = wells.input_path("file");
    sc.wells_file = formats::display_name(p);
    sc.wells_path = p;
    sc.wells = read_wells(formats::read_csv(p, sc.wells_file), wells_crs);
    sc.inputs.push_back(p);
  }
  const formats::Section hist = top.child("histories");
  hist.allow({"file", "continue_active_until"});
  if (hist.has("file")) {
    if (sc.wells.empty()) hist.fail("file", hist.string("file"), "a [wells] file that the histories refer to");
    const fs::path p = hist.input_path("file");
    sc.histories_file = formats::display_name(p);
    sc.histories_path = p;
    read_histories(formats::read_csv(p, sc.histories_file), sc.wells);
    sc.inputs.push_back(p);
  }
  if (auto f = hist.find("continue_active_until")) {
    const std::string text = hist.string("continue_active_until");
    const util::CivilDate d = parse_date_value(text, hist.where(*f), hist.key_path(*f, "continue_active_until"));
    continue_active_wells(sc.wells, util::to_seconds(d), hist.where(*f));
  }
  return wells_crs;
}

// [[proposed_well]]: proposed wells with inline schedules, in `crs` unless they name their own.
void read_proposed_wells(const formats::Section& top, const std::string& crs, ResolvedScenario& sc) {
  for (const formats::Section& ps : top.table_array("proposed_well", "an array of tables [[proposed_well]]")) {
    WellSpec w = read_proposed(ps, crs);
    for (const auto& other : sc.wells)
      if (other.id == w.id) ps.fail("id", w.id, "a well id not used by another well (" + other.source + ")");
    sc.wells.push_back(std::move(w));
  }
}

}  // namespace

ResolvedScenario load_scenario(const fs::path& path) {
  ResolvedScenario sc;
  sc.path = path;
  sc.file = formats::display_name(path);
  const formats::TomlDocument doc = formats::parse_toml_file(path, sc.file);
  sc.inputs.push_back(path);
  const fs::path dir = path.parent_path();
  const formats::Section top({{doc.root.get(), sc.file, "", dir}});
  top.allow({"title", "seed", "memory_limit", "region", "wells", "histories", "proposed_well", "output",
             "uncertainty", "catalog", "capacity", "what_if", "observations"});
  sc.title = top.optional_string("title").value_or("");
  if (auto seed = top.optional_integer("seed")) {
    if (*seed < 0) top.fail("seed", std::to_string(*seed), "a seed >= 0");
    sc.seed = static_cast<std::uint64_t>(*seed);
  }
  if (top.has("memory_limit")) sc.memory_limit = read_memory_limit(top);

  read_region(top, dir, sc);
  const std::string wells_crs = read_existing_wells(top, sc);
  read_proposed_wells(top, wells_crs.empty() ? sc.region.crs : wells_crs, sc);
  if (sc.wells.empty())
    throw Error(ErrorCategory::input, sc.file + ": no wells: expected a [wells] file or a [[proposed_well]]");

  sc.output = read_output(top.child("output"));

  if (top.has("catalog")) {
    sc.catalog = read_catalog_spec(top.child("catalog"), sc.wells);
    sc.inputs.push_back(sc.catalog->path);
    // One footprint per run: the catalog review's threshold is the map's unless [output] names
    // the same value (two different footprints would make the map contradict the review).
    if (!sc.output.footprint_given) sc.output.footprint = sc.catalog->footprint_threshold;
    else if (sc.output.footprint != sc.catalog->footprint_threshold)
      top.child("output").fail("footprint", plausible::written(top.child("output"), "footprint"),
                               "the catalog review's footprint_threshold (" +
                                   util::number_text(sc.catalog->footprint_threshold / 1e6, 6) +
                                   " MPa) or no footprint under [output] (it then follows [catalog])");
  }

  const toml::table* uncertainty = nullptr;
  if (auto u = top.find("uncertainty")) {
    if (!u->node->is_table()) top.fail("uncertainty", formats::toml_value_text(*u->node), "a table [uncertainty]");
    uncertainty = u->node->as_table();
  }
  sc.uncertainty = read_uncertainty(uncertainty, uncertainty_context(sc));
  // With the 3-D model [uncertainty] drives the screen in depth only (docs/uncertainty.md): the
  // answers built on the Theis probabilistic screen are refused.
  if (sc.uncertainty.given && sc.region.formation.poroelastic_3d)
    for (const char* k : {"capacity", "what_if", "observations"})
      if (top.has(k))
        top.fail(k, std::string("[") + k + "]",
                 "no [" + std::string(k) + "] with [formation] model = 'poroelastic_3d' (its [uncertainty] drives the "
                 "screen in depth only)");
  if (top.has("capacity")) {
    const formats::Section cap = top.child("capacity");
    sc.capacity = read_capacity_spec(cap, sc.wells);
    sc.capacity->where = top.where(*top.find("capacity"));
    if (!sc.uncertainty.given)
      top.fail("capacity", "[capacity]", "an [uncertainty] table too: the allowable rate comes from the probabilistic screen");
  }
  for (const formats::Section& ws : top.table_array("what_if", "an array of tables [[what_if]]")) {
    WhatIfSpec w = read_what_if(ws, sc.wells);
    for (const auto& other : sc.what_if)
      if (other.name == w.name) ws.fail("name", w.name, "a name not used by another [[what_if]]");
    if (!sc.uncertainty.given)
      ws.fail("name", w.name, "an [uncertainty] table too: what-if variants come from the probabilistic screen");
    sc.what_if.push_back(std::move(w));
  }
  if (top.has("observations")) {
    const formats::Section obs = top.child("observations");
    if (!sc.uncertainty.given)
      top.fail("observations", "[observations]",
               "an [uncertainty] table too: observations weight the realizations of the probabilistic screen");
    sc.observations = read_observations_spec(obs, wells_crs.empty() ? sc.wells.front().crs : wells_crs,
                                             sc.region.pore_pressure_gradient);
    if (!sc.observations->pressure_path.empty()) sc.inputs.push_back(sc.observations->pressure_path);
    if (sc.observations->seismicity && !sc.catalog)
      throw InputError("observations.seismicity", "true",
                       "a [catalog] table too: the seismicity likelihood uses the catalog's events", sc.observations->seismicity_where);
    if (sc.observations->seismicity && !sc.catalog->rate_state)
      throw InputError("observations.seismicity", "true",
                       "a [catalog.rate_state] table too: its background_rate_per_km, a_sigma and aftershock_duration "
                       "set the Dieterich (1994) rate ([uncertainty.seismicity] may make the first two uncertain)",
                       sc.observations->seismicity_where);
  }
  if (const UncertainValue* v = seismicity_value(sc.uncertainty); v && !(sc.observations && sc.observations->seismicity))
    throw InputError("uncertainty." + v->key, v->text,
                     "seismicity = true under [observations] too: these inputs only enter the seismicity likelihood",
                     v->where);
  return sc;
}

namespace {

using nlohmann::json;

json num(double v) { return std::isnan(v) ? json(nullptr) : json(v); }

json stress_json(const StressSpec& st) {
  json stress = {{"vertical_gradient_Pa_per_m", num(st.vertical_gradient)}, {"shmax_azimuth_rad", num(st.shmax_azimuth)}};
  if (!st.density_layers.empty()) {
    json layers = json::array();
    for (const auto& l : st.density_layers) layers.push_back({{"top_m", l.top}, {"density_kg_per_m3", l.density}});
    stress["density_layers"] = layers;
  }
  switch (st.model) {
    case StressModel::gradients:
      stress["model"] = "gradients";
      stress["shmax_gradient_Pa_per_m"] = num(st.shmax_gradient);
      stress["shmin_gradient_Pa_per_m"] = num(st.shmin_gradient);
      break;
    case StressModel::uniaxial_strain:
      stress["model"] = "uniaxial_strain";
      stress["poisson_ratio"] = num(st.poisson_ratio);
      stress["biot"] = num(st.biot);
      stress["young_modulus_Pa"] = num(st.young_modulus);
      stress["strain_shmin"] = num(st.strain_shmin);
      stress["strain_shmax"] = num(st.strain_shmax);
      stress["tectonic_shmin_Pa"] = num(st.tectonic_shmin);
      stress["tectonic_shmax_Pa"] = num(st.tectonic_shmax);
      break;
    case StressModel::a_phi:
      stress["model"] = "a_phi";
      stress["a_phi"] = num(st.a_phi);
      stress["equilibrium_friction"] = num(st.equilibrium_friction);
      break;
  }
  stress["poroelastic_path"] = st.poroelastic_path;
  if (st.poroelastic_path && st.model != StressModel::uniaxial_strain) {
    stress["poisson_ratio"] = num(st.poisson_ratio);
    stress["biot"] = num(st.biot);
  }
  return stress;
}

json formation_json(const FormationSpec& fm) {
  const hydro::TheisParameters theis = theis_parameters_of(fm);
  json formation = {{"name", fm.name},
                    {"diffusivity_m2_per_s", num(theis.diffusivity)},
                    {"pressure_per_rate_Pa_s_per_m3", num(theis.pressure_per_rate)},
                    {"fluid_density_kg_per_m3", num(fm.fluid_density)}};
  if (fm.from_transmissivity) {
    formation["transmissivity_m2_per_s"] = num(fm.transmissivity);
    formation["storativity"] = num(fm.storativity);
  } else {
    formation["permeability_m2"] = num(fm.permeability);
    formation["thickness_m"] = num(fm.thickness);
    formation["porosity"] = num(fm.porosity);
    formation["total_compressibility_per_Pa"] = num(fm.total_compressibility);
    formation["viscosity_Pa_s"] = num(fm.viscosity);
  }
  json bounds = json::array();
  for (const auto& b : fm.boundaries)
    bounds.push_back({{"kind", b.kind == BoundarySpec::Kind::no_flow ? "no_flow" : "constant_pressure"},
                      {"from", {b.x1, b.y1}}, {"to", {b.x2, b.y2}}});
  formation["boundaries"] = bounds;
  formation["model"] = fm.leaky ? "leaky (Hantush & Jacob 1955)" : fm.poroelastic_3d ? "poroelastic_3d (Rudnicki 1986)" : "theis";
  if (fm.poroelastic_3d) {
    formation["shear_modulus_Pa"] = num(fm.shear_modulus);
    formation["poisson_ratio"] = num(fm.poisson_ratio);
    formation["undrained_poisson_ratio"] = num(fm.undrained_poisson_ratio);
    formation["biot"] = num(fm.biot);
  }
  if (fm.leaky) {
    formation["leakage_factor_m"] = std::sqrt(theis.diffusivity / theis.leakage_rate);
    formation["leakage_rate_per_s"] = theis.leakage_rate;
    formation["aquitard_thickness_m"] = num(fm.aquitard_thickness);
    formation["aquitard_permeability_m2"] = num(fm.aquitard_permeability);
  }
  return formation;
}

json faults_json(const FaultMapSpec& f, bool in_depth) {
  json out = {{"file", f.file.empty() ? formats::display_name(f.path) : f.file},
          {"layer", f.layer},
          {"crs", f.crs},
          {"attributes", {{"id", f.id_attribute}, {"dip", f.dip_attribute},
                          {"dip_direction", f.dip_direction_attribute}, {"dips_to", f.dips_to_attribute},
                          {"friction", f.friction_attribute}, {"default_dip_rad", num(f.default_dip)}}},
          {"friction", f.friction},
          {"cohesion_Pa", f.cohesion},
          {"segment_length_m", f.segment_length},
          {"check_points", f.check_points}};
  if (!std::isnan(f.top)) {  // the depth range of the 3-D model (only when given)
    out["top_m"] = f.top;
    out["bottom_m"] = f.bottom;
    out["depth_levels"] = f.depth_levels;
  }
  if (in_depth) {  // the per-fault depth range's fields, read by the 3-D model only
    out["attributes"]["top"] = f.top_attribute;
    out["attributes"]["bottom"] = f.bottom_attribute;
    out["depth_levels"] = f.depth_levels;
  }
  return out;
}

json wells_json(const std::vector<WellSpec>& all) {
  json wells = json::array();
  for (const auto& w : all) wells.push_back(to_json(w));
  return wells;
}

// `region_crs` is the grid's CRS when the grid names none.
json output_json(const OutputSpec& o, const std::string& region_crs) {
  json dates = json::array();
  for (const auto& d : o.dates) dates.push_back(util::format_iso_date(d));
  const auto& g = o.grid;
  json grid = {{"cell_size_m", g.cell_size}, {"crs", g.crs.empty() ? region_crs : g.crs}};
  if (g.automatic_extent) {
    grid["extent"] = "auto";
    grid["margin_m"] = g.margin;
  } else {
    grid["extent"] = {g.xmin, g.ymin, g.xmax, g.ymax};
  }
  return {{"folder", o.folder}, {"tables", o.tables}, {"rasters", o.rasters},
          {"geopackage", o.geopackage}, {"cog", o.cog}, {"units", std::string(units::unit_system_name(o.units))},
          {"footprint_Pa", o.footprint}, {"report", o.report}, {"page", o.page},
          {"report_maps", o.report_maps}, {"dates", dates}, {"grid", grid},
          {"files", {{"segment_times", o.files.segment_times}, {"segments", o.files.segments},
                     {"pressure_raster", o.files.pressure_raster},
                     {"geopackage", o.files.geopackage}}}};
}

}  // namespace

nlohmann::json to_json(const WellSpec& w) {
  json periods = json::array();
  for (const auto& p : w.periods)
    periods.push_back({{"start", util::format_iso_date(util::date_at(p.start))},
                       {"end", util::format_iso_date(util::date_at(p.end))},
                       {"rate_m3_per_s", p.rate}, {"assumed", p.assumed}});
  return {{"id", w.id}, {"x", w.x}, {"y", w.y}, {"crs", w.crs}, {"top_m", w.top}, {"bottom_m", w.bottom},
          {"radius_m", w.radius}, {"status", status_name(w.status)}, {"proposed", w.proposed},
          {"periods", std::move(periods)}};
}

nlohmann::json to_json(const ResolvedScenario& s, bool with_wells) {
  const auto& r = s.region;
  nlohmann::json j = {{"scenario", s.file},
          {"title", s.title},
          {"seed", s.seed},
          {"region", {{"name", r.name}, {"file", r.file}, {"crs", r.crs},
                      {"reference_depth_m", r.reference_depth},
                      {"pore_pressure_gradient_Pa_per_m", r.pore_pressure_gradient},
                      {"stress", stress_json(r.stress)}, {"faults", faults_json(r.faults, r.formation.poroelastic_3d)},
                      {"formation", formation_json(r.formation)}}},
          {"output", output_json(s.output, s.region.crs)},
          {"uncertainty_given", s.uncertainty.given}};
  if (with_wells) j["wells"] = wells_json(s.wells);
  if (s.allow_outside) j["wells_allow_outside"] = true;  // only when set (earlier manifests stay unchanged)
  if (s.observations)  // only when given (earlier manifests stay unchanged)
    j["observations"] = {{"pressure", s.observations->pressure_file},
                         {"pressure_observations", s.observations->pressure.size()},
                         {"model_error_Pa", s.observations->model_error},
                         {"at_injector", s.observations->at_injector}};
  if (s.observations && s.observations->seismicity) {  // only when asked for
    j["observations"]["seismicity"] = true;
    j["observations"]["seismicity_distance_m"] = s.observations->seismicity_distance;
  }
  return j;
}

}  // namespace slipscreen::scenario
