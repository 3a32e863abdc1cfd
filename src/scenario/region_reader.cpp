// Region files (regions/<name>/region.toml): stress, pore pressure, faults, formation.
#include "scenario/region_reader.hpp"

#include <cmath>

#include "core/errors.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/toml/toml_section.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

void require_positive(const formats::Section& s, std::string_view key, double v) {
  if (!(v > 0)) s.fail(key, std::to_string(v), "a value greater than zero");
}

void require_range(const formats::Section& s, std::string_view key, double v, double lo, double hi, const std::string& what) {
  if (!(v >= lo && v <= hi)) s.fail(key, std::to_string(v), what);
}

// The vertical stress: exactly one of a gradient, an overburden density or density layers.
void read_vertical_stress(const formats::Section& s, StressSpec& st) {
  const int sv_forms = int(s.has("vertical_gradient")) + int(s.has("overburden_density")) + int(s.has("density_layers"));
  if (sv_forms != 1)
    s.fail(s.has("overburden_density") ? "overburden_density" : "vertical_gradient", sv_forms ? "(several)" : "(missing)",
           "exactly one of vertical_gradient, overburden_density or density_layers");
  if (s.has("overburden_density")) {
    st.vertical_gradient = s.quantity("overburden_density", Dimension::density) * units::kStandardGravity;
    require_positive(s, "overburden_density", st.vertical_gradient);
    return;
  }
  if (s.has("vertical_gradient")) {
    st.vertical_gradient = s.quantity("vertical_gradient", Dimension::pressure_gradient);
    require_positive(s, "vertical_gradient", st.vertical_gradient);
    return;
  }
  const auto layers = s.table_array("density_layers", "an array of tables {top = \"0 m\", density = \"2300 kg/m3\"}");
  for (std::size_t i = 0; i < layers.size(); ++i) {
    const formats::Section& ls = layers[i];
    ls.allow({"top", "density"});
    StressSpec::DensityLayer l{ls.quantity("top", Dimension::length), ls.quantity("density", Dimension::density)};
    if (i == 0 && l.top != 0) ls.fail("top", std::to_string(l.top) + " m", "0 m for the first layer");
    if (i > 0 && !(l.top > st.density_layers.back().top)) ls.fail("top", std::to_string(l.top) + " m", "a top below the previous layer's");
    require_positive(ls, "density", l.density);
    st.density_layers.push_back(l);
  }
}

// The horizontal stresses of `st.model`; keys of the other models are refused.
void read_horizontal_stress(const formats::Section& s, const std::string& model, double fault_friction, StressSpec& st) {
  const auto forbid = [&](std::initializer_list<std::string_view> keys) {
    for (auto k : keys)
      if (s.has(k)) s.fail(k, "(set)", "no '" + std::string(k) + "' with model = '" + model + "'");
  };
  const std::initializer_list<std::string_view> uniaxial_keys = {"poisson_ratio", "biot", "young_modulus", "strain_shmin", "strain_shmax",
                              "tectonic_shmin", "tectonic_shmax"};
  switch (st.model) {
    case StressModel::gradients:
      forbid(uniaxial_keys);
      forbid({"a_phi", "equilibrium_friction"});
      st.shmax_gradient = s.quantity("shmax_gradient", Dimension::pressure_gradient);
      st.shmin_gradient = s.quantity("shmin_gradient", Dimension::pressure_gradient);
      require_positive(s, "shmin_gradient", st.shmin_gradient);
      if (st.shmax_gradient < st.shmin_gradient)
        s.fail("shmax_gradient", std::to_string(st.shmax_gradient) + " Pa/m", "SHmax >= Shmin (shmin_gradient)");
      break;
    case StressModel::uniaxial_strain:
      forbid({"shmax_gradient", "shmin_gradient", "a_phi", "equilibrium_friction"});
      st.poisson_ratio = s.quantity("poisson_ratio", Dimension::dimensionless);
      require_range(s, "poisson_ratio", st.poisson_ratio, 0.0, 0.4999, "a Poisson ratio in [0, 0.5)");
      st.biot = s.quantity_or("biot", Dimension::dimensionless, 1.0);
      require_range(s, "biot", st.biot, 0.0, 1.0, "a Biot coefficient in [0, 1]");
      st.young_modulus = s.quantity_or("young_modulus", Dimension::pressure, 0.0);
      st.strain_shmin = s.quantity_or("strain_shmin", Dimension::dimensionless, 0.0);
      st.strain_shmax = s.quantity_or("strain_shmax", Dimension::dimensionless, 0.0);
      if ((st.strain_shmin != 0 || st.strain_shmax != 0) && !(st.young_modulus > 0))
        s.fail("young_modulus", s.has("young_modulus") ? std::to_string(st.young_modulus) : "(missing)",
               "a Young's modulus > 0 (needed with tectonic strains)");
      st.tectonic_shmin = s.quantity_or("tectonic_shmin", Dimension::pressure, 0.0);
      st.tectonic_shmax = s.quantity_or("tectonic_shmax", Dimension::pressure, 0.0);
      break;
    case StressModel::a_phi:
      forbid(uniaxial_keys);
      forbid({"shmax_gradient", "shmin_gradient"});
      st.a_phi = s.quantity("a_phi", Dimension::dimensionless);
      require_range(s, "a_phi", st.a_phi, 0.0, 3.0, "A_phi in [0, 3] (Simpson 1997)");
      st.equilibrium_friction = s.quantity_or("equilibrium_friction", Dimension::dimensionless, fault_friction);
      require_positive(s, "equilibrium_friction", st.equilibrium_friction);
      break;
  }
}

