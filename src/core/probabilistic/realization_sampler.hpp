#pragma once
// Realizations of the probabilistic screen: for realization i, its sampled inputs, its fault
// orientation perturbations, its hydrogeology and its Coulomb threshold on every segment.
//
// Sources (one line each, every formula called from the file that holds it):
//   D = k/(μ φ c_t), P = μ/(4π k h); or D = T/S, P = ρ g/(4π T)  Theis (1935) — hydro::theis_parameters
//   (S1 − p)/(S3 − p) ≤ [√(μ²+1) + μ]²            Jaeger & Cook (1979); Zoback (2007) — geomech::frictional_limit_ratio
//   Δp_crit = (σn − p0) − (τ − c)/μ                 Coulomb criterion — geomech::critical_pressure_paired
//   horizontal stresses: gradients, uniaxial strain, A_φ (Simpson 1997) — geomech/horizontal_stress.hpp
//   poroelastic path κ = α(1−2ν)/(1−ν), Δp_crit along it exact  Engelder & Fischer (1994) —
//     geomech::stress_path_coefficient, geomech::critical_pressure_paired (UncertainModel::poroelastic_path)
//
// Symbols (code -> literature): diffusivity D [m²/s], prefactor P = μ/(4π k h) [Pa per m³/s],
// dp_crit Δp_crit [Pa], mu_global μ (the sampled global friction), s1, s3 S1, S3 [Pa],
// pore_pressure p0 [Pa], perturbation (Δstrike, Δdip) [rad].
//
// Determinism (docs/uncertainty.md): realization i draws its inputs from the stats::Sampler stream
// (seed, i) and its orientation perturbations (per fault: strike, then dip) from its auxiliary
// stream, so every realization is independent of the others, of the thread count and of the
// order of evaluation.
//
// Validity: a realization is rejected (not used, counted apart) when its hydrogeology is not a
// physical formation (hydro::theis_parameters refuses it: a value not finite and positive,
// φ > 1), its global friction is not positive or its cohesion negative, or its stress state is
// not physical (geomech::check: Shmin ≤ SHmax, stresses above pore pressure), or, on the
// poroelastic path, its α is outside (0, 1] or its ν outside [0, 0.5). A valid
// realization whose effective-stress ratio exceeds the frictional limit is used and counted.
//
// Accuracy: D and P exact to rounding (hydro/theis.hpp); Δp_crit stored in single precision
// (relative rounding 6e-8), as the slip tracker compares it in single precision.
#include <Eigen/Dense>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <utility>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/stats/sampler.hpp"

namespace slipscreen::probabilistic {

// The valid realizations, in increasing index order, column c holding realization keep[c].
struct SampledRealizations {
  std::uint64_t drawn = 0;                    // realizations drawn (valid or not)
  std::uint64_t beyond_frictional_limit = 0;  // valid realizations beyond the frictional limit
  std::vector<Eigen::Index> keep;             // indices of the valid realizations, increasing
  std::vector<double> diffusivity;            // D per valid realization, m²/s
  std::vector<double> prefactor;              // μ/(4π k h) per valid realization, Pa per m³/s
  Eigen::MatrixXd inputs;                     // sampled inputs × valid realizations (sampler order)
  Eigen::MatrixXf perturbation;               // (2 · faults) × valid: rows 2f, 2f+1 = Δstrike, Δdip of fault f (rad)
  Eigen::MatrixXf dp_crit;                    // segments × valid: Δp_crit (Pa; +inf: never critical)
  // 2 × valid: row 0 the most dangerous orientation (minimum Δp_crit over a 5° grid of strikes
  // and dips, global friction), row 1 the given map orientation; +inf where not asked for.
  Eigen::MatrixXf map_dp_crit;
  // With RunSettings::seismicity: ΔCFF(Δp) of every segment along its stress path (its perturbed
  // plane, its fault's friction, the realization's κ; geomech::coulomb_path_change), at
  // [c · segments + s] for valid realization c; empty otherwise.
  std::vector<geomech::CoulombPathChange> coulomb_path;
  stats::SamplerDescriptor sampler;
};

// Draws every realization (OpenMP over realizations) and keeps the valid ones. The maps' Δp_crit
// is computed when settings.map_points is not empty (row 1 also needs map_strike and map_dip).
// With `only_segments` [first, second) only those segments' Δp_crit rows are computed (a part
// of a split run tracks only its own segments, docs/cluster.md); the other rows hold NaN, and
// the draws, validity and every other matrix are the whole run's. Refused with the seismicity
// likelihood, which reads every segment.
// Throws InputError when no realization is valid, and rethrows the first failure of any draw.
SampledRealizations sample_realizations(const UncertainModel& model, const InputList& list,
                                        const std::vector<SegmentInput>& segments, std::size_t fault_count,
                                        const RunSettings& settings, const stats::RealizationCount& count,
                                        std::optional<std::pair<std::size_t, std::size_t>> only_segments = std::nullopt);

// Realization i's Δp_crit on every segment in double precision, before the single-precision
// store of sample_realizations (same draw, same kernel); empty when the realization is not
// valid. For audits and tests (one realization; it allocates the job's matrices for `count`).
std::vector<double> realization_critical_pressures(const UncertainModel& model, const InputList& list,
                                                   const std::vector<SegmentInput>& segments, std::size_t fault_count,
                                                   const RunSettings& settings, const stats::RealizationCount& count,
                                                   std::uint64_t i);

}  // namespace slipscreen::probabilistic
