#pragma once
// Which fault orientation is closest to failure in a stress state: Δp_crit tabulated over a
// strike–dip grid, and the most dangerous orientation (minimum Δp_crit).
//
// Source: the Coulomb criterion and Δp_crit of coulomb.hpp; the optimal plane contains S2 and
// lies at ½·atan(1/μ) from S1 (Jaeger, Cook & Zimmerman 2007 ch. 4).
//
// Symbol table (code -> literature): S1 ≥ S2 ≥ S3 principal stresses (Pa); centre, radius =
// σm = (S1 + S3)/2, r = (S1 − S3)/2 of the outer Mohr circle; mu μ, cohesion c, kappa κ (the
// stress-path coefficient of coulomb.hpp); x = Δp along the path; psi ψ = 45° + ½·atan μ, the
// angle of the optimal normal from S1.
//
// The grid's normals are computed once (OrientationGrid) and every further stress state costs
// one pass of the batched kernel, so a table for thousands of Monte Carlo states is cheap.
#include <Eigen/Dense>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/geomech/critical_pressure_batch.hpp"
#include "core/geomech/fault_plane.hpp"

namespace slipscreen::geomech {

struct OrientationGrid {
  std::vector<double> strikes;  // rad, [0, 2π) in equal steps
  std::vector<double> dips;     // rad, [0, π/2] in equal steps, both ends included
  PlaneBatch planes;            // index = i_strike · dips.size() + i_dip
  std::size_t index(std::size_t i_strike, std::size_t i_dip) const { return i_strike * dips.size() + i_dip; }
};

// Steps in rad: 0 < step ≤ π/2 (InputError otherwise). The strike axis has round(2π/step)
// values, the dip axis round(π/2 / step) + 1 values.
OrientationGrid make_orientation_grid(double strike_step, double dip_step);

// Δp_crit (Pa) at every grid node for each state: out[s · grid size + node].
std::vector<double> tabulate_critical_pressure(const OrientationGrid& grid, const StressBatch& states);

struct DangerousOrientation {
  FaultPlane plane;
  double dp_crit;  // Pa
};

// The minimum of Δp_crit over all strikes and dips and the plane that holds it.
//   κ = 0: the closed form. The most critical plane contains S2 and lies at ½·atan(1/μ) from S1
//     (Jaeger, Cook & Zimmerman 2007 ch. 4), from the principal axes of `stress`.
//   κ > 0: along the path the stress is S + ΔS(κ, x); the largest CFF over all planes at x is
//     r(x)√(1+μ²) − μ(σm(x) − p0 − x) − c on the outer Mohr circle (S1 and S3 of S + ΔS), and
//     its crossing x*, found by bisection to rounding, is the minimum Δp_crit, held by the
//     closed-form plane of S + ΔS(κ, x*). This is exact when the state is below failure on every
//     plane (x* > 0) and, for an already critical state, when CFF rises with pressure on every
//     plane (μ(1 − κ/2) ≥ (κ/2)√(1+μ²), e.g. κ ≤ 0.68 for μ = 0.6). Otherwise: the lower of that
//     plane and a grid search (2° grid, then four 41 × 41 windows down to 0.0002° steps).
// The reported Δp_crit is the reported plane's own value (critical_pressure_poroelastic).
// Accuracy: Δp_crit to ~1e-15 × max|S| where exact (the tests find ≤ 3e-16 × max|S| against
// the closed form and ≤ 0.01 Pa against scipy on the path, for A_φ across [0, 3] including
// exactly equal principal stresses, where any plane of the degenerate family is reported). The
// grid-search fallback, already critical states with κ above that bound, is never above a dense
// grid; measured without a path it is good to ~1e-13 × max|S| but misses by up to ~1e-5 ×
// max|S| within ~1e-3 of A_φ = 1 or 2 (nearly equal principal stresses). The conjugate
// plane, equally critical, is not reported. InputError for non-finite stresses or pore
// pressure, μ ≤ 0, c < 0 or κ outside [0, 1].
DangerousOrientation most_dangerous_orientation(const Eigen::Matrix3d& stress, double p0, const Friction& f,
                                                double kappa = 0.0);

}  // namespace slipscreen::geomech
