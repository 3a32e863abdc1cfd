#include "core/geomech/horizontal_stress.hpp"

#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/geomech/depth_profile.hpp"

namespace slipscreen::geomech {

void check(const UniaxialStrainModel& m) {
  if (!std::isfinite(m.poisson) || m.poisson < 0.0 || m.poisson >= 0.5)
    throw InputError("Poisson's ratio", std::to_string(m.poisson), "a value in [0, 0.5)");
  if (!std::isfinite(m.biot) || m.biot < 0.0 || m.biot > 1.0)
    throw InputError("Biot coefficient", std::to_string(m.biot), "a value in [0, 1]");
  if (!std::isfinite(m.strain_h) || !std::isfinite(m.strain_H))
    throw InputError("tectonic strain", "non-finite", "finite strains");
  if (!std::isfinite(m.tectonic_h) || !std::isfinite(m.tectonic_H))
    throw InputError("tectonic stress", "non-finite", "finite stresses in Pa");
  if (!std::isfinite(m.young) || m.young < 0.0)
    throw InputError("Young's modulus", std::to_string(m.young) + " Pa", "a modulus >= 0 Pa");
  if ((m.strain_h != 0.0 || m.strain_H != 0.0) && !(m.young > 0.0))
    throw InputError("Young's modulus", std::to_string(m.young) + " Pa", "a modulus > 0 Pa when tectonic strains are given");
}

HorizontalStresses horizontal_stresses_uniaxial_strain(const UniaxialStrainModel& m, double sv, double p0) {
  check(m);
  const double nu = m.poisson;
  // Eaton (1969) with Biot's α: Shmin = ν/(1−ν)(Sv − α p0) + α p0.
  const double base = nu / (1.0 - nu) * (sv - m.biot * p0) + m.biot * p0;
  // Blanton & Olson (1999): tectonic strains add E/(1−ν²) ε + E ν/(1−ν²) ε_other.
  const double k = m.young / (1.0 - nu * nu);
  const double shmin = base + k * m.strain_h + k * nu * m.strain_H + m.tectonic_h;
  const double shmax = base + k * m.strain_H + k * nu * m.strain_h + m.tectonic_H;
  return {shmax, shmin};
}

HorizontalStresses horizontal_stresses_from_gradients(double shmax_gradient, double shmin_gradient, double depth) {
  return {from_gradient(shmax_gradient, depth, "SHmax gradient"),
          from_gradient(shmin_gradient, depth, "Shmin gradient")};
}

}  // namespace slipscreen::geomech
