// The pressure settings file (docs/pressure.md, "The settings file"), read through the strict
// TOML layer (formats/toml/toml_section.hpp).
#include "scenario/pressure_query.hpp"

#include <string_view>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/toml/toml_section.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

// [[well]], [[boundary]] and a well's schedule: an entry that is not a table is named as such.
constexpr auto each_entry = formats::Section::TableArrayCheck::each_entry;

std::string indexed(const std::string& path, std::size_t i) { return path + "[" + std::to_string(i) + "]"; }

// The text of a quantity as written, checked for its dimension: a string with its unit, or a
// bare number for a dimensionless value.
std::string quantity_text(const toml::node& n, Dimension d, const std::string& path, const std::string& where) {
  std::string checked;
  if (const auto* s = n.as_string()) checked = s->get();
  else if (n.is_number()) checked = formats::toml_value_text(n);
  else
    throw InputError(path, formats::toml_value_text(n),
                     "a " + std::string(units::dimension_name(d)) + " with its unit, in quotes", where);
  try {
    units::parse(checked, d, path);
  } catch (const InputError& e) {
    throw e.located(where);
  }
  // a bare number as the command shows it: 17 significant digits, as it always has
  return n.is_number() ? util::number_text(n.value<double>().value(), 17) : checked;
}

// The value of `key` as text (see quantity_text), or `fallback` when the table lacks it.
std::string optional_quantity(const formats::Section& s, std::string_view key, Dimension d,
                              std::string fallback = "") {
  const auto f = s.find(key);
  return f ? quantity_text(*f->node, d, s.key_path(*f, key), s.where(*f)) : fallback;
}

std::string required_quantity(const formats::Section& s, std::string_view key, Dimension d) {
  if (!s.has(key))
    throw Error(ErrorCategory::input, s.where_missing(key) + ": missing (expected a " +
                                          std::string(units::dimension_name(d)) + " with its unit)");
  return optional_quantity(s, key, d);
}

// A list of strings (one string is a list of one), each checked by `check(text, path, where)`.
template <class Check>
std::vector<std::string> text_list(const formats::Section& s, std::string_view key, Check check) {
  std::vector<std::string> out;
  const auto f = s.find(key);
  if (!f) return out;
  const std::string path = s.key_path(*f, key);
  const toml::array* arr = f->node->as_array();
  if (!arr) {
    out.push_back(check(*f->node, path, s.where(*f)));
    return out;
  }
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::node& n = *arr->get(i);
    out.push_back(check(n, indexed(path, i), formats::toml_where(f->layer->file, n.source())));
  }
  return out;
}

// An output unit: a known unit of dimension `d`, with "did you mean" for a typo.
std::string unit_name(const formats::Section& s, std::string_view key, Dimension d) {
  const auto f = s.find(key);
  if (!f) return "";
  const std::string text = s.string(key);
  try {
    units::lookup(text, d, s.key_path(*f, key));
  } catch (const InputError& e) {
    throw e.located(s.where(*f));
  }
  return text;
}

void read_formation(const formats::Section& s, PressureQuery& q) {
  s.allow({"permeability", "thickness", "viscosity", "porosity", "total_compressibility", "transmissivity",
           "storativity", "fluid_density"});
  q.permeability = optional_quantity(s, "permeability", Dimension::permeability);
  q.thickness = optional_quantity(s, "thickness", Dimension::length);
  q.viscosity = optional_quantity(s, "viscosity", Dimension::viscosity);
  q.porosity = optional_quantity(s, "porosity", Dimension::dimensionless);
  q.total_compressibility = optional_quantity(s, "total_compressibility", Dimension::compressibility);
  q.transmissivity = optional_quantity(s, "transmissivity", Dimension::diffusivity);
  q.storativity = optional_quantity(s, "storativity", Dimension::dimensionless);
  q.fluid_density = optional_quantity(s, "fluid_density", Dimension::density);
}

PressureWell read_well(const formats::Section& s, const std::vector<PressureWell>& earlier) {
  s.allow({"name", "x", "y", "radius", "schedule"});
  PressureWell w;
  w.name = s.string("name");
  for (const auto& other : earlier)
    if (other.name == w.name) s.fail("name", w.name, "a well name used once");
  w.x = optional_quantity(s, "x", Dimension::length, w.x);
  w.y = optional_quantity(s, "y", Dimension::length, w.y);
  w.radius = optional_quantity(s, "radius", Dimension::length);
  for (const formats::Section& step :
       s.table_array("schedule", "a list of rate steps, e.g. [{ from = \"0 d\", rate = \"15000 bbl/d\" }]", each_entry)) {
    step.allow({"from", "rate"});
    PressureRateStep r;
    r.rate = required_quantity(step, "rate", Dimension::volume_rate);
    r.from = optional_quantity(step, "from", Dimension::time, r.from);
    w.schedule.push_back(std::move(r));
  }
  return w;
}

PressureBoundary read_boundary(const formats::Section& s) {
  s.allow({"kind", "x", "y", "azimuth"});
  PressureBoundary b;
  b.kind = s.string("kind");
  if (b.kind != "no-flow" && b.kind != "constant-pressure") s.fail("kind", b.kind, "'no-flow' or 'constant-pressure'");
  b.x = optional_quantity(s, "x", Dimension::length, b.x);
  b.y = optional_quantity(s, "y", Dimension::length, b.y);
  b.azimuth = optional_quantity(s, "azimuth", Dimension::angle, b.azimuth);
  return b;
}

void read_output(const formats::Section& s, PressureQuery& q) {
  s.allow({"distances", "points", "times", "unit", "length_unit"});
  const auto quantities = [&s](std::string_view key, Dimension d) {
    return text_list(s, key, [d](const toml::node& n, const std::string& path, const std::string& where) {
      return quantity_text(n, d, path, where);
    });
  };
  q.distances = quantities("distances", Dimension::length);
  q.times = quantities("times", Dimension::time);
  q.points = text_list(s, "points", [](const toml::node& n, const std::string& path, const std::string& where) {
    const auto* str = n.as_string();
    const std::string text = str ? str->get() : formats::toml_value_text(n);
    const auto comma = text.find(',');
    if (!str || comma == std::string::npos || text.find(',', comma + 1) != std::string::npos)
      throw InputError(path, text, "a point \"x, y\" with units, e.g. \"1 km, -200 m\"", where);
    try {
      units::parse(text.substr(0, comma), Dimension::length, path + " x");
      units::parse(text.substr(comma + 1), Dimension::length, path + " y");
    } catch (const InputError& e) {
      throw e.located(where);
    }
    return text;
  });
  q.unit = unit_name(s, "unit", Dimension::pressure);
  q.length_unit = unit_name(s, "length_unit", Dimension::length);
}

}  // namespace

PressureQuery read_pressure_query(const std::filesystem::path& path) {
  const std::string file = formats::display_name(path);
  const formats::TomlDocument doc = formats::parse_toml_file(path, file);
  const formats::Section top({{doc.root.get(), file, "", path.parent_path()}});
  top.allow({"formation", "well", "boundary", "output"});
  PressureQuery q;
  read_formation(top.child("formation"), q);
  for (const formats::Section& w :
       top.table_array("well", "a well table [[well]] with name, x, y, radius, schedule", each_entry))
    q.wells.push_back(read_well(w, q.wells));
  for (const formats::Section& b :
       top.table_array("boundary", "a boundary table [[boundary]] with kind, x, y, azimuth", each_entry))
    q.boundaries.push_back(read_boundary(b));
  read_output(top.child("output"), q);
  return q;
}

}  // namespace slipscreen::scenario
