// The scenario's [catalog] table (docs/catalogs.md, "A catalog in a scenario run").
#include <algorithm>
#include <array>
#include <cmath>

#include "core/errors.hpp"
#include "core/util/suggest.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/table/iso_time.hpp"
#include "scenario/catalog_section.hpp"
#include "formats/toml/toml_section.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

std::optional<double> optional_time(const formats::Section& s, std::string_view key) {
  const auto f = s.find(key);
  if (!f) return std::nullopt;
  const std::string text = s.string(key);
  try {
    return formats::parse_iso8601_utc(text, s.key_path(*f, key));
  } catch (const InputError& e) {
    throw InputError(s.key_path(*f, key), text, "an ISO 8601 UTC time such as 2015-01-01 or 2015-01-01T00:00:00Z",
                     s.where(*f));
  }
}

// A list of plain numbers (magnitudes); a single number is a list of one.
std::vector<double> number_list(const formats::Section& s, std::string_view key, double lo, double hi, const char* what) {
  const auto f = s.find(key);
  std::vector<double> out;
  const auto take = [&](const toml::node& n, const std::string& path) {
    const std::optional<double> v = formats::toml_number(n);
    if (!v || !(*v >= lo && *v <= hi))
      throw InputError(path, formats::toml_value_text(n), what, formats::toml_where(f->layer->file, n.source()));
    out.push_back(*v);
  };
  if (const toml::array* arr = f->node->as_array()) {
    for (std::size_t i = 0; i < arr->size(); ++i)
      take(*arr->get(i), s.key_path(*f, key) + "[" + std::to_string(i) + "]");
  } else {
    take(*f->node, s.key_path(*f, key));
  }
  if (out.empty()) s.fail(key, "[]", what);
  return out;
}

using plausible::written;

void require_positive(const formats::Section& s, std::string_view key, double v) {
  if (!(v > 0 && std::isfinite(v))) s.fail(key, written(s, key), "a value greater than zero");
}

// The catalog file and how to read it: file, format, columns, strict.
void read_source(const formats::Section& s, CatalogSpec& c) {
  c.path = s.input_path("file");
  c.file = formats::display_name(c.path);
  c.where = s.where(*s.find("file"));
  c.format = s.optional_string("format").value_or("auto");
  try {
    c.format_kind = formats::parse_catalog_format(c.format, "format");
  } catch (const InputError&) {
    s.fail("format", c.format, "'auto', 'csv' or 'quakeml'");
  }
  c.columns = s.optional_string("columns").value_or("");
  if (!c.columns.empty()) {
    try {
      c.column_map = formats::parse_catalog_columns(c.columns);
    } catch (const InputError& e) {
      // The mapping's own field ("column mapping key 'tme'") under the key path, located at the key.
      const auto f = s.find("columns");
      throw InputError(s.key_path(*f, "columns") + ": " + e.field(), e.value(), e.expected(), s.where(*f));
    }
  }
  c.strict = s.boolean_or("strict", false);
}

// `polygon`: a ring of [x, y] vertices in the working CRS.
std::vector<std::array<double, 2>> read_polygon(const formats::Section& s) {
  std::vector<std::array<double, 2>> ring;
  const auto f = s.find("polygon");
  if (!f) return ring;
  const toml::array* arr = f->node->as_array();
  const std::string path = s.key_path(*f, "polygon");
  const char* what = "a ring of at least 3 [x, y] vertices in the working CRS, e.g. [[0, 0], [1000, 0], [0, 1000]]";
  if (!arr || arr->size() < 3) throw InputError(path, formats::toml_value_text(*f->node), what, s.where(*f));
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::array* xy = arr->get(i)->as_array();
    std::array<double, 2> v{};
    bool ok = xy && xy->size() == 2;
    for (std::size_t k = 0; ok && k < 2; ++k) {
      const std::optional<double> x = formats::toml_number(*xy->get(k));
      ok = x && std::isfinite(*x);
      if (ok) v[k] = *x;
    }
    if (!ok)
      throw InputError(path + "[" + std::to_string(i) + "]", formats::toml_value_text(*arr->get(i)), "[x, y] in metres",
                       formats::toml_where(f->layer->file, arr->get(i)->source()));
    ring.push_back(v);
  }
  return ring;
}

// Which events count: time window, depth range, magnitude types, well buffer, polygon.
void read_filters(const formats::Section& s, CatalogSpec& c) {
  c.from = optional_time(s, "from");
  c.to = optional_time(s, "to");
  if (c.from && c.to && !(*c.to > *c.from)) s.fail("to", s.string("to"), "a time after 'from'");
  c.depth_min = s.optional_quantity("depth_min", Dimension::length);
  c.depth_max = s.optional_quantity("depth_max", Dimension::length);
  if (c.depth_min && c.depth_max && !(*c.depth_max >= *c.depth_min))
    s.fail("depth_max", written(s, "depth_max"), "a depth at or below 'depth_min' (" + written(s, "depth_min") + ")");
  if (s.has("magnitude_types"))
    for (const auto& [v, w] : s.string_list("magnitude_types")) c.magnitude_types.push_back(v);
  c.well_buffer = s.optional_quantity("well_buffer", Dimension::length);
  if (c.well_buffer) require_positive(s, "well_buffer", *c.well_buffer);
  c.polygon = read_polygon(s);
}

