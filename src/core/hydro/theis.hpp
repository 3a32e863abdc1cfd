#pragma once
// Theis (1935) line-source solution for a well in a confined, homogeneous, isotropic formation of
// uniform thickness, infinite in extent, injecting (q > 0) or producing (q < 0) at a constant rate
// from t = 0:
//   Δp(r, t) = q μ / (4π k h) · E1(u),  u = r² / (4 D t),  D = k / (μ φ c_t)
//                                                            (Theis 1935; Earlougher 1977, ch. 2)
//   hydrogeologists' form: s = Q / (4π T) · W(u), u = r² S / (4 T t), Δp = ρ g s  (Theis 1935)
// The two forms are the same with T = k ρ g h / μ and S = ρ g φ c_t h.
//
// Symbols (code name -> paper symbol, SI units):
//   permeability k [m²], thickness h [m], viscosity μ [Pa·s], porosity φ [-],
//   total_compressibility c_t [1/Pa], transmissivity T [m²/s], storativity S [-],
//   fluid_density ρ [kg/m³], gravity g [m/s²], rate q = Q [m³/s, positive into the formation],
//   diffusivity D [m²/s], pressure_per_rate μ/(4π k h) = ρ g/(4π T) [Pa per m³/s],
//   r radial distance [m], r_w well radius [m], t time since the rate started [s].
#include "core/units/units.hpp"

namespace slipscreen::hydro {

// Formation properties, petroleum parameter set (all SI).
struct Formation {
  double permeability = 0;           // k, m²
  double thickness = 0;              // h, m
  double viscosity = 0;              // μ, Pa·s
  double porosity = 0;               // φ, fraction (0 < φ ≤ 1)
  double total_compressibility = 0;  // c_t, 1/Pa
};

// Aquifer properties, hydrogeologists' parameter set (all SI).
struct Aquifer {
  double transmissivity = 0;  // T, m²/s
  double storativity = 0;     // S, dimensionless
  double fluid_density = 0;   // ρ, kg/m³ (converts head to pressure: Δp = ρ g s)
  double gravity = units::kStandardGravity;  // g, m/s²
};

// The only two numbers through which the hydrogeology enters the Theis solution. Everything that
// varies per Monte Carlo realization (docs/uncertainty.md) can be expressed as a new TheisParameters.
struct TheisParameters {
  double diffusivity = 0;        // D, m²/s
  double pressure_per_rate = 0;  // μ / (4π k h), Pa per (m³/s)
  // c_L = D/B² [1/s], B the leakage factor of a leaky formation (hydro/hantush.hpp): E1(u) is
  // replaced by the Hantush & Jacob (1955) W(u, r/B), r/B = r √(c_L/D). 0: confined (Theis).
  double leakage_rate = 0;
};

// Throws InputError naming the field ("permeability", ...) unless every value is finite and
// positive (porosity also ≤ 1). NaN is rejected.
void validate(const Formation& f);
void validate(const Aquifer& a);
void validate(const TheisParameters& p);

// D = k/(μ φ c_t) and μ/(4π k h), validated first. Exact to rounding.
TheisParameters theis_parameters(const Formation& f);
// D = T/S and ρ g/(4π T), validated first. Exact to rounding.
TheisParameters theis_parameters(const Aquifer& a);

// Distance from a line source after clamping to the well radius: inside r_w the line source is
// singular and not physical, so r < r_w is evaluated at r_w (the pressure at the well face).
struct ClampedRadius {
  double r;      // max(r, r_w), m
  bool clamped;  // true when r < r_w was raised to r_w
};
// Throws InputError for r < 0, r_w ≤ 0 or non-finite values.
ClampedRadius clamp_to_well_radius(double r, double well_radius);

// The Theis argument u = r² / (4 D t); +inf for t ≤ 0 (no pressure yet).
double theis_argument(const TheisParameters& p, double r, double t);

// Unit-rate response F(r, t) = μ/(4π k h) · E1(r²/(4 D t)) [Pa per m³/s] at distance r (already
// clamped by the caller) and time t since the rate started. F = 0 for t ≤ 0 (documented value:
// before the rate starts there is no pressure change). Accuracy: that of well_function
// (≤ 2e-15 relative) times the rounding of the inputs.
double theis_unit_response(const TheisParameters& p, double r, double t);

// Δp for a constant rate q [m³/s] from t = 0, at r clamped to r_w (Theis 1935). 0 for t ≤ 0.
double theis_pressure(const TheisParameters& p, double rate, double r, double well_radius,
                      double t);

}  // namespace slipscreen::hydro
