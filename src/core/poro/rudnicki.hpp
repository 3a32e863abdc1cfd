#pragma once
// Fluid point source in an infinite, homogeneous, isotropic poroelastic solid: the pore-pressure
// change and the full stress-change tensor for a source of constant volume rate switched on at
// t = 0 (Rudnicki 1986; Biot's linear poroelasticity in the notation of Rice & Cleary 1976).
//
// Sources:
//   p(r, t) = q/(4π κ r) · erfc(ξ/2),  ξ = r/√(c t)                    Rudnicki (1986), Mech. Mater. 5
//   σ_ij = −η q/(4π κ r) · [δ_ij (erfc(ξ/2) − 2 g(ξ)/ξ²) + n_i n_j (erfc(ξ/2) + 6 g(ξ)/ξ²)]
//          (tension positive), g(ξ) = erf(ξ/2) − (ξ/√π) e^(−ξ²/4)      Rudnicki (1986); the form used
//                                                                       by Segall & Lu (2015), JGR 120
//   c = 2 κ G (1 − ν)(ν_u − ν) / (α² (1 − 2ν)² (1 − ν_u))             Rice & Cleary (1976), Rev. Geophys. 14
//   η = α (1 − 2ν) / (2 (1 − ν))  (the poroelastic stress coefficient)  Rice & Cleary (1976)
// Derivation (docs/physics.md, "The 3-D poroelastic model"): the displacement of a point source
// is irrotational, u = ∇Φ; equilibrium then gives ∇²Φ = (η/G) p, fluid mass balance gives the
// diffusion equation for p with storage S = κ/c, and the drained stress of the strain ∇∇Φ less
// α p δ_ij combines into σ_ij = 2G (Φ,ij − δ_ij ∇²Φ), so the stress follows from p and
// m(r, t) = ∫_0^r s² p(s, t) ds in closed form.
//
// Symbol table (code -> paper, SI units):
//   shear_modulus G [Pa], poisson_drained ν [1], poisson_undrained ν_u [1], biot α [1],
//   permeability k [m²], viscosity μ_f [Pa·s], mobility κ = k/μ_f [m²/(Pa·s)],
//   diffusivity c [m²/s], stress_coefficient η [1], storage S = κ/c [1/Pa],
//   rate q [m³/s of fluid volume, positive = injection], r distance [m], t time since the
//   rate started [s], xi ξ, n = x/r the unit vector from the source to the point.
//
// Signs: this file returns the project's convention (docs/geomechanics.md): compression
// positive, so Δσ = −σ(Rudnicki, tension positive); Δp positive for injection. Axes: any
// orthonormal frame (the solution is isotropic); the project uses North-East-Down.
//
// Limits (each tested, tests/core/poro/rudnicki_test.cpp):
//   t → ∞ (ξ → 0): p = q/(4π κ r), Δσ_ij = η p (δ_ij + n_i n_j)       steady state
//   ξ → ∞ (early time or far away): p → 0 and Δσ_ij → η q c t/(4π κ r³) (6 n_i n_j − 2 δ_ij),
//     the traceless field of an elastic centre of dilatation holding the injected volume q t
//     (undrained response of the solid around a fluid volume that has not spread)
//   trace: Δσ_kk = 4 η Δp at every point and time.
//
// Accuracy: erfc, erf and exp from the C library (≤ 1 ulp-level); g(ξ)/ξ² by its power series
// for ξ < 0.5 (summed to 1e-17 relative, no cancellation) and by the closed form above that
// (cancellation costs at most a factor 1/ξ² ≤ 4 of the rounding). Each returned value is within
// ~1e-14 relative of the exact expression; tested against an independent scipy integration of
// the instantaneous-source solution over time at 1e-10 relative, over 10 m ≤ r ≤ 5 km and
// 1e-4 ≤ ξ ≤ 60 (observed 9e-15; tests/core/poro/rudnicki_reference.py).
//
// Domain: r > 0 (callers clamp r to the well radius, as for Theis); t ≤ 0 gives 0 (the rate has
// not started); t = +∞ gives the steady state. Parameters: G > 0, −1 < ν < ν_u < 0.5,
// 0 < α ≤ 1, k > 0, μ_f > 0 (InputError naming the field otherwise).
#include <Eigen/Dense>

namespace slipscreen::poro {

// The elastic and hydraulic properties of the solid and its fluid (SI).
struct PoroelasticMedium {
  double shear_modulus = 0;      // G, Pa
  double poisson_drained = 0;    // ν
  double poisson_undrained = 0;  // ν_u (> ν)
  double biot = 1.0;             // α
  double permeability = 0;       // k, m²
  double viscosity = 0;          // μ_f, Pa·s
};

// The three numbers the point-source solution needs.
struct RudnickiConstants {
  double mobility = 0;            // κ = k/μ_f, m²/(Pa·s)
  double diffusivity = 0;         // c, m²/s
  double stress_coefficient = 0;  // η = α(1 − 2ν)/(2(1 − ν))
};

// Validates the medium (InputError naming "shear_modulus", "poisson_ratio",
// "undrained_poisson_ratio", "biot", "permeability" or "viscosity") and returns
// κ, c and η as above. Exact to rounding.
RudnickiConstants rudnicki_constants(const PoroelasticMedium& m);

// g(ξ)/ξ² with g(ξ) = erf(ξ/2) − (ξ/√π) e^(−ξ²/4); 0 at ξ = 0, → 1/ξ² as ξ → ∞. ξ ≥ 0.
double rudnicki_g_over_xi2(double xi);

// Response at one point to a unit rate (1 m³/s) switched on at t = 0 at the origin.
struct PointResponse {
  double dp = 0;                                    // Δp, Pa per m³/s
  Eigen::Matrix3d dstress = Eigen::Matrix3d::Zero();  // Δσ_ij, Pa per m³/s, compression positive
};

// Δp only (Pa per m³/s) at distance r > 0 and time t since the rate started.
double point_source_pressure(const RudnickiConstants& k, double r, double t);

// Δp and Δσ at offset x (point minus source; |x| > 0) and time t. The caller clamps |x| to a
// radius (scale x) when it can be 0.
PointResponse point_source_response(const RudnickiConstants& k, const Eigen::Vector3d& x, double t);

}  // namespace slipscreen::poro
