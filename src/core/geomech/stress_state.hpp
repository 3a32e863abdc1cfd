#pragma once
// The in-situ stress state at one depth: magnitudes, the tensor in North-East-Down axes,
// principal stresses and directions, invariants and the faulting regime.
//
// Sources:
//   S = SHmax h1h1ᵀ + Shmin h2h2ᵀ + Sv e3e3ᵀ, h1 = (cosθ, sinθ, 0), h2 = (−sinθ, cosθ, 0)
//                                                 Zoback (2007), Reservoir Geomechanics, ch. 1
//   Faulting regimes by the relative size of Sv   Anderson (1951), The Dynamics of Faulting
//   I1 = tr S, J2 = ½ s:s (s = S − I1/3 I), p = I1/3, q = √(3 J2)
//                                                 Jaeger, Cook & Zimmerman (2007), ch. 2
//
// Symbol table (code -> literature):
//   sv, shmax, shmin   Sv, SHmax, Shmin   Pa (compression positive, absolute)
//   shmax_azimuth      θ                  rad clockwise from north
//   pore_pressure      p0, Pp             Pa
//   tensor             S (3×3, NED)        Pa
//   s1 ≥ s2 ≥ s3       S1, S2, S3         Pa
//   i1, j2             I1, J2             Pa, Pa²
//   mean               p (mean stress)    Pa
//   q                  q (von Mises deviatoric stress)  Pa
#include <Eigen/Dense>

namespace slipscreen::geomech {

// Stress with one principal axis vertical (Anderson 1951), the usual description at depth.
struct AndersonianStress {
  double sv = 0;              // Pa
  double shmax = 0;           // Pa
  double shmin = 0;           // Pa
  double shmax_azimuth = 0;   // rad, clockwise from north
  double pore_pressure = 0;   // Pa
};

struct HorizontalStresses {
  double shmax;  // Pa
  double shmin;  // Pa
};

// Throws InputError naming the field: Shmin > SHmax; any stress not finite; any stress at or
// below the pore pressure; pore pressure negative.
void check(const AndersonianStress& s);

// The tensor in North-East-Down axes (Zoback 2007 ch. 1). Exact up to rounding in cos/sin.
Eigen::Matrix3d stress_tensor_ned(const AndersonianStress& s);

enum class FaultingRegime { normal, strike_slip, reverse };
const char* to_string(FaultingRegime r);

// Anderson (1951): normal if Sv ≥ SHmax, reverse if Shmin ≥ Sv, strike-slip otherwise
// (ties at SHmax = Sv go to normal and at Shmin = Sv to reverse; A_φ is continuous there).
FaultingRegime classify_regime(const AndersonianStress& s);

struct PrincipalStresses {
  Eigen::Vector3d values;      // S1 ≥ S2 ≥ S3, Pa
  Eigen::Matrix3d directions;  // column i: unit axis of S(i+1) in NED, oriented with Down ≥ 0
};

// Eigen::SelfAdjointEigenSolver on the symmetric tensor; values sorted descending. Accuracy:
// eigenvalues to ~1e-15 relative to the largest |S|; directions of a repeated eigenvalue are
// any orthonormal basis of its eigenspace.
PrincipalStresses principal_stresses(const Eigen::Matrix3d& tensor);

// Trend (clockwise from north) and plunge (down from horizontal) of an axis, rad.
struct AxisOrientation {
  double trend;   // [0, 2π)
  double plunge;  // [0, π/2]
};
AxisOrientation axis_orientation(const Eigen::Vector3d& axis);

struct StressInvariants {
  double i1;    // tr S, Pa
  double j2;    // ½ s:s, Pa²
  double mean;  // I1/3, Pa
  double q;     // √(3 J2), Pa
};
// Jaeger, Cook & Zimmerman (2007) ch. 2. Exact up to rounding; independent of the axes.
StressInvariants invariants(const Eigen::Matrix3d& tensor);

// Regime of a general tensor: the principal axis closest to vertical decides (S1 → normal,
// S2 → strike-slip, S3 → reverse); Zoback (2007) ch. 1. The plunge of that axis is returned
// so a caller can say when the stress is far from Andersonian.
struct RegimeOfTensor {
  FaultingRegime regime;
  double vertical_axis_plunge;  // rad, π/2 for an exactly vertical principal axis
};
RegimeOfTensor classify_regime(const Eigen::Matrix3d& tensor);

}  // namespace slipscreen::geomech