// Magnitude statistics: binning, Mc, bootstrap, seismic moment, forecasts, rupture length.
void read_statistics(const formats::Section& s, CatalogSpec& c) {
  c.bin_width = s.quantity_or("bin_width", Dimension::dimensionless, 0.1);
  if (!(c.bin_width > 0 && c.bin_width <= 1)) s.fail("bin_width", written(s, "bin_width"), "a bin width in (0, 1]");
  c.mc_correction = s.quantity_or("mc_correction", Dimension::dimensionless, 0.0);
  if (!(c.mc_correction >= 0 && c.mc_correction <= 1))
    s.fail("mc_correction", written(s, "mc_correction"), "a correction between 0 and 1 (usual: 0.2)");
  if (s.has("mc")) c.mc = s.quantity("mc", Dimension::dimensionless);
  if (auto b = s.optional_integer("bootstrap")) {
    if (*b < 0 || *b > 100000) s.fail("bootstrap", std::to_string(*b), "a resample count from 0 to 100000");
    c.bootstrap = static_cast<std::size_t>(*b);
  }
  c.bootstrap_confidence = s.quantity_or("bootstrap_confidence", Dimension::dimensionless, 0.95);
  if (!(c.bootstrap_confidence > 0 && c.bootstrap_confidence < 1))
    s.fail("bootstrap_confidence", written(s, "bootstrap_confidence"), "a confidence level in (0, 1)");
  c.shear_modulus = s.quantity_or("shear_modulus", Dimension::pressure, 3.0e10);
  require_positive(s, "shear_modulus", c.shear_modulus);
  if (s.has("forecast_magnitudes"))
    c.forecast_magnitudes = number_list(s, "forecast_magnitudes", -2.0, 10.0, "magnitudes between -2 and 10");
  c.length_regression = s.optional_string("length_regression").value_or("surface");
  if (c.length_regression != "surface" && c.length_regression != "subsurface")
    s.fail("length_regression", c.length_regression, "'surface' or 'subsurface'");
}

// The models compared with the catalog: pressure footprint, r-t view, rate-and-state.
void read_models(const formats::Section& s, const std::vector<WellSpec>& wells, CatalogSpec& c) {
  c.footprint_threshold = s.quantity_or("footprint_threshold", Dimension::pressure, 0.1e6);
  require_positive(s, "footprint_threshold", c.footprint_threshold);
  c.rt_well = s.optional_string("rt_well").value_or("");
  if (!c.rt_well.empty()) {
    std::vector<std::string> ids;
    for (const auto& w : wells) ids.push_back(w.id);
    if (std::find(ids.begin(), ids.end(), c.rt_well) == ids.end())
      s.fail("rt_well", c.rt_well, "the id of a scenario well" + util::did_you_mean(c.rt_well, ids));
  }
  if (s.has("diffusivities")) {
    const auto f = *s.find("diffusivities");
    for (const auto& [v, w] : s.string_list("diffusivities")) {
      const double d = units::parse(v, Dimension::diffusivity, s.key_path(f, "diffusivities"));
      if (!(d > 0)) throw InputError(s.key_path(f, "diffusivities"), v, "a diffusivity greater than zero", w);
      c.diffusivities.push_back(d);
    }
  }

  const formats::Section rs = s.child("rate_state");
  if (!rs.empty()) {
    rs.allow({"background_rate_per_km", "a_sigma", "aftershock_duration"});
    c.rate_state = true;
    c.background_rate_per_m = rs.quantity("background_rate_per_km", Dimension::inverse_time) / 1000.0;
    require_positive(rs, "background_rate_per_km", c.background_rate_per_m * 1000.0);
    c.a_sigma = rs.quantity("a_sigma", Dimension::pressure);
    require_positive(rs, "a_sigma", c.a_sigma);
    c.aftershock_duration = rs.quantity("aftershock_duration", Dimension::time);
    require_positive(rs, "aftershock_duration", c.aftershock_duration);
  }
}

}  // namespace

CatalogSpec read_catalog_spec(const formats::Section& s, const std::vector<WellSpec>& wells) {
  s.allow({"file", "format", "columns", "strict", "from", "to", "depth_min", "depth_max", "magnitude_types",
           "well_buffer", "polygon", "bin_width", "mc_correction", "mc", "bootstrap", "bootstrap_confidence", "shear_modulus",
           "forecast_magnitudes", "length_regression", "footprint_threshold", "rt_well", "diffusivities",
           "rate_state"});
  CatalogSpec c;
  read_source(s, c);
  read_filters(s, c);
  read_statistics(s, c);
  read_models(s, wells, c);
  return c;
}

}  // namespace slipscreen::scenario
