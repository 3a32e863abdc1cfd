#pragma once
// The inputs of the probabilistic screen (docs/uncertainty.md): the uncertain model (every
// uncertain quantity as a distribution), the wells with their rate steps, the fault segments
// with their check points, the run settings, and the ordered list of the sampled inputs.
//
// Sampler order (the column order of every sensitivity table and of the manifest): formation
// (k, h, φ, c_t, μ — or T, S), vertical and pore-pressure gradients, SHmax azimuth, the
// horizontal-stress inputs of the chosen model, with the poroelastic path its Poisson's ratio
// (unless the model already has it) and Biot coefficient, friction, cohesion, per-fault friction,
// rate factor, per-well rate factors, then (seismicity likelihood only) Aσ and the background
// rate per km. The orientation perturbations are not sampled by the
// stats::Sampler but drawn from each realization's auxiliary stream (per fault), so they are
// listed last by sampled_input_names() only.
#include <cstdint>
#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/horizontal_stress.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/pressure_surrogate.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/seismo/point_process.hpp"
#include "core/stats/distribution.hpp"
#include "core/stats/sampler.hpp"

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
  // The poroelastic path from each realization's sampled α (biot) and ν (poisson_ratio):
  // κ = α(1−2ν)/(1−ν) (Engelder & Fischer 1994; geomech::stress_path_coefficient), in place of
  // the fixed stress_path_kappa. With the uniaxial_strain model the same α and ν set Shmin.
  bool poroelastic_path = false;
  stats::Distribution biot = stats::Distribution::fixed(1.0);  // α (poroelastic_path)

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

  // Seismicity likelihood (RunSettings::seismicity; docs/conditioning.md): the Dieterich (1994)
  // Aσ and the background rate per km of fault trace, sampled last (only then: runs without it
  // keep their draws).
  bool seismicity = false;
  stats::Distribution a_sigma = stats::Distribution::fixed(5e4);                    // Pa
  stats::Distribution background_rate_per_km = stats::Distribution::fixed(6e-11);   // events/s per km of trace
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

// A group of wells whose rates are scaled together (the allowable rate, group_factors.hpp): the
// run's wells as split for it (a well scaled only after a date becomes two wells at the same
// place, the part before the date and the part after), each with the run's well whose sampled
// rate factor it shares, and whether it is in the group.
struct GroupSplit {
  std::vector<WellInput> wells;
  std::vector<std::size_t> origin;   // per split well: index into the run's wells
  std::vector<char> in_group;        // per split well
  std::size_t horizon = 0;           // tracking index of T (P(slip by T | f))
  double f_max = 10.0;               // factors resolved exactly up to here
  std::vector<double> thresholds;    // the run's thresholds on P(slip), and the normal quantile z
  double z = 1.959963984540054;      // of its intervals: what the allowable factors ask (group_factors.hpp)
  double factor = 1.0;               // a what-if variant's factor on the group's rates
};

// A pore-pressure observation the run is conditioned on (conditioning.hpp, docs/conditioning.md).
struct PressureObservation {
  double x = 0.0, y = 0.0;  // working CRS, m
  double time = 0.0;        // s since 1970-01-01
  double observed = 0.0;    // Δp, Pa
  double sigma = 1.0;       // Pa: √(sd² + model_error²)
};

// The earthquakes the run is conditioned on (seismicity_likelihood.hpp, docs/conditioning.md):
// events at or above Mc in the window [t0, t1], each assigned to a segment or to the background
// pool, with what the Dieterich (1994) rate of each segment needs beside the realization's Aσ,
// background rate and Coulomb history.
struct SeismicityData {
  std::vector<seismo::AssignedEvent> events;  // segment index or seismo::kBackgroundPool
  double t0 = 0.0, t1 = 0.0;                  // s since 1970: the window (from the first injection)
  double injection_start = 0.0;               // s: the first injection; ΔCFF = 0 before it
  std::vector<double> segment_length;         // m, per segment (background rate = rate per km × length)
  double stressing_rate = 0.0;                // τ̇_r, Pa/s (fixed: Aσ / t_a of [catalog.rate_state])
  double pool_rate = 0.0;                     // events/s of the background pool (the same in every realization)
};

