#include "scenario/region.hpp"

namespace slipscreen::scenario {

hydro::TheisParameters theis_parameters_of(const FormationSpec& f) {
  if (f.from_transmissivity) return hydro::theis_parameters(hydro::Aquifer{f.transmissivity, f.storativity, f.fluid_density});
  return hydro::theis_parameters(
      hydro::Formation{f.permeability, f.thickness, f.viscosity, f.porosity, f.total_compressibility});
}

}  // namespace slipscreen::scenario