StressSpec read_stress(const formats::Section& s, double fault_friction) {
  s.allow({"model", "vertical_gradient", "overburden_density", "density_layers", "shmax_azimuth", "shmax_gradient",
           "shmin_gradient", "poisson_ratio", "biot", "young_modulus", "strain_shmin", "strain_shmax",
           "tectonic_shmin", "tectonic_shmax", "a_phi", "equilibrium_friction"});
  StressSpec st;
  const std::string model = s.string("model");
  if (model == "gradients") st.model = StressModel::gradients;
  else if (model == "uniaxial_strain") st.model = StressModel::uniaxial_strain;
  else if (model == "a_phi") st.model = StressModel::a_phi;
  else s.fail("model", model, "one of 'gradients', 'uniaxial_strain', 'a_phi'");
  read_vertical_stress(s, st);
  st.shmax_azimuth = s.quantity("shmax_azimuth", Dimension::angle);
  read_horizontal_stress(s, model, fault_friction, st);
  return st;
}

FaultMapSpec read_faults(const formats::Section& s) {
  s.allow({"file", "layer", "crs", "attributes", "friction", "cohesion", "segment_length", "check_points",
           "allow_folded"});
  FaultMapSpec f;
  // A path is relative to the file that names it (region file or scenario override). A GDAL
  // network path is kept as written: the fault reader refuses it unless --allow-network.
  const std::string written = s.string("file");
  f.path = formats::is_network_path(written) ? std::filesystem::path(written) : s.input_path("file");
  f.layer = s.optional_string("layer").value_or("");
  f.crs = s.optional_string("crs").value_or("");
  const formats::Section a = s.child("attributes");
  a.allow({"id", "dip", "dip_direction", "dips_to", "friction", "default_dip"});
  f.id_attribute = a.optional_string("id").value_or(f.id_attribute);
  f.dip_attribute = a.optional_string("dip").value_or(f.dip_attribute);
  f.dip_direction_attribute = a.optional_string("dip_direction").value_or(f.dip_direction_attribute);
  f.dips_to_attribute = a.optional_string("dips_to").value_or(f.dips_to_attribute);
  f.friction_attribute = a.optional_string("friction").value_or(f.friction_attribute);
  if (a.has("default_dip")) {
    f.default_dip = a.quantity("default_dip", Dimension::angle);
    if (!(f.default_dip > 0 && f.default_dip <= 1.5707963267948966 + 1e-12))
      a.fail("default_dip", std::to_string(f.default_dip) + " rad", "a dip in (0, 90] degrees");
  }
  f.friction = s.quantity_or("friction", Dimension::dimensionless, 0.6);
  require_range(s, "friction", f.friction, 0.01, 2.0, "a friction coefficient in [0.01, 2]");
  f.cohesion = s.quantity_or("cohesion", Dimension::pressure, 0.0);
  if (f.cohesion < 0) s.fail("cohesion", std::to_string(f.cohesion), "a cohesion >= 0");
  f.segment_length = s.quantity_or("segment_length", Dimension::length, 2000.0);
  require_positive(s, "segment_length", f.segment_length);
  f.check_points = static_cast<int>(s.optional_integer("check_points").value_or(5));
  if (f.check_points < 1 || f.check_points > 101)
    s.fail("check_points", std::to_string(f.check_points), "an integer from 1 to 101");
  f.allow_folded = s.boolean_or("allow_folded", false);
  return f;
}

