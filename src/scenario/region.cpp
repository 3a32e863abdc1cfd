#include "scenario/region.hpp"

#include <cmath>
#include <numbers>

#include "core/hydro/hantush.hpp"

namespace slipscreen::scenario {

hydro::TheisParameters theis_parameters_of(const FormationSpec& f) {
  if (f.poroelastic_3d) {
    // the 3-D model's diffusivity c and the layer's μ/(4π k h) (Rudnicki 1986; Theis 1935)
    const poro::RudnickiConstants k = poro::rudnicki_constants(poroelastic_medium_of(f));
    hydro::TheisParameters p{k.diffusivity, f.viscosity / (4.0 * std::numbers::pi * f.permeability * f.thickness), 0.0};
    hydro::validate(p);
    return p;
  }
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

poro::PoroelasticMedium poroelastic_medium_of(const FormationSpec& f) {
  return {f.shear_modulus, f.poisson_ratio, f.undrained_poisson_ratio, f.biot, f.permeability, f.viscosity};
}

}  // namespace slipscreen::scenario
