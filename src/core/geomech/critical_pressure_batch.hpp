#pragma once
// Δp_crit for many planes × many stress states at once: the Monte Carlo inner loop.
//
// The formulas are those of coulomb.hpp (Hubbert & Rubey 1959 closed form; the exact
// poroelastic root when κ > 0), evaluated on structure-of-arrays inputs with plain loops the
// compiler vectorises (GCC target_clones: AVX2 where the CPU has it, SSE2 otherwise) and OpenMP
// across states. Each output element is computed by the same arithmetic whatever the thread
// count, so results do not depend on it. They agree with the one-plane general code
// (resolve_normal + critical_pressure) to ~1e-15 × max|S| for the closed form, and with
// critical_pressure_poroelastic to ~1e-12 relative on the path (measured by the benchmark; the
// order of operations differs).
//
// Symbol table: nx, ny, nz = unit normal n (NED); sxx … syz = S (NED, symmetric);
// p0 = pore pressure; mu = μ; cohesion = c; kappa = α(1−2ν)/(1−ν) (0: no stress path).
#include <Eigen/Dense>
#include <cstddef>
#include <span>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/geomech/fault_plane.hpp"

namespace slipscreen::geomech {

// Unit normals, one per plane (structure of arrays).
struct PlaneBatch {
  std::vector<double> nx, ny, nz;
  void push_back(const FaultPlane& p);
  void push_back(const Eigen::Vector3d& unit_normal);
  std::size_t size() const { return nx.size(); }
  void reserve(std::size_t n);
};

// Stress states with their pore pressure, friction and stress-path coefficient.
struct StressBatch {
  std::vector<double> sxx, syy, szz, sxy, sxz, syz, p0, mu, cohesion, kappa;
  // Validates friction (μ > 0, c ≥ 0) and 0 ≤ κ ≤ 1.
  void push_back(const Eigen::Matrix3d& stress, double pore_pressure, const Friction& f, double kappa = 0.0);
  std::size_t size() const { return sxx.size(); }
  void reserve(std::size_t n);
};

// out[s · planes.size() + i] = Δp_crit (Pa) of plane i under state s; +∞ where CFF never
// reaches 0 (see coulomb.hpp). out.size() must be planes.size() · states.size()
// (InputError otherwise).
void critical_pressure_grid(const PlaneBatch& planes, const StressBatch& states, std::span<double> out);

// Element-wise: out[i] = Δp_crit of plane i under state i (per-realization planes and states).
// Parallel across elements but not blocked for vectorisation.
void critical_pressure_paired(const PlaneBatch& planes, const StressBatch& states, std::span<double> out);

}  // namespace slipscreen::geomech
