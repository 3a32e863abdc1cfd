// Theis (1935) line source; see theis.hpp for the formulas, symbols and accuracy.
#include "core/hydro/theis.hpp"

#include <cmath>
#include <limits>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/hydro/hantush.hpp"
#include "core/hydro/well_function.hpp"

namespace slipscreen::hydro {
namespace {

void require_positive(double v, const char* field, const char* unit_hint) {
  if (!std::isfinite(v) || !(v > 0.0))
    throw InputError(field, util::number_text(v), std::string("a finite positive value") + unit_hint);
}

}  // namespace

void validate(const Formation& f) {
  require_positive(f.permeability, "permeability", " (m², e.g. '10 mD')");
  require_positive(f.thickness, "thickness", " (m, e.g. '30 m')");
  require_positive(f.viscosity, "viscosity", " (Pa·s, e.g. '0.5 cP')");
  require_positive(f.porosity, "porosity", " (fraction, e.g. '0.15')");
  if (f.porosity > 1.0) throw InputError("porosity", util::number_text(f.porosity), "a fraction in (0, 1]");
  require_positive(f.total_compressibility, "total_compressibility", " (1/Pa, e.g. '1e-9 1/Pa')");
}

void validate(const Aquifer& a) {
  require_positive(a.transmissivity, "transmissivity", " (m²/s)");
  require_positive(a.storativity, "storativity", " (dimensionless)");
  require_positive(a.fluid_density, "fluid_density", " (kg/m³, e.g. '1000 kg/m3')");
  require_positive(a.gravity, "gravity", " (m/s²)");
}

void validate(const TheisParameters& p) {
  require_positive(p.diffusivity, "diffusivity", " (m²/s)");
  require_positive(p.pressure_per_rate, "pressure_per_rate", " (Pa per m³/s)");
  if (!(std::isfinite(p.leakage_rate) && p.leakage_rate >= 0.0))
    throw InputError("leakage_rate", util::number_text(p.leakage_rate), "a finite D/B^2 >= 0 (1/s)");
}

TheisParameters theis_parameters(const Formation& f) {
  validate(f);
  TheisParameters p;
  p.diffusivity = f.permeability / (f.viscosity * f.porosity * f.total_compressibility);
  p.pressure_per_rate = f.viscosity / (4.0 * std::numbers::pi * f.permeability * f.thickness);
  validate(p);  // catches overflow of extreme inputs
  return p;
}

TheisParameters theis_parameters(const Aquifer& a) {
  validate(a);
  TheisParameters p;
  p.diffusivity = a.transmissivity / a.storativity;
  p.pressure_per_rate = a.fluid_density * a.gravity / (4.0 * std::numbers::pi * a.transmissivity);
  validate(p);
  return p;
}

ClampedRadius clamp_to_well_radius(double r, double well_radius) {
  require_positive(well_radius, "well_radius", " (m, e.g. '0.1 m')");
  if (!std::isfinite(r) || r < 0.0) throw InputError("distance", util::number_text(r), "a finite distance ≥ 0 m");
  if (r < well_radius) return {well_radius, true};
  return {r, false};
}

double theis_argument(const TheisParameters& p, double r, double t) {
  if (!(t > 0.0)) return std::numeric_limits<double>::infinity();
  return r * r / (4.0 * p.diffusivity * t);
}

double theis_unit_response(const TheisParameters& p, double r, double t) {
  if (!(t > 0.0)) return 0.0;
  if (p.leakage_rate > 0.0)
    return p.pressure_per_rate * leaky_well_function(theis_argument(p, r, t), r * std::sqrt(p.leakage_rate / p.diffusivity));
  return p.pressure_per_rate * well_function(theis_argument(p, r, t));
}

double theis_pressure(const TheisParameters& p, double rate, double r, double well_radius,
                      double t) {
  const ClampedRadius c = clamp_to_well_radius(r, well_radius);
  return rate * theis_unit_response(p, c.r, t);
}

}  // namespace slipscreen::hydro
