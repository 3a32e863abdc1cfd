#pragma once
// Stress resolved on a fault plane: traction, normal and shear stress, the direction of
// maximum resolved shear (rake) and the slip sense it implies, slip and dilation tendency.
//
// Sources:
//   t = S n, σn = nᵀ S n, τ = |t − σn n|                  Jaeger, Cook & Zimmerman (2007) ch. 2
//   slip direction ∥ maximum resolved shear stress        Wallace (1951); Bott (1959)
//   rake λ from the strike direction, in the fault plane, positive for a reverse (hanging wall
//   up) component: u = cosλ s − sinλ d                  Aki & Richards (1980), Quantitative
//                                                         Seismology, §4.2
//   slip tendency Ts = τ / (σn − p)                        Morris, Ferrill & Henderson (1996), Geology 24(3)
//   dilation tendency Td = (S1 − σn)/(S1 − S3)             Ferrill et al. (1999), GSA Today 9(5)
//
// Symbol table (code -> literature):
//   normal_stress            σn (total)         Pa
//   effective_normal_stress  σn' = σn − p       Pa
//   shear_stress             τ                  Pa
//   slip_direction           u (hanging wall relative to footwall, unit)
//   rake                     λ                  rad, (−π, π]
//   slip_tendency            Ts
//   dilation_tendency        Td
//
// Signs: compression positive. The hanging wall is pushed along the shear part of S n_d where
// n_d = −n is the normal pointing into the footwall; with compression positive that is the
// direction the footwall's traction drags the hanging wall.
#include <Eigen/Dense>
#include <limits>

#include "core/geomech/fault_plane.hpp"

namespace slipscreen::geomech {

// Rake bands (this project's convention, stated in docs/geomechanics.md), λ in degrees:
//   strike-slip left-lateral |λ| ≤ 22.5, right-lateral |λ| ≥ 157.5,
//   reverse 67.5 ≤ λ ≤ 112.5, normal −112.5 ≤ λ ≤ −67.5,
//   oblique-reverse 22.5 < λ < 67.5 or 112.5 < λ < 157.5, oblique-normal the negatives,
//   none when the resolved shear stress is zero (below 1e-12 of the largest stress).
enum class SlipSense { none, normal, reverse, left_lateral, right_lateral, oblique_normal, oblique_reverse };
const char* to_string(SlipSense s);
SlipSense slip_sense_from_rake(double rake);

struct NormalShear {
  double normal_stress;  // σn, Pa
  double shear_stress;   // τ ≥ 0, Pa
};

// σn and τ on the plane with unit normal n (either sign). Exact up to rounding:
// absolute error ≲ 1e-15 × max|S|.
NormalShear resolve_normal(const Eigen::Matrix3d& stress, const Eigen::Vector3d& n);

struct ResolvedStress {
  Eigen::Vector3d traction;        // S n, Pa (n the upward normal)
  double normal_stress;            // σn, Pa
  double shear_stress;             // τ, Pa
  double effective_normal_stress;  // σn − p, Pa
  Eigen::Vector3d slip_direction;  // unit; zero when τ = 0
  double rake;                     // rad in (−π, π]; NaN when τ = 0
  SlipSense sense;
  double slip_tendency;            // τ/(σn − p)
  double dilation_tendency;        // (S1 − σn)/(S1 − S3); NaN for an isotropic stress
};

// Everything above for one plane. Domain: symmetric stress, σn > p (InputError("pore
// pressure", ...) otherwise: the plane would be in effective tension).
ResolvedStress resolve(const Eigen::Matrix3d& stress, double pore_pressure, const FaultPlane& plane);

// Morris et al. (1996). Domain σn > p.
inline double slip_tendency(double tau, double normal_stress, double pore_pressure) {
  return tau / (normal_stress - pore_pressure);
}

// Ferrill et al. (1999). Domain S1 > S3 (NaN otherwise).
inline double dilation_tendency(double normal_stress, double s1, double s3) {
  return s1 > s3 ? (s1 - normal_stress) / (s1 - s3) : std::numeric_limits<double>::quiet_NaN();
}

}  // namespace slipscreen::geomech
