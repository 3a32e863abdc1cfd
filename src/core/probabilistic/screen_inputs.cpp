// The inputs of the probabilistic screen; see screen_inputs.hpp.
#include "core/probabilistic/screen_inputs.hpp"

namespace slipscreen::probabilistic {

InputList make_inputs(const UncertainModel& m, const std::vector<WellInput>& wells, std::size_t fault_count) {
  InputList l;
  if (m.from_transmissivity) {
    l.t = l.add("transmissivity", m.transmissivity);
    l.s = l.add("storativity", m.storativity);
  } else {
    l.k = l.add("permeability", m.permeability);
    l.h = l.add("thickness", m.thickness);
    l.phi = l.add("porosity", m.porosity);
    l.ct = l.add("total_compressibility", m.total_compressibility);
    l.mu_f = l.add("viscosity", m.viscosity);
  }
  l.sv_grad = l.add("vertical_gradient", m.vertical_gradient);
  l.pp_grad = l.add("pore_pressure_gradient", m.pore_pressure_gradient);
  l.azimuth = l.add("shmax_azimuth", m.shmax_azimuth);
  switch (m.model) {
    case HorizontalStressModel::gradients:
      l.shmax_g = l.add("shmax_gradient", m.shmax_gradient);
      l.shmin_g = l.add("shmin_gradient", m.shmin_gradient);
      break;
    case HorizontalStressModel::uniaxial_strain: l.poisson = l.add("poisson_ratio", m.poisson_ratio); break;
    case HorizontalStressModel::a_phi: l.aphi = l.add("a_phi", m.a_phi); break;
  }
  if (m.poroelastic_path) {  // only then: runs without the path keep their draws
    if (m.model != HorizontalStressModel::uniaxial_strain) l.poisson = l.add("poisson_ratio", m.poisson_ratio);
    l.biot = l.add("biot", m.biot);
  }
  l.friction = l.add("friction", m.friction);
  l.cohesion = l.add("cohesion", m.cohesion);
  l.fault_friction.assign(fault_count, InputList::npos);
  for (std::size_t f = 0; f < fault_count && f < m.fault_friction.size(); ++f)
    if (m.fault_friction[f])
      l.fault_friction[f] =
          l.add("friction[" + (f < m.fault_ids.size() ? m.fault_ids[f] : std::to_string(f)) + "]", *m.fault_friction[f]);
  l.rate = l.add("rate_factor", m.rate_factor);
  l.well_rate.assign(wells.size(), InputList::npos);
  for (std::size_t w = 0; w < wells.size() && w < m.well_rate_factor.size(); ++w)
    if (m.well_rate_factor[w]) l.well_rate[w] = l.add("rate_factor[" + wells[w].id + "]", *m.well_rate_factor[w]);
  if (m.seismicity) {
    l.a_sigma = l.add("a_sigma", m.a_sigma);
    l.background_rate = l.add("background_rate_per_km", m.background_rate_per_km);
  }
  return l;
}

std::vector<std::string> sampled_input_names(const UncertainModel& model, const std::vector<WellInput>& wells,
                                             std::size_t fault_count) {
  std::vector<std::string> names;
  for (const auto& in : make_inputs(model, wells, fault_count).inputs) names.push_back(in.name);
  names.emplace_back("strike_perturbation");
  names.emplace_back("dip_perturbation");
  return names;
}

}  // namespace slipscreen::probabilistic
