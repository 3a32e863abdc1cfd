#pragma once
// Probabilistic screen: the probability that each fault segment has slipped by each output
// time, from Monte Carlo (or Latin hypercube) realizations of stress, friction, fault
// orientation, hydrogeology and injection rates.
//
// Method (BRIEF 2.4): realization i draws its inputs from its own stream (seed, i)
// (stats::Sampler); the hydrogeology enters the pore pressure only through D = k/(μ φ c_t) and
// P = μ/(4π k h) (Theis 1935), so the pressure model is prepared once (similarity tables and a
// surrogate in D, pressure_surrogate.hpp) and every realization costs a few small matrix
// products. A segment has slipped by t when max_{t' ≤ t} Δp(t') ≥ Δp_crit (Coulomb criterion,
// geomech::critical_pressure_grid), tracked on the caller's tracking grid.
// P(slip by t) = slipped / N with its 95% Wilson (1927) score interval (stats::wilson_interval).
// Realizations whose fault is critical before any injection (Δp_crit ≤ 0) are counted apart
// and never folded into the injection-induced probability.
//
// Every accumulator is mergeable (slip counts, quantile sketches), so realizations or segments
// can be split across processes and merged to the single-process result. The well attribution
// of the median Δp (MedianAttribution) is the exception: it merges across segment splits only.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/horizontal_stress.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/probabilistic/slip_tracker.hpp"
#include "core/stats/distribution.hpp"
#include "core/stats/quantile_sketch.hpp"
#include "core/stats/sampler.hpp"
#include "core/stats/slip_counts.hpp"

namespace slipscreen::probabilistic {

enum class HorizontalStressModel { gradients, uniaxial_strain, a_phi };

// Uncertain inputs. Each is a distribution (stats::Distribution::fixed for a known value).
struct UncertainModel {
  // Formation: either (k, h, φ, c_t, μ) or (T, S) with fluid density.
  bool from_transmissivity = false;
  stats::Distribution permeability = stats::Distribution::fixed(1e-14);
  stats::Distribution thickness = stats::Distribution::fixed(100.0);
  stats::Distribution porosity = stats::Distribution::fixed(0.1);
  stats::Distribution total_compressibility = stats::Distribution::fixed(1e-9);
  stats::Distribution viscosity = stats::Distribution::fixed(5e-4);
  stats::Distribution transmissivity = stats::Distribution::fixed(1e-5);
  stats::Distribution storativity = stats::Distribution::fixed(1e-5);
  double fluid_density = 1000.0;  // kg/m³ (T, S form)

  // Stress at the reference depth.
  double depth = 3000.0;  // m
  HorizontalStressModel model = HorizontalStressModel::gradients;
  stats::Distribution vertical_gradient = stats::Distribution::fixed(25e3);        // Pa/m
  stats::Distribution pore_pressure_gradient = stats::Distribution::fixed(9.8e3);  // Pa/m
  stats::Distribution shmax_azimuth = stats::Distribution::fixed(0.0);             // rad
  stats::Distribution shmax_gradient = stats::Distribution::fixed(30e3);           // Pa/m (gradients)
  stats::Distribution shmin_gradient = stats::Distribution::fixed(18e3);           // Pa/m (gradients)
  stats::Distribution a_phi = stats::Distribution::fixed(1.5);                      // (a_phi)
  stats::Distribution poisson_ratio = stats::Distribution::fixed(0.25);             // (uniaxial_strain)
  geomech::UniaxialStrainModel uniaxial;  // fixed tectonic terms and Biot (uniaxial_strain)
  // Friction at which A_φ magnitudes are at frictional equilibrium; empty: the sampled friction.
  std::optional<double> equilibrium_friction;
  double stress_path_kappa = 0.0;  // α(1−2ν)/(1−ν) of the poroelastic path; 0 = none

  // Faults.
  stats::Distribution friction = stats::Distribution::fixed(0.6);
  stats::Distribution cohesion = stats::Distribution::fixed(0.0);  // Pa
  std::vector<std::string> fault_ids;                              // names, per fault index
  std::vector<std::optional<stats::Distribution>> fault_friction;  // per fault index; empty = global
  // Perturbations around the mapped orientation, drawn per fault and realization (rad).
  stats::Distribution strike_perturbation = stats::Distribution::fixed(0.0);
  stats::Distribution dip_perturbation = stats::Distribution::fixed(0.0);

