#include "scenario/region.hpp"

#include <cmath>

#include "core/hydro/hantush.hpp"

namespace slipscreen::scenario {

hydro::TheisParameters theis_parameters_of(const FormationSpec& f) {
  hydro::TheisParameters p =
      f.from_transmissivity
          ? hydro::theis_parameters(hydro::Aquifer{f.transmissivity, f.storativity, f.fluid_density})
          : hydro::theis_parameters(
                hydro::Formation{f.permeability, f.thickness, f.viscosity, f.porosity, f.total_compressibility});
  if (f.leaky) {
    const double b = std::isnan(f.leakage_factor) ? hydro::leakage_factor(f.permeability, f.thickness, f.aquitard_thickness,
                                                                           f.aquitard_permeability)
                                                  : f.leakage_factor;
    p.leakage_rate = p.diffusivity / (b * b);  // c_L = D/B²
  }
  return p;
}

}  // namespace slipscreen::scenario