struct RunSettings {
  std::uint64_t seed = 1;
  std::uint64_t realizations = 1000;
  stats::SamplingMethod method = stats::SamplingMethod::latin_hypercube;
  std::vector<double> tracking_times;    // s, increasing, every output time included
  std::vector<std::size_t> output_index; // tracking index of each output time
  std::vector<hydro::Boundary> boundaries;
  // Leaky formation (hydro/hantush.hpp): c_L = D/B² [1/s], the same in every realization (only
  // the permeability or transmissivity may then be uncertain: B² ∝ k, D ∝ k). 0: Theis.
  double leakage_rate = 0.0;
  // Chebyshev nodes in ln D; 0: automatic, 8 per e-fold of D_max/D_min (at least 4, at most 64).
  std::size_t surrogate_nodes = 0;
  // Bytes of similarity tables held at a time while the surrogates are built (blocks of wells,
  // hydro::TableBuilder::blocks); the result does not depend on it.
  double table_block_bytes = hydro::kTableBlockBytes;
  // Bytes of the segments' surrogate a part of a split run holds at a time: beyond it, its
  // segments are tracked in chunks, the tables built again for each (docs/cluster.md, memory per
  // rank); the result does not depend on it. Not with what-if variants (one chunk then).
  double surrogate_chunk_bytes = 1024.0 * 1024.0 * 1024.0;
  // Segments a part of a split run sends to part 0 per round of the merge, so that neither side
  // holds more than a round's encoded block beside the results (a statewide part's segments
  // encode to about 1 GB, docs/cluster.md); the result does not depend on it.
  std::size_t merge_segments = 1024;
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
  // The allowable rate of a group of wells (ProbabilisticResult::capacity), when given.
  std::optional<GroupSplit> capacity;
  // What-if variants (ProbabilisticResult::what_if): each group's rates times its factor.
  std::vector<GroupSplit> what_if;
  // Observed pore pressures: when given, the realizations are weighted by their likelihood
  // (ProbabilisticResult::conditioning, SegmentResult::conditioned).
  std::vector<PressureObservation> observations;
  // Observed earthquakes: their Poisson point-process log-likelihood is added to the pressures'.
  std::optional<SeismicityData> seismicity;
};

// The sampled inputs in sampler order; each slot remembers where a model input sits.
struct InputList {
  static constexpr std::size_t npos = std::numeric_limits<std::size_t>::max();
  std::vector<stats::UncertainInput> inputs;
  std::size_t k = 0, h = 0, phi = 0, ct = 0, mu_f = 0, t = 0, s = 0;
  std::size_t sv_grad = 0, pp_grad = 0, azimuth = 0, shmax_g = 0, shmin_g = 0, aphi = 0, poisson = 0;
  std::size_t biot = npos;  // poroelastic path only
  std::size_t friction = 0, cohesion = 0, rate = 0;
  std::vector<std::size_t> fault_friction;  // per fault, npos when global
  std::vector<std::size_t> well_rate;       // per well, npos when none
  std::size_t a_sigma = npos, background_rate = npos;  // UncertainModel::seismicity only

  std::size_t add(std::string name, const stats::Distribution& d) {
    inputs.push_back({std::move(name), d});
    return inputs.size() - 1;
  }
};

// The sampled inputs of `model` for these wells and `fault_count` faults, in sampler order.
InputList make_inputs(const UncertainModel& model, const std::vector<WellInput>& wells, std::size_t fault_count);

// The names of the sampled inputs in sampler order, then "strike_perturbation" and
// "dip_perturbation" (for tables and the manifest).
std::vector<std::string> sampled_input_names(const UncertainModel& model, const std::vector<WellInput>& wells,
                                             std::size_t fault_count);

}  // namespace slipscreen::probabilistic
