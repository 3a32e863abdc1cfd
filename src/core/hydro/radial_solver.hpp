#pragma once
// Numerical radial-flow solver: the independent check of the analytic (Theis) engine, and the
// model for what the closed form cannot do — radially varying permeability (composite zones)
// and a closed or constant-pressure outer radius.
//
// Equation (slightly compressible single-phase radial flow in a confined layer of thickness h,
// e.g. Matthews & Russell 1967, SPE Monograph 1, eq. 2.1; Earlougher 1977, SPE Monograph 5):
//   φ c_t ∂p/∂t = (1/r) ∂/∂r ( r (k/μ) ∂p/∂r ),   r_w < r < r_e,
//   2π r_w h (k/μ) (−∂p/∂r)|_{r_w} = q(t)  (injection positive), Δp(r, 0) = 0,
// outer boundary: ∂p/∂r = 0 (closed), Δp = 0 (constant pressure), or far enough away that the
// disturbance never reaches it (infinite-acting).
//
// Method: finite volumes on a log-spaced radial grid (faces geometric between r_w and r_e, with
// faces exactly on every zone boundary; the node of each cell at the geometric mean of its
// faces). Inter-cell transmissibility is the series (harmonic-in-ln r) form of steady radial
// flow, 2π h / (μ [ln(f/r_i)/k_i + ln(r_{i+1}/f)/k_{i+1}]), exact for a steady log profile and for
// a permeability jump at a face. Implicit in time: variable-step BDF2 (backward Euler for the
// first step after each rate change), one tridiagonal (Thomas) solve per step, geometric time
// steps (ratio `time_step_growth`) restarted at every rate change, steps clipped to land exactly
// on rate changes and output times. Both schemes conserve mass exactly: Σ φ c_t V_i Δp_i equals
// the injected volume to rounding. Output between nodes: cubic interpolation in ln r inside a
// zone, the steady radial profile next to the well face, zone faces and r_e.
//
// Symbol table (code -> paper):
//   well_radius r_w, thickness h, viscosity μ, permeability k, storage φ·c_t, rate q,
//   outer_radius (of a zone) r_j / r_e, radii r, times t, mean_change p̄ − p_i.
//
// Accuracy (measured in tests/core/hydro/radial_solver_test.cpp with the defaults,
// 100 cells per decade of radius and time-step ratio 1.05; second order in both the log-spacing
// and the time step): against Theis (1935) for a homogeneous infinite-acting layer, at
// t D / r_w² ≥ 1e5 (where the line source and the finite-radius well agree),
// |Δp − Δp_Theis| ≤ 3e-4 × Δp_Theis where the Theis argument u = r²/(4Dt) ≤ 1 and ≤ 2e-3 where
// u ≤ 5; ahead of the front (u ≈ 6 and beyond, Δp below 0.1 % of the well-face value) the
// relative error grows (2 % at u = 6). Rate steps add no error of their own beyond a restart
// of the step sequence. Steady states (Thiem, composite series form) are reproduced to ≤ 1e-6
// relative and the pseudo-steady state of a closed annulus to ≤ 1e-4; the storage-weighted mean
// Δp of a closed annulus equals the material balance to rounding (≤ 1e-10 relative).
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::hydro {

// One radial zone of uniform properties. Zones are listed innermost first; zone j spans from the
// previous zone's outer radius (r_w for the first zone) to its own outer radius.
struct RadialZone {
  double outer_radius;  // m; +infinity for the outermost zone of an infinite-acting layer
  double permeability;  // k, m²
  double storage;       // φ·c_t, 1/Pa (porosity times total compressibility)
};

enum class OuterBoundary {
  infinite,           // infinite-acting: the solver places a closed radius beyond any disturbance
  closed,             // no flow across r_e (∂p/∂r = 0)
  constant_pressure,  // Δp = 0 at r_e (recharge, aquifer support)
};

// Piecewise-constant rate: `rate` from `start` until the next step's start. Before the first
// step the rate is zero; a step to rate 0 is a shut-in.
struct RadialRateStep {
  double start;  // s
  double rate;   // m³/s at reservoir conditions, injection positive
};

struct RadialModel {
  double well_radius = 0.1;   // r_w, m
  double thickness = 10.0;    // h, m
  double viscosity = 1e-3;    // μ, Pa·s
  std::vector<RadialZone> zones;
  OuterBoundary outer = OuterBoundary::infinite;
  std::vector<RadialRateStep> rates;
};

struct RadialSolverOptions {
  double cells_per_decade = 100.0;  // cells per factor 10 in radius (each zone gets ≥ 4 cells)
  double time_step_growth = 1.05;   // ratio between successive time steps after a rate change
  double first_step = 0.0;          // s, first step after each rate change; 0 = automatic
                                    // (1 % of the diffusion time across the first cell)
};

// Δp at every requested radius and time.
struct RadialSolution {
  std::vector<double> radii;        // as requested (before clamping to r_w)
  std::vector<double> times;        // as requested
  std::vector<double> values;       // Δp, Pa, row-major: values[it * radii.size() + ir]
  std::vector<double> mean_change;  // storage-weighted mean Δp over r_w..r_e at each time, Pa
  double outer_radius = 0.0;        // r_e of the grid actually used, m
  std::size_t cells = 0;            // number of radial cells used
  std::size_t steps = 0;            // number of time steps taken

  double at(std::size_t it, std::size_t ir) const { return values[it * radii.size() + ir]; }
};

// Solve the radial-flow problem and return Δp(r, t) at `radii` × `times`.
// Radii below r_w are clamped to r_w (the well face); times before the first rate step give 0.
// Times and radii may be in any order. Between nodes Δp is reconstructed with the steady radial
// profile (linear in ln r within a zone). Throws InputError for non-positive or non-finite
// properties, zone radii not increasing beyond r_w, an outermost zone inconsistent with the
// boundary type, rate steps not strictly increasing in time, non-finite values, radii beyond a
// finite r_e, and options out of range.
RadialSolution solve_radial_flow(const RadialModel& model, std::span<const double> radii,
                                 std::span<const double> times,
                                 const RadialSolverOptions& options = {});

}  // namespace slipscreen::hydro
