#pragma once
// The Coulomb failure criterion on a fault plane and the pore-pressure increase that brings
// the plane to failure, with or without the poroelastic stress path.
//
// Sources:
//   CFF = τ − μ (σn − p) − c; slip when CFF ≥ 0         Jaeger, Cook & Zimmerman (2007) ch. 4
//   Δp_crit = (σn − p0) − (τ − c)/μ  (no stress change) Hubbert & Rubey (1959); Zoback (2007) ch. 4
//   uniaxial-strain poroelastic stress path in a laterally extensive reservoir:
//   Δσh = α (1−2ν)/(1−ν) Δp, Δσv = 0                    Engelder & Fischer (1994), Geology 22;
//                                                        Zoback (2007) ch. 3 (chapter from memory)
//
// Symbol table (code -> literature):
//   mu              μ      friction coefficient
//   cohesion        c, S0  cohesion, Pa
//   tau, sigma_n    τ, σn  resolved shear and normal stress, Pa
//   p0              p0     initial pore pressure, Pa
//   dp              Δp     pore-pressure change, Pa
//   kappa           α(1−2ν)/(1−ν), the stress-path coefficient Δσh/Δp
//
// The poroelastic path. With ΔS = κ Δp (I − e3 e3ᵀ) (horizontal, isotropic, NED), the shear
// traction vector on the plane is a + b Δp (a = shear part of S n, b = shear part of
// κ (nx, ny, 0)) and the effective normal stress is σn − p0 + (κ sin²δ − 1) Δp. Each component
// of the stress change is linear in Δp, so CFF(Δp) = |a + b Δp| − μ (σn − p0 + (κ sin²δ − 1) Δp) − c
// is convex and CFF(Δp) = 0 is solved exactly as a quadratic (squaring |a + b Δp| = g(Δp),
// keeping roots with g ≥ 0). When a and b are parallel (dip-slip on Andersonian planes) this is
// the brief's ΔCFF = Δτ − μ (Δσn − Δp), linear in Δp.
#include <Eigen/Dense>
#include <cmath>
#include <limits>

#include "core/geomech/stress_state.hpp"