FormationSpec read_formation(const formats::Section& s) {
  s.allow({"name", "permeability", "thickness", "porosity", "total_compressibility", "viscosity",
           "transmissivity", "storativity", "fluid_density", "boundary"});
  FormationSpec f;
  f.name = s.optional_string("name").value_or("");
  f.from_transmissivity = s.has("transmissivity") || s.has("storativity");
  if (f.from_transmissivity) {
    for (auto k : {"permeability", "porosity", "total_compressibility", "viscosity"})
      if (s.has(k)) s.fail(k, "(set)", "either k, phi, c_t, mu or transmissivity and storativity, not both");
    f.transmissivity = s.quantity("transmissivity", Dimension::diffusivity);
    f.storativity = s.quantity("storativity", Dimension::dimensionless);
    f.fluid_density = s.quantity_or("fluid_density", Dimension::density, 1000.0);
    f.thickness = s.quantity_or("thickness", Dimension::length, kUnset);
    require_positive(s, "transmissivity", f.transmissivity);
    require_positive(s, "storativity", f.storativity);
    require_positive(s, "fluid_density", f.fluid_density);
  } else {
    f.permeability = s.quantity("permeability", Dimension::permeability);
    f.thickness = s.quantity("thickness", Dimension::length);
    f.porosity = s.quantity("porosity", Dimension::dimensionless);
    f.total_compressibility = s.quantity("total_compressibility", Dimension::compressibility);
    f.viscosity = s.quantity("viscosity", Dimension::viscosity);
    f.fluid_density = s.quantity_or("fluid_density", Dimension::density, 1000.0);
    require_positive(s, "permeability", f.permeability);
    require_positive(s, "thickness", f.thickness);
    require_range(s, "porosity", f.porosity, 1e-4, 0.6, "a porosity in (0, 0.6]");
    require_positive(s, "total_compressibility", f.total_compressibility);
    require_positive(s, "viscosity", f.viscosity);
  }
  for (const formats::Section& bs : s.table_array("boundary", "an array of tables [[formation.boundary]]")) {
    bs.allow({"kind", "from", "to"});
    BoundarySpec bd;
    const std::string kind = bs.string("kind");
    if (kind == "no_flow") bd.kind = BoundarySpec::Kind::no_flow;
    else if (kind == "constant_pressure") bd.kind = BoundarySpec::Kind::constant_pressure;
    else bs.fail("kind", kind, "'no_flow' or 'constant_pressure'");
    for (auto key : {"from", "to"}) {
      const auto p = bs.find(key);
      const toml::array* xy = p ? p->node->as_array() : nullptr;
      if (!xy || xy->size() != 2 || !xy->get(0)->is_number() || !xy->get(1)->is_number())
        bs.fail(key, p ? formats::toml_value_text(*p->node) : "(missing)", "a point [x, y] in the working CRS");
      const double x = xy->get(0)->value<double>().value(), y = xy->get(1)->value<double>().value();
      if (std::string_view(key) == "from") bd.x1 = x, bd.y1 = y;
      else bd.x2 = x, bd.y2 = y;
    }
    if (bd.x1 == bd.x2 && bd.y1 == bd.y2) bs.fail("to", "(same point as from)", "two distinct points");
    f.boundaries.push_back(bd);
  }
  return f;
}

}  // namespace

RegionSpec load_region(const std::filesystem::path& path, const std::string& file, const toml::table* override_table,
                       const std::string& override_file, const std::string& override_prefix,
                       const std::filesystem::path& override_dir) {
  const formats::TomlDocument doc = formats::parse_toml_file(path, file);
  std::vector<formats::Section::Layer> layers{{doc.root.get(), file, "", path.parent_path()}};
  if (override_table) layers.push_back({override_table, override_file, override_prefix, override_dir});
  const formats::Section s(layers);
  s.allow({"name", "description", "crs", "reference_depth", "pore_pressure_gradient", "stress", "faults", "formation"});
  RegionSpec r;
  r.path = path;
  r.file = file;
  r.name = s.optional_string("name").value_or(path.parent_path().filename().string());
  r.crs = s.string("crs");
  r.reference_depth = s.quantity("reference_depth", Dimension::length);
  require_positive(s, "reference_depth", r.reference_depth);
  r.pore_pressure_gradient = s.quantity("pore_pressure_gradient", Dimension::pressure_gradient);
  require_positive(s, "pore_pressure_gradient", r.pore_pressure_gradient);
  r.faults = read_faults(s.child("faults"));
  r.stress = read_stress(s.child("stress"), r.faults.friction);
  r.formation = read_formation(s.child("formation"));
  return r;
}

}  // namespace slipscreen::scenario
