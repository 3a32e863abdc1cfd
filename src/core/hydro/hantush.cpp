// The leaky well function W(u, β) (Hantush & Jacob 1955); see hantush.hpp for the method.
#include "core/hydro/hantush.hpp"

#include <boost/math/quadrature/tanh_sinh.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/well_function.hpp"

namespace slipscreen::hydro {
namespace {

// ∫_0^T exp(−u e^t − c e^(−t)) dt with c = β²/(4u) ≤ u (the u ≥ β/2 side), computed as
// e^(−u−c) ∫_0^T exp(−u (e^t − 1) − c (e^(−t) − 1)) dt so that the integrand is 1 at t = 0
// whatever the size of u (no underflow before the final product).
double upper_side(double u, double c) {
  // The exponent is ≤ −u (e^t + e^−t − 2) = −4u sinh²(T/2) because c ≤ u; −48 at T.
  const double t_end = 2.0 * std::asinh(std::sqrt(12.0 / u));
  const auto f = [u, c](double t) { return std::exp(-u * std::expm1(t) - c * std::expm1(-t)); };
  // One integrator per thread: its abscissa tables are extended on demand.
  thread_local boost::math::quadrature::tanh_sinh<double> integrator;
  double error = 0.0, l1 = 0.0;
  const double integral = integrator.integrate(f, 0.0, double(t_end), 1e-14, &error, &l1);
  return std::exp(-(u + c)) * integral;
}

// Small c = β²/(4u): W = Σ_n (−c)^n/n! E_{n+1}(u) (expanding exp(−β²/(4y)) in the integral),
// E_{n+1} = (e^−u − u E_n)/n. Four terms; the first omitted one is below c⁴/24 · E1(u).
double small_leakage_series(double u, double c) {
  const double e1 = well_function(u), ex = std::exp(-u);
  const double e2 = ex - u * e1, e3 = 0.5 * (ex - u * e2), e4 = (ex - u * e3) / 3.0;
  return e1 - c * (e2 - 0.5 * c * (e3 - c * e4 / 3.0));
}

}  // namespace

double leaky_well_function(double u, double beta) {
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  if (!(u >= 0.0) || !(beta >= 0.0) || std::isinf(beta)) return nan;
  if (beta == 0.0) return well_function(u);
  if (u > kWellFunctionUnderflow) return 0.0;  // W(u, β) ≤ E1(u) < the smallest normal double
  if (u >= 0.5 * beta) {
    const double c = beta * beta / (4.0 * u);  // ≤ u
    return c <= 1e-4 ? small_leakage_series(u, c) : upper_side(u, c);
  }
  // Reflection: W(u, β) = 2K0(β) − W(β²/(4u), β), with β²/(4u) > β/2.
  const double k0 = 2.0 * boost::math::cyl_bessel_k(0, beta);
  if (u == 0.0) return k0;
  const double b = beta * beta / (4.0 * u);
  return b > kWellFunctionUnderflow ? k0 : k0 - upper_side(b, u);  // c = β²/(4b) = u
}

double leakage_factor(double permeability, double thickness, double aquitard_thickness, double aquitard_permeability) {
  const auto positive = [](double v, const char* field, const char* unit) {
    if (!(std::isfinite(v) && v > 0.0)) throw InputError(field, std::to_string(v) + " " + unit, "a finite value > 0");
  };
  positive(permeability, "permeability", "m2");
  positive(thickness, "thickness", "m");
  positive(aquitard_thickness, "aquitard_thickness", "m");
  positive(aquitard_permeability, "aquitard_permeability", "m2");
  return std::sqrt(permeability * thickness * aquitard_thickness / aquitard_permeability);
}

}  // namespace slipscreen::hydro