namespace slipscreen::geomech {

struct Friction {
  double mu = 0.6;        // μ
  double cohesion = 0.0;  // c, Pa
};

// InputError("friction", ...) unless μ > 0; InputError("cohesion", ...) unless c ≥ 0.
void check(const Friction& f);

// Jaeger, Cook & Zimmerman (2007): CFF = τ − μ (σn − p) − c. Exact; any finite inputs.
inline double coulomb_failure_function(double tau, double sigma_n, double p, double mu, double cohesion) {
  return tau - mu * (sigma_n - p) - cohesion;
}

enum class CriticalStatus {
  below_failure,     // Δp_crit > 0: the pressure must rise by Δp_crit
  already_critical,  // Δp_crit ≤ 0: the plane is at or past failure at p0 (reported, never hidden)
  never,             // CFF does not reach 0 for any pressure increase; Δp_crit = +∞
};
const char* to_string(CriticalStatus s);

struct CriticalPressure {
  double dp;  // Pa; +∞ for `never`; for already_critical the (≤ 0) change at which CFF = 0
  CriticalStatus status;
};

inline CriticalStatus status_of(double dp) {
  if (std::isinf(dp) && dp > 0) return CriticalStatus::never;
  return dp > 0.0 ? CriticalStatus::below_failure : CriticalStatus::already_critical;
}

// Hubbert & Rubey (1959): Δp_crit = (σn − p0) − (τ − c)/μ. Exact (rounding only); μ > 0.
inline double critical_pressure_closed_form(double tau, double sigma_n, double p0, double mu, double cohesion) {
  return (sigma_n - p0) - (tau - cohesion) / mu;
}

// Δp_crit with no stress change (validates friction).
CriticalPressure critical_pressure(double tau, double sigma_n, double p0, const Friction& f);

struct PoroelasticPath {
  double biot = 1.0;      // α, [0, 1]
  double poisson = 0.25;  // ν, [0, 0.5)
};
// κ = α (1−2ν)/(1−ν) (Engelder & Fischer 1994). InputError for α or ν outside their domain.
double stress_path_coefficient(const PoroelasticPath& path);

// ΔS = κ Δp (I − e3 e3ᵀ) in NED: the horizontal stress change of the uniaxial-strain path.
Eigen::Matrix3d poroelastic_stress_change(double kappa, double dp);

// The root of CFF(Δp) = |a + bΔp| − (g0 + g1 Δp) nearest 0 on the side the state lies:
// for CFF(0) < 0 the smallest root > 0 (+∞ if none, or if CFF grows by less than 1e-12 Pa per
// Pa of pressure for large Δp: `never`), for CFF(0) ≥ 0 the largest
// root ≤ 0 (−∞ if none: critical for any pressure drop along the path). Inputs: τ0 = |a|,
// ab = a·b, bb = |b|², g0 = μ (σn − p0) + c, g1 = μ (κ sin²δ − 1). Exact up to rounding in the
// quadratic formula (relative error ~1e-15 × the largest term; a double root loses half the
// digits, ~1e-8 relative).
double critical_pressure_path_root(double tau0, double ab, double bb, double g0, double g1);

// The pieces of critical_pressure_path_root, inline and free of branches so the batched kernel
// vectorises them with its square roots taken in separate passes:
//   |a + b x|² = (g0 + g1 x)²  ⇔  A x² + 2 B x + C = 0, disc = B² − A C.
struct PathQuadratic {
  double a, b, c;  // A, B, C
  double disc;     // B² − A C; rounding noise below 1e-12 B² set to 0; < 0: no real root
};

inline PathQuadratic path_quadratic(double tau0, double ab, double bb, double g0, double g1) {
  PathQuadratic q;
  q.a = bb - g1 * g1;
  q.b = ab - g0 * g1;
  q.c = (tau0 - g0) * (tau0 + g0);  // τ0² − g0² without cancellation
  const double d = q.b * q.b - q.a * q.c;
  q.disc = ((d < 0.0) & (d > -1e-12 * q.b * q.b)) ? 0.0 : d;  // & not &&: no branch
  return q;
}

// Picks the root (see critical_pressure_path_root) given sqrt_bb = √bb and
// sqrt_disc = √max(disc, 0). Every division is evaluated and the unused ones discarded, so a
// division by zero here is harmless (IEEE, no trap).
inline double path_root_select(double tau0, double bb, double g0, double g1, const PathQuadratic& q,
                               double sqrt_bb, double sqrt_disc) {
  constexpr double inf = std::numeric_limits<double>::infinity();
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  const bool rising = tau0 - g0 < 0.0;
  const bool linear = std::fabs(q.a) <= 1e-14 * (bb + g1 * g1);
  const bool real = q.disc >= 0.0;
  const double qq = -(q.b + std::copysign(sqrt_disc, q.b));
  const double lin = -q.c / (2.0 * q.b), big = qq / q.a, small = q.c / qq;
  const double r1 = linear ? (q.b != 0.0 ? lin : nan) : (real ? (qq != 0.0 ? big : 0.0) : nan);
  const double r2 = (!linear & real & (qq != 0.0)) ? small : nan;
  // A root is kept where g(x) = g0 + g1 x ≥ 0 (the others solve |a+bx| = −g) and on the side
  // the state lies: x > 0 when CFF(0) < 0, x ≤ 0 otherwise. NaN fails every comparison.
  const double g_1 = g0 + g1 * r1, g_2 = g0 + g1 * r2;
  const bool ok1 = (g_1 >= -1e-9 * (std::fabs(g0) + std::fabs(g1 * r1))) & (rising ? r1 > 0.0 : r1 <= 0.0);
  const bool ok2 = (g_2 >= -1e-9 * (std::fabs(g0) + std::fabs(g1 * r2))) & (rising ? r2 > 0.0 : r2 <= 0.0);
  double best = rising ? inf : -inf;
  best = (ok1 & (rising ? r1 < best : r1 > best)) ? r1 : best;
  best = (ok2 & (rising ? r2 < best : r2 > best)) ? r2 : best;
  // For large Δp, CFF grows at |b| − g1 = |b| + μ (1 − κ sin²δ) per unit Δp; below 1e-12 the
  // plane never reaches failure by raising the pressure (κ = 1 on a vertical plane, say).
  return (rising & (sqrt_bb - g1 <= 1e-12)) ? inf : best;
}

// Δp_crit along the poroelastic path for the plane with unit normal n (either sign),
// by critical_pressure_path_root. κ = 0 gives the closed form exactly.
CriticalPressure critical_pressure_poroelastic(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n,
                                               const Friction& f, double kappa);

// ΔCFF(Δp) = CFF(Δp) − CFF(0) on one plane along the poroelastic path (same source and terms
// as above; cohesion cancels):
//   ΔCFF = |a + bΔp| − |a| + μ (1 − κ sin²δ) Δp,
// the shear part evaluated as (2 a·b Δp + |b|² Δp²)/(|a + bΔp| + |a|) so it keeps full relative
// accuracy for small Δp. κ = 0 gives μΔp exactly (b = 0). It is what the Dieterich rate and
// any other ΔCFF history use on the path. Accuracy: a few ulp of the largest term.
struct CoulombPathChange {
  double tau0 = 0.0;         // |a|, Pa
  double ab = 0.0;           // a·b, Pa
  double bb = 0.0;           // |b|², 1
  double normal_rate = 0.0;  // μ (1 − κ sin²δ), 1
  double at(double dp) const;
};
CoulombPathChange coulomb_path_change(const Eigen::Matrix3d& stress, const Eigen::Vector3d& n, double mu, double kappa);

// The pore-pressure increase at which the least effective principal stress of an Andersonian
// state reaches zero, with the horizontal stresses rising by κ Δp (κ = 0: no stress path):
// min(Sv − p0, (Shmin − p0)/(1 − κ)). Beyond it tensile opening (hydraulic fracturing) comes
// before shear failure and the Coulomb screen no longer applies (Hubbert & Willis 1957; common
// practice). Exact; always finite (Sv − p0 bounds it).
double opening_pressure(const AndersonianStress& s, double kappa);

// CFF recomputed from scratch after a pressure change Δp with the stress S + ΔS(κ, Δp) and
// pressure p0 + Δp (the check that Δp_crit is a root).
double coulomb_failure_function_after(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n,
                                      const Friction& f, double kappa, double dp);

}  // namespace slipscreen::geomech
