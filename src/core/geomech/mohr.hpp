#pragma once
// Mohr-diagram data in effective stress: the three principal circles, each plane's point and
// the Coulomb failure line.
//
// Source: Mohr (1900); Jaeger, Cook & Zimmerman (2007) ch. 2: the circle through Si and Sj has
// centre (Si + Sj)/2 and radius (Si − Sj)/2; every plane's (σn, τ) lies inside the big circle
// and outside the two small ones. Failure line τ = c + μ (σn − p).
//
// Symbol table: s1 ≥ s2 ≥ s3 = S1, S2, S3 (Pa); p = pore pressure; points (σn − p, τ).
#include <Eigen/Dense>
#include <array>
#include <span>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/geomech/fault_plane.hpp"

namespace slipscreen::geomech {

struct MohrCircle {
  double centre;  // effective, Pa
  double radius;  // Pa
};

struct MohrPoint {
  double effective_normal_stress;  // σn − p, Pa
  double shear_stress;             // τ, Pa
};

struct MohrDiagram {
  std::array<MohrCircle, 3> circles;  // (S1, S3), (S1, S2), (S2, S3)
  std::vector<MohrPoint> points;      // one per plane, in order
  double mu;                          // failure line slope
  double cohesion;                    // failure line intercept, Pa
};

// Exact up to the eigen-decomposition (~1e-15 relative). Friction is validated.
MohrDiagram mohr_diagram(const Eigen::Matrix3d& stress, double pore_pressure, std::span<const FaultPlane> planes,
                         const Friction& f);

}  // namespace slipscreen::geomech
