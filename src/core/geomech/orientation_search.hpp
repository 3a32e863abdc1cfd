#pragma once
// Which fault orientation is closest to failure in a stress state: Δp_crit tabulated over a
// strike–dip grid, and the most dangerous orientation (minimum Δp_crit).
//
// Source: the Coulomb criterion and Δp_crit of coulomb.hpp; the optimal plane contains S2 and
// lies at ½·atan(1/μ) from S1 (Jaeger, Cook & Zimmerman 2007 ch. 4), which the tests use to
// check the search.
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

// The minimum of Δp_crit over all strikes and dips: a 2° grid search, then four successively
// finer 41 × 41 windows (steps 0.2°, 0.02°, 0.002°, 0.0002°) around the best node. Accuracy:
// the orientation to ~0.001° and Δp_crit to ≲ 1e-6 × max|S| (the minimum is smooth, so the
// error is quadratic in the angle error). A grid search: a second, equally low minimum (the
// conjugate plane) is not reported.
// With κ > 0 the poroelastic path is used.
DangerousOrientation most_dangerous_orientation(const Eigen::Matrix3d& stress, double p0, const Friction& f,
                                                double kappa = 0.0);

}  // namespace slipscreen::geomech
