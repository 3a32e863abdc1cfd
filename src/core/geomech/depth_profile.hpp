#pragma once
// Vertical stress and pore pressure at depth.
//
// Sources:
//   Sv(z) = ∫0^z ρ(z') g dz'                      Zoback (2007), Reservoir Geomechanics, ch. 1
//   p0(z) = (dp/dz) · z, hydrostatic ρw g z        common practice
//
// Symbol table (code -> literature):
//   depth            z       m, positive down from the reference surface
//   gradient         dS/dz   Pa/m
//   layers[i].top    z_i     m, top of layer i
//   layers[i].density ρ_i    kg/m³
//   kStandardGravity g       9.80665 m/s² (CGPM 1901)
#include <span>

namespace slipscreen::geomech {

// Fresh-water hydrostatic gradient ρw g = 1000 kg/m³ × 9.80665 m/s² = 9806.65 Pa/m
// (≈ 9.8 MPa/km ≈ 0.433 psi/ft; common practice).
inline constexpr double kHydrostaticGradient = 1000.0 * 9.80665;

// One layer of a density table: the layer starts at `top` and extends to the next layer's top
// (the last layer extends without limit).
struct DensityLayer {
  double top;      // m
  double density;  // kg/m³
};

// Throws InputError("depth", ...) for a negative or non-finite depth.
void check_depth(double depth);

// Stress or pressure from a constant gradient: gradient · depth. Exact for a constant gradient;
// domain: depth ≥ 0, gradient ≥ 0 (InputError otherwise; `field` names the gradient).
double from_gradient(double gradient, double depth, const char* field);

// Sv integrated through a layered density table: g Σ ρ_i · (thickness of layer i above depth).
// Exact for piecewise-constant density (the integral is a finite sum; rounding only).
// Domain: layers sorted by strictly increasing top, the first top = 0, densities > 0,
// depth ≥ 0. InputError naming the layer otherwise.
double vertical_stress_from_layers(std::span<const DensityLayer> layers, double depth);

// Hydrostatic pore pressure ρw g z with the fresh-water gradient above (common practice).
inline double hydrostatic_pressure(double depth) {
  return from_gradient(kHydrostaticGradient, depth, "pore pressure gradient");
}

}  // namespace slipscreen::geomech
