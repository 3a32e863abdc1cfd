#include "io/scenario_uncertainty.hpp"

#include <cmath>
#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/geomech/depth_profile.hpp"
#include "core/stats/distribution_text.hpp"
#include "io/scenario_toml.hpp"

namespace slipscreen::io {
namespace {

using units::Dimension;
using stats::Distribution;

// Best estimate as a fixed distribution, or an error naming the region value that is missing.
Distribution fixed_or(double value, const char* what) {
  if (std::isnan(value)) return Distribution::fixed(0.0, what);
  return Distribution::fixed(value, what);
}

struct Reader {
  const Section& sec;
  UncertaintySpec& spec;
  // A distribution under `key` if present, else the given fallback.
  Distribution get(std::string_view key, Dimension d, const Distribution& fallback) {
    const auto f = sec.find(key);
    if (!f) return fallback;
    const auto* s = f->node->as_string();
    if (!s) sec.fail(key, toml_value_text(*f->node), "a distribution written as a string, e.g. \"normal(0.6, 0.05)\"");
    try {
      Distribution dist = stats::parse_distribution(s->get(), d, key);
      spec.written.push_back(std::string(key) + " = " + stats::format_distribution(dist, d));
      return dist;
    } catch (const InputError& e) {
      throw e.located(sec.where(*f));
    }
  }
};

std::map<std::string, Distribution> read_map(const Section& parent, std::string_view key, Dimension d,
                                             std::string& where, std::vector<std::string>& written) {
  std::map<std::string, Distribution> out;
  const auto f = parent.find(key);
  if (!f) return out;
  const auto* t = f->node->as_table();
  if (!t) parent.fail(key, toml_value_text(*f->node), "a table of id = \"distribution\" pairs");
  where = parent.where(*f);
  for (const auto& [id, node] : *t) {
    const std::string name(id.str());
    const auto* s = node.as_string();
    const std::string loc = toml_where(f->layer->file, node.source());
    if (!s) throw InputError(std::string(key) + "." + name, toml_value_text(node), "a distribution string", loc);
    try {
      out.emplace(name, stats::parse_distribution(s->get(), d, std::string(key) + "." + name));
      written.push_back(std::string(key) + "." + name + " = " + stats::format_distribution(out.at(name), d));
    } catch (const InputError& e) {
      throw e.located(loc);
    }
  }
  return out;
}

}  // namespace

UncertaintySpec load_uncertainty(const ResolvedScenario& sc) {
  UncertaintySpec spec;
  const RegionSpec& rg = sc.region;
  auto& m = spec.model;

  // Best estimates from the region (with the scenario's overrides already applied).
  const FormationSpec& fm = rg.formation;
  m.from_transmissivity = fm.from_transmissivity;
  if (fm.from_transmissivity) {
    m.transmissivity = fixed_or(fm.transmissivity, "transmissivity");
    m.storativity = fixed_or(fm.storativity, "storativity");
    m.fluid_density = fm.fluid_density;
  } else {
    m.permeability = fixed_or(fm.permeability, "permeability");
    m.thickness = fixed_or(fm.thickness, "thickness");
    m.porosity = fixed_or(fm.porosity, "porosity");
    m.total_compressibility = fixed_or(fm.total_compressibility, "total_compressibility");
    m.viscosity = fixed_or(fm.viscosity, "viscosity");
  }
  m.depth = rg.reference_depth;
  const StressSpec& st = rg.stress;
  double sv_gradient = st.vertical_gradient;
  if (!st.density_layers.empty()) {  // the integrated overburden expressed as a mean gradient
    std::vector<geomech::DensityLayer> layers;
    for (const auto& l : st.density_layers) layers.push_back({l.top, l.density});
    sv_gradient = geomech::vertical_stress_from_layers(layers, rg.reference_depth) / rg.reference_depth;
  }
  m.vertical_gradient = fixed_or(sv_gradient, "vertical_gradient");
  m.pore_pressure_gradient = fixed_or(rg.pore_pressure_gradient, "pore_pressure_gradient");
  m.shmax_azimuth = fixed_or(st.shmax_azimuth, "shmax_azimuth");
  switch (st.model) {
    case StressModel::gradients:
      m.model = probabilistic::HorizontalStressModel::gradients;
      m.shmax_gradient = fixed_or(st.shmax_gradient, "shmax_gradient");
      m.shmin_gradient = fixed_or(st.shmin_gradient, "shmin_gradient");
      break;
    case StressModel::uniaxial_strain:
      m.model = probabilistic::HorizontalStressModel::uniaxial_strain;
      m.poisson_ratio = fixed_or(st.poisson_ratio, "poisson_ratio");
      m.uniaxial.biot = st.biot;
      m.uniaxial.young = st.young_modulus;
      m.uniaxial.strain_h = st.strain_shmin;
      m.uniaxial.strain_H = st.strain_shmax;
      m.uniaxial.tectonic_h = st.tectonic_shmin;
      m.uniaxial.tectonic_H = st.tectonic_shmax;
      break;
    case StressModel::a_phi:
      m.model = probabilistic::HorizontalStressModel::a_phi;
      m.a_phi = fixed_or(st.a_phi, "a_phi");
      if (!std::isnan(st.equilibrium_friction)) m.equilibrium_friction = st.equilibrium_friction;
      break;
  }
  m.friction = Distribution::fixed(rg.faults.friction, "friction");
  m.cohesion = Distribution::fixed(rg.faults.cohesion, "cohesion");

  if (!sc.uncertainty) return spec;
  spec.enabled = true;
  const Section sec({Section::Layer{sc.uncertainty, sc.file, "uncertainty", sc.path.parent_path()}});
  sec.allow({"realizations", "sampler", "thresholds", "permeability", "thickness", "porosity",
             "total_compressibility", "viscosity", "transmissivity", "storativity", "vertical_gradient",
             "pore_pressure_gradient", "shmax_azimuth", "shmax_gradient", "shmin_gradient", "a_phi",
             "poisson_ratio", "friction", "cohesion", "strike_perturbation", "dip_perturbation", "rate_factor",
             "fault_friction", "well_rate_factor", "maps"});
  const std::int64_t n = sec.has("realizations") ? sec.integer("realizations") : 1000;
  try {
    spec.realizations = stats::RealizationCount(n, "uncertainty.realizations").value();
  } catch (const InputError& e) {
    throw e.located(sec.where(*sec.find("realizations")));
  }
  if (const auto s = sec.optional_string("sampler")) {
    try {
      spec.method = stats::parse_sampling_method(*s, "uncertainty.sampler");
    } catch (const InputError& e) {
      throw e.located(sec.where(*sec.find("sampler")));
    }
  }
  if (const auto f = sec.find("thresholds")) {
    const auto* arr = f->node->as_array();
    if (!arr) sec.fail("thresholds", toml_value_text(*f->node), "an array of probabilities, e.g. [0.1, 0.5]");
    for (const auto& v : *arr) {
      const auto p = v.value<double>();
      if (!p || !(*p > 0.0 && *p < 1.0) || (!spec.thresholds.empty() && !(*p > spec.thresholds.back())))
        sec.fail("thresholds", toml_value_text(v), "increasing probabilities strictly between 0 and 1");
      spec.thresholds.push_back(*p);
    }
  } else {
    spec.thresholds = {0.1};
  }

  Reader r{sec, spec};
  if (m.from_transmissivity) {
    for (const char* k : {"permeability", "thickness", "porosity", "total_compressibility", "viscosity"})
      if (sec.has(k))
        sec.fail(k, "(given)", "transmissivity and storativity: this region's formation is given as (T, S)");
    m.transmissivity = r.get("transmissivity", Dimension::diffusivity, m.transmissivity);
    m.storativity = r.get("storativity", Dimension::dimensionless, m.storativity);
  } else {
    for (const char* k : {"transmissivity", "storativity"})
      if (sec.has(k)) sec.fail(k, "(given)", "permeability, thickness, porosity, total_compressibility or viscosity: "
                                             "this region's formation is given as (k, h, phi, c_t, mu)");
    m.permeability = r.get("permeability", Dimension::permeability, m.permeability);
    m.thickness = r.get("thickness", Dimension::length, m.thickness);
    m.porosity = r.get("porosity", Dimension::dimensionless, m.porosity);
    m.total_compressibility = r.get("total_compressibility", Dimension::compressibility, m.total_compressibility);
    m.viscosity = r.get("viscosity", Dimension::viscosity, m.viscosity);
  }
  m.vertical_gradient = r.get("vertical_gradient", Dimension::pressure_gradient, m.vertical_gradient);
  m.pore_pressure_gradient = r.get("pore_pressure_gradient", Dimension::pressure_gradient, m.pore_pressure_gradient);
  m.shmax_azimuth = r.get("shmax_azimuth", Dimension::angle, m.shmax_azimuth);
  const auto only_for = [&](const char* key, StressModel model, const char* name) {
    if (sec.has(key) && st.model != model)
      sec.fail(key, "(given)", std::string("an input of the region's stress model; '") + key + "' belongs to the " +
                                   name + " model");
  };
  only_for("shmax_gradient", StressModel::gradients, "gradients");
  only_for("shmin_gradient", StressModel::gradients, "gradients");
  only_for("poisson_ratio", StressModel::uniaxial_strain, "uniaxial-strain");
  only_for("a_phi", StressModel::a_phi, "A_phi");
  m.shmax_gradient = r.get("shmax_gradient", Dimension::pressure_gradient, m.shmax_gradient);
  m.shmin_gradient = r.get("shmin_gradient", Dimension::pressure_gradient, m.shmin_gradient);
  m.poisson_ratio = r.get("poisson_ratio", Dimension::dimensionless, m.poisson_ratio);
  m.a_phi = r.get("a_phi", Dimension::dimensionless, m.a_phi);
  m.friction = r.get("friction", Dimension::dimensionless, m.friction);
  m.cohesion = r.get("cohesion", Dimension::pressure, m.cohesion);
  m.strike_perturbation = r.get("strike_perturbation", Dimension::angle, m.strike_perturbation);
  m.dip_perturbation = r.get("dip_perturbation", Dimension::angle, m.dip_perturbation);
  m.rate_factor = r.get("rate_factor", Dimension::dimensionless, m.rate_factor);
  spec.fault_friction = read_map(sec, "fault_friction", Dimension::dimensionless, spec.fault_friction_where, spec.written);
  spec.well_rate_factor =
      read_map(sec, "well_rate_factor", Dimension::dimensionless, spec.well_rate_factor_where, spec.written);

  const Section maps = sec.child("maps");
  maps.allow({"cell_size", "strike", "dip"});
  spec.map_cell_size = maps.quantity_or("cell_size", Dimension::length, 0.0);
  if (maps.has("strike") != maps.has("dip"))
    maps.fail(maps.has("strike") ? "dip" : "strike", "(missing)", "both strike and dip of the map orientation");
  if (maps.has("strike")) {
    spec.map_strike = maps.quantity("strike", Dimension::angle);
    spec.map_dip = maps.quantity("dip", Dimension::angle);
    if (!(*spec.map_dip >= 0.0 && *spec.map_dip <= 1.5707963267948966 + 1e-12))
      maps.fail("dip", std::to_string(*spec.map_dip * 57.29577951308232) + " deg", "a dip from 0 to 90 deg");
  }
  if (spec.map_cell_size < 0.0) maps.fail("cell_size", std::to_string(spec.map_cell_size), "a cell size > 0");
  return spec;
}

nlohmann::json to_json(const UncertaintySpec& u) {
  nlohmann::json j;
  j["enabled"] = u.enabled;
  if (!u.enabled) return j;
  j["realizations"] = u.realizations;
  j["sampler"] = std::string(stats::sampling_method_name(u.method));
  j["thresholds"] = u.thresholds;
  j["distributions_SI"] = u.written;
  j["map_cell_size_m"] = u.map_cell_size;
  if (u.map_strike) {
    j["map_strike_rad"] = *u.map_strike;
    j["map_dip_rad"] = *u.map_dip;
  }
  return j;
}

}  // namespace slipscreen::io
