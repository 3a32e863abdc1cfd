// Region files (regions/<name>/region.toml): stress, pore pressure, faults, formation.
#include "scenario/region_reader.hpp"

#include <cmath>

#include "core/errors.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/toml/toml_section.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

// A quantity checked against its physical range (scenario/plausibility.hpp), echoed as written.
double checked(const formats::Section& s, std::string_view key, Dimension d, const plausible::Range& range) {
  const double v = s.quantity(key, d);
  plausible::check(s, key, v, range);
  return v;
}

double checked_or(const formats::Section& s, std::string_view key, Dimension d, double fallback,
                  const plausible::Range& range) {
  return s.has(key) ? checked(s, key, d, range) : fallback;
}

using plausible::written;

constexpr plausible::Range kFriction{0.01, 2.0, false, false, "a friction coefficient from 0.01 to 2"};

// The vertical stress: exactly one of a gradient, an overburden density or density layers.
void read_vertical_stress(const formats::Section& s, StressSpec& st) {
  const int sv_forms = int(s.has("vertical_gradient")) + int(s.has("overburden_density")) + int(s.has("density_layers"));
  if (sv_forms != 1)
    s.fail(s.has("overburden_density") ? "overburden_density" : "vertical_gradient", sv_forms ? "(several)" : "(missing)",
           "exactly one of vertical_gradient, overburden_density or density_layers");
  if (s.has("overburden_density")) {
    st.vertical_gradient = checked(s, "overburden_density", Dimension::density, plausible::kRockDensity) *
                           units::kStandardGravity;
    return;
  }
  if (s.has("vertical_gradient")) {
    st.vertical_gradient = checked(s, "vertical_gradient", Dimension::pressure_gradient, plausible::kVerticalGradient);
    return;
  }
  const auto layers = s.table_array("density_layers", "an array of tables {top = \"0 m\", density = \"2300 kg/m3\"}");
  for (std::size_t i = 0; i < layers.size(); ++i) {
    const formats::Section& ls = layers[i];
    ls.allow({"top", "density"});
    StressSpec::DensityLayer l{checked(ls, "top", Dimension::length, plausible::kLayerTop),
                               checked(ls, "density", Dimension::density, plausible::kRockDensity)};
    if (i == 0 && l.top != 0) ls.fail("top", written(ls, "top"), "0 m for the first layer");
    if (i > 0 && !(l.top > st.density_layers.back().top)) ls.fail("top", written(ls, "top"), "a top below the previous layer's");
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
  // The poroelastic path's α and ν are the uniaxial-strain model's own keys (the same rock).
  const std::initializer_list<std::string_view> uniaxial_only = {"young_modulus", "strain_shmin", "strain_shmax",
                                                                 "tectonic_shmin", "tectonic_shmax"};
  const auto forbid_uniaxial = [&] { st.poroelastic_path ? forbid(uniaxial_only) : forbid(uniaxial_keys); };
  switch (st.model) {
    case StressModel::gradients:
      forbid_uniaxial();
      forbid({"a_phi", "equilibrium_friction"});
      st.shmax_gradient = checked(s, "shmax_gradient", Dimension::pressure_gradient, plausible::kHorizontalGradient);
      st.shmin_gradient = checked(s, "shmin_gradient", Dimension::pressure_gradient, plausible::kHorizontalGradient);
      if (st.shmax_gradient < st.shmin_gradient)
        s.fail("shmax_gradient", written(s, "shmax_gradient"),
               "SHmax >= Shmin (shmin_gradient = " + written(s, "shmin_gradient") + ")");
      break;
    case StressModel::uniaxial_strain:
      forbid({"shmax_gradient", "shmin_gradient", "a_phi", "equilibrium_friction"});
      st.poisson_ratio = checked(s, "poisson_ratio", Dimension::dimensionless,
                                 {0.0, 0.4999, false, false, "a Poisson ratio in [0, 0.5)"});
      st.biot = checked_or(s, "biot", Dimension::dimensionless, 1.0, {0.0, 1.0, false, false, "a Biot coefficient in [0, 1]"});
      st.young_modulus = checked_or(s, "young_modulus", Dimension::pressure, 0.0, plausible::kYoungModulus);
      st.strain_shmin = checked_or(s, "strain_shmin", Dimension::dimensionless, 0.0, plausible::kTectonicStrain);
      st.strain_shmax = checked_or(s, "strain_shmax", Dimension::dimensionless, 0.0, plausible::kTectonicStrain);
      if ((st.strain_shmin != 0 || st.strain_shmax != 0) && !(st.young_modulus > 0))
        s.fail("young_modulus", written(s, "young_modulus"), "a Young's modulus > 0 (needed with tectonic strains)");
      st.tectonic_shmin = checked_or(s, "tectonic_shmin", Dimension::pressure, 0.0, plausible::kTectonicStress);
      st.tectonic_shmax = checked_or(s, "tectonic_shmax", Dimension::pressure, 0.0, plausible::kTectonicStress);
      break;
    case StressModel::a_phi:
      forbid_uniaxial();
      forbid({"shmax_gradient", "shmin_gradient"});
      st.a_phi = checked(s, "a_phi", Dimension::dimensionless, {0.0, 3.0, false, false, "A_phi in [0, 3] (Simpson 1997)"});
      st.equilibrium_friction = checked_or(s, "equilibrium_friction", Dimension::dimensionless, fault_friction, kFriction);
      break;
  }
  if (!st.poroelastic_path) return;
  // Engelder & Fischer (1994): κ = α(1−2ν)/(1−ν); α = 0 would be no path at all.
  if (st.model != StressModel::uniaxial_strain)
    st.poisson_ratio = checked(s, "poisson_ratio", Dimension::dimensionless,
                               {0.0, 0.4999, false, false, "a Poisson ratio in [0, 0.5)"});
  st.biot = checked_or(s, "biot", Dimension::dimensionless, 1.0,
                       {0.0, 1.0, true, false, "a Biot coefficient in (0, 1] (with poroelastic_path = true)"});
}

StressSpec read_stress(const formats::Section& s, double fault_friction) {
  s.allow({"model", "vertical_gradient", "overburden_density", "density_layers", "shmax_azimuth", "shmax_gradient",
           "shmin_gradient", "poisson_ratio", "biot", "young_modulus", "strain_shmin", "strain_shmax",
           "tectonic_shmin", "tectonic_shmax", "a_phi", "equilibrium_friction", "poroelastic_path"});
  StressSpec st;
  st.poroelastic_path = s.boolean_or("poroelastic_path", false);
  const std::string model = s.string("model");
  if (model == "gradients") st.model = StressModel::gradients;
  else if (model == "uniaxial_strain") st.model = StressModel::uniaxial_strain;
  else if (model == "a_phi") st.model = StressModel::a_phi;
  else s.fail("model", model, "one of 'gradients', 'uniaxial_strain', 'a_phi'");
  read_vertical_stress(s, st);
  st.shmax_azimuth = checked(s, "shmax_azimuth", Dimension::angle, plausible::kAzimuth);
  read_horizontal_stress(s, model, fault_friction, st);
  return st;
}

FaultMapSpec read_faults(const formats::Section& s) {
  s.allow({"file", "layer", "crs", "attributes", "friction", "cohesion", "segment_length", "check_points",
           "allow_folded", "top", "bottom", "depth_levels"});
  FaultMapSpec f;
  // A path is relative to the file that names it (region file or scenario override). A GDAL
  // network path is kept as written: the fault reader refuses it unless --allow-network.
  const std::string file_text = s.string("file");
  f.path = formats::is_network_path(file_text) ? std::filesystem::path(file_text) : s.input_path("file");
  f.layer = s.optional_string("layer").value_or("");
  f.crs = s.optional_string("crs").value_or("");
  const formats::Section a = s.child("attributes");
  a.allow({"id", "dip", "dip_direction", "dips_to", "friction", "default_dip", "top", "bottom"});
  f.id_attribute = a.optional_string("id").value_or(f.id_attribute);
  f.dip_attribute = a.optional_string("dip").value_or(f.dip_attribute);
  f.dip_direction_attribute = a.optional_string("dip_direction").value_or(f.dip_direction_attribute);
  f.dips_to_attribute = a.optional_string("dips_to").value_or(f.dips_to_attribute);
  f.friction_attribute = a.optional_string("friction").value_or(f.friction_attribute);
  f.top_attribute = a.optional_string("top").value_or(f.top_attribute);
  f.bottom_attribute = a.optional_string("bottom").value_or(f.bottom_attribute);
  if (a.has("default_dip")) {
    f.default_dip = checked(a, "default_dip", Dimension::angle,
                            {0.0, 1.5707963267948966 + 1e-12, true, false, "a dip in (0, 90] degrees"});
  }
  f.friction = checked_or(s, "friction", Dimension::dimensionless, 0.6, kFriction);
  f.cohesion = checked_or(s, "cohesion", Dimension::pressure, 0.0, plausible::kCohesion);
  f.segment_length = checked_or(s, "segment_length", Dimension::length, 2000.0, plausible::kSegmentLength);
  const std::int64_t check_points = s.optional_integer("check_points").value_or(5);
  if (check_points < 1 || check_points > 101) s.fail("check_points", written(s, "check_points"), "an integer from 1 to 101");
  f.check_points = static_cast<int>(check_points);
  f.allow_folded = s.boolean_or("allow_folded", false);
  if (s.has("top") != s.has("bottom")) s.fail(s.has("top") ? "bottom" : "top", "(missing)", "both top and bottom of the faults' depth range");
  if (s.has("top")) {
    f.top = checked(s, "top", Dimension::length, plausible::kLayerTop);
    f.bottom = checked(s, "bottom", Dimension::length, plausible::kLayerTop);
    if (!(f.bottom >= f.top)) s.fail("bottom", written(s, "bottom"), "a depth at or below top");
  }
  const std::int64_t levels = s.optional_integer("depth_levels").value_or(3);
  if (levels < 1 || levels > 21) s.fail("depth_levels", written(s, "depth_levels"), "an integer from 1 to 21");
  f.depth_levels = static_cast<int>(levels);
  return f;
}

// [formation] model = "theis" | "leaky"; a leaky formation takes its leakage factor B directly
// (leakage_factor) or from the aquitard (leakage = {aquitard_thickness, aquitard_permeability},
// B = sqrt(k h b'/k'), Hantush & Jacob 1955).
void read_leakage(const formats::Section& s, FormationSpec& f) {
  const std::string model = s.optional_string("model").value_or("theis");
  if (model == "leaky") f.leaky = true;
  else if (model != "theis" && model != "poroelastic_3d") s.fail("model", model, "'theis', 'leaky' or 'poroelastic_3d'");
  const bool given = s.has("leakage"), factor = s.has("leakage_factor");
  if (!f.leaky) {
    if (given || factor)
      s.fail(given ? "leakage" : "leakage_factor", "(set)", "model = 'leaky' for a leaky formation (the model is 'theis')");
    return;
  }
  if (given == factor)
    s.fail("leakage", given ? "(with leakage_factor)" : "(missing)",
           "exactly one of leakage = {aquitard_thickness, aquitard_permeability} or leakage_factor with model = 'leaky'");
  if (factor) {
    f.leakage_factor = checked(s, "leakage_factor", Dimension::length,
                               {1.0, 1e12, false, false, "a leakage factor B from 1 m to 1e12 m"});
    return;
  }
  if (f.from_transmissivity)
    s.fail("leakage", "(aquitard)", "leakage_factor for a formation given by transmissivity (B = sqrt(T b'/K') needs "
                                     "the aquitard's hydraulic conductivity; give B directly)");
  const formats::Section a = s.child("leakage");
  a.allow({"aquitard_thickness", "aquitard_permeability"});
  f.aquitard_thickness = checked(a, "aquitard_thickness", Dimension::length,
                                 {0.1, 5000.0, false, false, "an aquitard thickness from 0.1 m to 5 km"});
  f.aquitard_permeability = checked(a, "aquitard_permeability", Dimension::permeability, plausible::kPermeability);
}

// [formation] model = "poroelastic_3d": the solid's constants (Rudnicki 1986); its porosity and
// compressibility are implied, so those keys and the transmissivity form are refused.
void read_poroelastic_3d(const formats::Section& s, FormationSpec& f) {
  for (auto k : {"porosity", "total_compressibility", "transmissivity", "storativity", "boundary"})
    if (s.has(k))
      s.fail(k, "(set)", std::string("no '") + k + "' with model = 'poroelastic_3d' (permeability, thickness, viscosity "
                         "and the solid's shear_modulus, poisson_ratio, undrained_poisson_ratio, biot; no boundaries)");
  f.poroelastic_3d = true;
  f.permeability = checked(s, "permeability", Dimension::permeability, plausible::kPermeability);
  f.thickness = checked(s, "thickness", Dimension::length, plausible::kThickness);
  f.viscosity = checked(s, "viscosity", Dimension::viscosity, plausible::kViscosity);
  f.fluid_density = checked_or(s, "fluid_density", Dimension::density, 1000.0, plausible::kFluidDensity);
  f.shear_modulus = checked(s, "shear_modulus", Dimension::pressure,
                            {1e8, 1e11, false, false, "a shear modulus from 0.1 GPa to 100 GPa"});
  f.poisson_ratio = checked(s, "poisson_ratio", Dimension::dimensionless,
                            {0.0, 0.5, true, false, "a drained Poisson's ratio in [0, 0.5)"});
  f.undrained_poisson_ratio = checked(s, "undrained_poisson_ratio", Dimension::dimensionless,
                                      {0.0, 0.5, false, false, "an undrained Poisson's ratio in (0, 0.5)"});
  if (!(f.undrained_poisson_ratio > f.poisson_ratio))
    s.fail("undrained_poisson_ratio", written(s, "undrained_poisson_ratio"), "a value above poisson_ratio (nu_u > nu)");
  f.biot = checked(s, "biot", Dimension::dimensionless, {0.0, 1.0, false, true, "a Biot coefficient in (0, 1]"});
}

FormationSpec read_formation(const formats::Section& s) {
  s.allow({"name", "permeability", "thickness", "porosity", "total_compressibility", "viscosity",
           "transmissivity", "storativity", "fluid_density", "boundary", "model", "leakage", "leakage_factor",
           "shear_modulus", "poisson_ratio", "undrained_poisson_ratio", "biot"});
  FormationSpec f;
  f.name = s.optional_string("name").value_or("");
  const bool three_d = s.optional_string("model").value_or("") == "poroelastic_3d";
  for (auto k : {"shear_modulus", "poisson_ratio", "undrained_poisson_ratio", "biot"})
    if (!three_d && s.has(k)) s.fail(k, "(set)", "model = 'poroelastic_3d' for the solid's constants");
  f.from_transmissivity = !three_d && (s.has("transmissivity") || s.has("storativity"));
  if (three_d) {
    read_poroelastic_3d(s, f);
  } else if (f.from_transmissivity) {
    for (auto k : {"permeability", "porosity", "total_compressibility", "viscosity"})
      if (s.has(k)) s.fail(k, "(set)", "either k, phi, c_t, mu or transmissivity and storativity, not both");
    f.transmissivity = checked(s, "transmissivity", Dimension::diffusivity, plausible::kTransmissivity);
    f.storativity = checked(s, "storativity", Dimension::dimensionless, plausible::kStorativity);
    f.fluid_density = checked_or(s, "fluid_density", Dimension::density, 1000.0, plausible::kFluidDensity);
    f.thickness = checked_or(s, "thickness", Dimension::length, kUnset, plausible::kThickness);
  } else {
    f.permeability = checked(s, "permeability", Dimension::permeability, plausible::kPermeability);
    f.thickness = checked(s, "thickness", Dimension::length, plausible::kThickness);
    f.porosity = checked(s, "porosity", Dimension::dimensionless, plausible::kPorosity);
    f.total_compressibility = checked(s, "total_compressibility", Dimension::compressibility, plausible::kCompressibility);
    f.viscosity = checked(s, "viscosity", Dimension::viscosity, plausible::kViscosity);
    f.fluid_density = checked_or(s, "fluid_density", Dimension::density, 1000.0, plausible::kFluidDensity);
  }
  read_leakage(s, f);
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
      if (!plausible::kProjectedCoordinate.contains(x) || !plausible::kProjectedCoordinate.contains(y))
        bs.fail(key, formats::toml_value_text(*p->node),
                std::string("a point [x, y] in the working CRS, each ") + plausible::kProjectedCoordinate.expected);
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
  r.reference_depth = checked(s, "reference_depth", Dimension::length, plausible::kReferenceDepth);
  r.pore_pressure_gradient =
      checked(s, "pore_pressure_gradient", Dimension::pressure_gradient, plausible::kPorePressureGradient);
  r.faults = read_faults(s.child("faults"));
  r.stress = read_stress(s.child("stress"), r.faults.friction);
  r.formation = read_formation(s.child("formation"));
  if (!r.formation.poroelastic_3d && !std::isnan(r.faults.top))
    s.child("faults").fail("top", written(s.child("faults"), "top"),
                           "a fault depth range only with [formation] model = 'poroelastic_3d'");
  return r;
}

}  // namespace slipscreen::scenario