  // Injection rates.
  stats::Distribution rate_factor = stats::Distribution::fixed(1.0);  // all wells
  std::vector<std::optional<stats::Distribution>> well_rate_factor;  // per well; multiplies the above
};

struct WellInput {
  std::string id;
  double x = 0.0, y = 0.0, radius = 0.1;  // working CRS, m
  hydro::RateSteps steps;
};

struct SegmentInput {
  std::vector<hydro::ObservationPoint> check_points;
  double strike = 0.0, dip = 0.0;  // rad, mapped orientation (right-hand rule)
  std::size_t fault = 0;           // index of the parent fault
};

struct RunSettings {
  std::uint64_t seed = 1;
  std::uint64_t realizations = 1000;
  stats::SamplingMethod method = stats::SamplingMethod::latin_hypercube;
  std::vector<double> tracking_times;    // s, increasing, every output time included
  std::vector<std::size_t> output_index; // tracking index of each output time
  std::vector<hydro::Boundary> boundaries;
  // Chebyshev nodes in ln D; 0: automatic, 8 per e-fold of D_max/D_min (at least 4, at most 64).
  std::size_t surrogate_nodes = 0;
  // Probability maps for unmapped faults: pixel centres (working CRS). For each pixel, the
  // probability that a fault of the most dangerous orientation (minimum Δp_crit over a 5° grid
  // of strikes and dips, global friction) — and optionally of a given orientation — has slipped.
  std::vector<hydro::ObservationPoint> map_points;
  std::optional<double> map_strike, map_dip;  // rad
  // Audit: keep the fast path's per-realization results for these realizations (by index) and
  // segments, so that they can be checked against the plain method (plain_slip_check).
  std::vector<std::uint64_t> audit_realizations;
  std::vector<std::size_t> audit_segments;
  // Well attribution of every segment's median Δp at every output time (SegmentResult::median).
  bool attribute_median = true;
};

// One audited (realization, segment) pair: the realization's pressure inputs, the segment's
// Δp_crit and what the fast path found.
struct AuditEntry {
  std::uint64_t realization = 0;
  std::size_t segment = 0;
  double diffusivity = 0.0, prefactor = 0.0;  // m²/s, Pa per m³/s
  std::vector<double> group_scale;            // rate factor per rate group
  std::vector<std::size_t> well_group;        // rate group of each well
  double dp_crit = 0.0;                       // Pa
  int first_crossing = -1;                    // tracking index, fast path
  std::vector<double> dp_at_output;           // Pa, fast path
};

// Well attribution of a segment's median Δp at one output time. The median realization is the
// valid realization of rank ⌊(n − 1)/2⌋ (0-based, the sketches' rank convention) when the n
// valid realizations are ordered by their Δp at the segment at that time (fast path, max over
// check points), ties by realization index. Its inputs are reproducible from its stream
// (seed, realization). At the check point holding that maximum (the first one on ties), each
// well's contribution is evaluated from its similarity table (every source of the well, with
// its sign, the realization's D, μ/(4π k h) and rate factors). Σ well_dp equals `dp` to the
// surrogate's accuracy (max_relative_error()); shares are well_dp / Σ well_dp.
struct MedianAttribution {
  std::uint64_t realization = 0;  // realization index i (not the rank among valid ones)
  double dp = 0.0;                // Pa, the median realization's Δp at the segment (fast path)
  std::size_t check_point = 0;    // index in the segment's check points (holding the maximum)
  std::vector<double> well_dp;    // Pa, per well
  // Well w's share of Σ well_dp (0 when the sum is ≤ 0).
  double share(std::size_t w) const;
};

struct SegmentResult {
  std::vector<std::uint64_t> slipped_by;  // per output time: injection-induced slips by then
  std::uint64_t already_critical = 0;     // realizations with Δp_crit ≤ 0 before injection
  std::uint64_t never_critical = 0;       // realizations where CFF cannot reach 0 (Δp_crit = +∞)
  stats::QuantileSketch dp_crit;          // finite Δp_crit values (Pa)
  std::vector<stats::QuantileSketch> dp;  // per output time: Δp (Pa), max over check points
  std::vector<double> sensitivity;        // Spearman ρ of each input with the final slip margin
  // Per output time: the well attribution of the median Δp (empty unless RunSettings::
  // attribute_median). Not a mergeable accumulator: it needs every realization's Δp at the
  // segment, so it merges across segment splits only (realization splits must gather Δp first).
  std::vector<MedianAttribution> median;
};

struct ProbabilisticResult {
  std::vector<std::string> input_names;   // sampled inputs, then "strike perturbation", "dip perturbation"
  std::uint64_t realizations = 0;         // valid realizations (denominator of every probability)
  std::uint64_t rejected = 0;             // realizations whose sampled stress was not physical
  std::uint64_t beyond_frictional_limit = 0;  // valid realizations beyond (S1−p)/(S3−p) ≤ [√(μ²+1)+μ]²
  std::vector<SegmentResult> segments;
  // Maps: injection-induced slip counts [pixel * outputs + t]; realizations already critical
  // before injection (the same for every pixel: the stress is uniform) are counted apart.
  std::vector<std::uint64_t> map_dangerous, map_oriented;
  std::uint64_t map_dangerous_already_critical = 0, map_oriented_already_critical = 0;
  double diffusivity_min = 0.0, diffusivity_max = 0.0;  // m²/s over the realizations
  double surrogate_error = 0.0;           // estimated relative interpolation error in D
  stats::SamplerDescriptor sampler;
  std::vector<AuditEntry> audit;          // valid audited pairs, in (realization, segment) order
};

// The plain method for one audited pair: every E1 term of every well, image and rate step is
// evaluated directly at every tracking time (no tables, no surrogate). Fills `first_crossing`
// and `dp_at_output` of the returned copy. Used by the benchmark and the tests to bound the
// fast path's error.
AuditEntry plain_slip_check(const AuditEntry& fast, const std::vector<WellInput>& wells,
                            const std::vector<SegmentInput>& segments, const RunSettings& settings);

// Runs the probabilistic screen. Throws InputError for inconsistent inputs (naming the field).
ProbabilisticResult run_probabilistic(const UncertainModel& model, const std::vector<WellInput>& wells,
                                      const std::vector<SegmentInput>& segments, const RunSettings& settings);

// The names of the sampled inputs in sampler order (for tables and the manifest).
std::vector<std::string> sampled_input_names(const UncertainModel& model, const std::vector<WellInput>& wells,
                                             std::size_t fault_count);

}  // namespace slipscreen::probabilistic
