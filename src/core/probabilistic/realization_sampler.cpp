// Realizations of the probabilistic screen; see realization_sampler.hpp for the sources.
#include "core/probabilistic/realization_sampler.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <optional>
#include <span>
#include <string>
#include <utility>

#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/coulomb.hpp"
#include "core/geomech/critical_pressure_batch.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/frictional_limit.hpp"
#include "core/geomech/orientation_search.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/hydro/theis.hpp"
#include "core/stats/random_stream.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {

struct Draw {
  bool valid = false;
  bool beyond_limit = false;
  double diffusivity = 0.0, prefactor = 0.0;
};

// Everything one realization reads, and the columns it writes (its own column only).
struct SamplingJob {
  const UncertainModel& model;
  const InputList& list;
  const std::vector<SegmentInput>& segments;
  const RunSettings& settings;
  const stats::Sampler& sampler;
  std::size_t fault_count = 0;
  bool maps = false, oriented = false;
  geomech::OrientationGrid orientations;
  Eigen::MatrixXd inputs;        // sampled inputs × all realizations
  Eigen::MatrixXf perturbation;  // (2 · faults) × all
  Eigen::MatrixXf dp_crit;       // segments × all (rows [seg_first, seg_end) computed, NaN elsewhere)
  Eigen::MatrixXf map_dp_crit;   // 2 × all
  std::vector<geomech::CoulombPathChange> coulomb_path;  // [i · segments + s] (seismicity only)
  std::size_t seg_first = 0, seg_end = 0;                // the segments whose Δp_crit is drawn
};

// Per-thread scratch space.
struct Scratch {
  std::vector<double> v, dp;
  geomech::PlaneBatch planes;
  geomech::StressBatch states;
};

// D and μ/(4π k h) (or their T, S form) from hydro/theis.hpp; empty when the sampled values are
// not a physical formation.
std::optional<hydro::TheisParameters> hydrogeology(const UncertainModel& m, const InputList& l,
                                                   const std::vector<double>& v) {
  try {
    if (m.from_transmissivity) {
      hydro::Aquifer a;
      a.transmissivity = v[l.t];
      a.storativity = v[l.s];
      a.fluid_density = m.fluid_density;
      return hydro::theis_parameters(a);
    }
    hydro::Formation f;
    f.permeability = v[l.k];
    f.thickness = v[l.h];
    f.viscosity = v[l.mu_f];
    f.porosity = v[l.phi];
    f.total_compressibility = v[l.ct];
    return hydro::theis_parameters(f);
  } catch (const InputError&) {
    return std::nullopt;
  }
}

// The stress state at the reference depth; empty when it is not physical.
std::optional<geomech::AndersonianStress> stress_state(const UncertainModel& m, const InputList& l,
                                                       const std::vector<double>& v) {
  const double z = m.depth;
  geomech::AndersonianStress st;
  st.sv = v[l.sv_grad] * z;
  st.pore_pressure = v[l.pp_grad] * z;
  st.shmax_azimuth = v[l.azimuth];
  geomech::HorizontalStresses hs{};
  try {
    switch (m.model) {
      case HorizontalStressModel::gradients:
        hs = geomech::horizontal_stresses_from_gradients(v[l.shmax_g], v[l.shmin_g], z);
        break;
      case HorizontalStressModel::uniaxial_strain: {
        geomech::UniaxialStrainModel um = m.uniaxial;
        um.poisson = v[l.poisson];
        if (l.biot != InputList::npos) um.biot = v[l.biot];
        hs = geomech::horizontal_stresses_uniaxial_strain(um, st.sv, st.pore_pressure);
        break;
      }
      case HorizontalStressModel::a_phi:
        hs = geomech::horizontal_stresses_from_a_phi(v[l.aphi], st.sv, st.pore_pressure,
                                                     m.equilibrium_friction.value_or(v[l.friction]));
        break;
    }
    st.shmax = hs.shmax;
    st.shmin = hs.shmin;
    geomech::check(st);
  } catch (const InputError&) {
    return std::nullopt;  // not a physical stress state: rejected and counted
  }
  return st;
}

// The stress-path coefficient κ of this realization: from its α and ν on the poroelastic path
// (geomech::stress_path_coefficient, Engelder & Fischer 1994), else the model's fixed κ; empty
// when α or ν leave their domain (rejected and counted, as an unphysical stress state).
std::optional<double> stress_path(const UncertainModel& m, const InputList& l, const std::vector<double>& v) {
  if (!m.poroelastic_path) return m.stress_path_kappa;
  if (!(v[l.biot] > 0.0)) return std::nullopt;
  try {
    return geomech::stress_path_coefficient({v[l.biot], v[l.poisson]});
  } catch (const InputError&) {
    return std::nullopt;
  }
}

// Whether (S1 − p)/(S3 − p) exceeds the frictional limit [√(μ²+1) + μ]² (geomech/frictional_limit.hpp),
// compared as S1 − p > limit · (S3 − p).
bool beyond_frictional_limit(const geomech::AndersonianStress& st, double mu) {
  const double s1 = std::max({st.sv, st.shmax, st.shmin}), s3 = std::min({st.sv, st.shmax, st.shmin});
  const double lim = geomech::frictional_limit_ratio(mu);
  return (s1 - st.pore_pressure) > lim * (s3 - st.pore_pressure);
}

// Δp_crit of the job's segments (perturbed orientation, its fault's friction) into column `col`;
// with the seismicity likelihood also ΔCFF(Δp) along the same plane and stress path.
void segment_thresholds(SamplingJob& job, Eigen::Index col, const Eigen::Matrix3d& tensor, double pore_pressure,
                        double mu_global, double kappa, Scratch& s) {
  const std::vector<double>& v = s.v;
  s.planes = {};
  s.states = {};
  s.planes.reserve(job.seg_end - job.seg_first);
  s.states.reserve(job.seg_end - job.seg_first);
  const std::size_t n_seg = job.segments.size();
  for (std::size_t k = job.seg_first; k < job.seg_end; ++k) {
    const auto& seg = job.segments[k];
    const double ds = job.perturbation(static_cast<Eigen::Index>(2 * seg.fault), col);
    const double dd = job.perturbation(static_cast<Eigen::Index>(2 * seg.fault + 1), col);
    const double dip = std::clamp(seg.dip + dd, 0.0, std::numbers::pi / 2);
    const auto plane = geomech::FaultPlane::from_strike_dip(geomech::wrap_azimuth(seg.strike + ds), dip);
    s.planes.push_back(plane);
    const std::size_t fj = job.list.fault_friction[seg.fault];
    const double mu_f = std::max(fj == InputList::npos ? mu_global : v[fj], 1e-6);
    s.states.push_back(tensor, pore_pressure, geomech::Friction{mu_f, v[job.list.cohesion]}, kappa);
    if (!job.coulomb_path.empty())
      job.coulomb_path[static_cast<std::size_t>(col) * n_seg + k] =
          geomech::coulomb_path_change(tensor, plane.normal(), mu_f, kappa);
  }
  const std::span<double> dp = std::span(s.dp).subspan(job.seg_first, job.seg_end - job.seg_first);
  geomech::critical_pressure_paired(s.planes, s.states, dp);
  for (std::size_t k = job.seg_first; k < job.seg_end; ++k)
    job.dp_crit(static_cast<Eigen::Index>(k), col) = static_cast<float>(s.dp[k]);
}

// Δp_crit of the maps (most dangerous orientation; the given one) into column `col`.
void map_thresholds(SamplingJob& job, Eigen::Index col, const Eigen::Matrix3d& tensor, double pore_pressure,
                    double mu_global, double cohesion, double kappa) {
  geomech::StressBatch one;
  one.push_back(tensor, pore_pressure, geomech::Friction{mu_global, cohesion}, kappa);
  const auto table = geomech::tabulate_critical_pressure(job.orientations, one);
  job.map_dp_crit(0, col) = static_cast<float>(*std::min_element(table.begin(), table.end()));
  if (job.oriented) {
    geomech::PlaneBatch p1;
    p1.push_back(geomech::FaultPlane::from_strike_dip(*job.settings.map_strike, *job.settings.map_dip));
    double v1 = 0.0;
    geomech::critical_pressure_grid(p1, one, std::span<double>(&v1, 1));
    job.map_dp_crit(1, col) = static_cast<float>(v1);
  }
}

// Realization i: its inputs and perturbations (always stored), then, when valid, its thresholds.
Draw draw_realization(SamplingJob& job, std::uint64_t i, Scratch& s) {
  const auto col = static_cast<Eigen::Index>(i);
  std::vector<double>& v = s.v;
  job.sampler.draw(i, v);
  for (std::size_t j = 0; j < v.size(); ++j) job.inputs(static_cast<Eigen::Index>(j), col) = v[j];
  stats::RandomStream aux(job.settings.seed, i, stats::StreamPurpose::auxiliary);
  for (std::size_t f = 0; f < job.fault_count; ++f) {
    job.perturbation(static_cast<Eigen::Index>(2 * f), col) =
        static_cast<float>(job.model.strike_perturbation.quantile(aux.uniform()));
    job.perturbation(static_cast<Eigen::Index>(2 * f + 1), col) =
        static_cast<float>(job.model.dip_perturbation.quantile(aux.uniform()));
  }
  Draw r;
  const auto hydro = hydrogeology(job.model, job.list, v);
  if (!hydro) return r;
  r.diffusivity = hydro->diffusivity;
  r.prefactor = hydro->pressure_per_rate;
  const double mu_global = v[job.list.friction];
  if (!(mu_global > 0.0) || v[job.list.cohesion] < 0.0) return r;
  const auto st = stress_state(job.model, job.list, v);
  if (!st) return r;
  const auto kappa = stress_path(job.model, job.list, v);
  if (!kappa) return r;
  r.valid = true;
  r.beyond_limit = beyond_frictional_limit(*st, mu_global);
  const Eigen::Matrix3d tensor = geomech::stress_tensor_ned(*st);
  segment_thresholds(job, col, tensor, st->pore_pressure, mu_global, *kappa, s);
  if (job.maps) map_thresholds(job, col, tensor, st->pore_pressure, mu_global, v[job.list.cohesion], *kappa);
  return r;
}

// The job of `n_all` realizations (every matrix has a column per realization).
SamplingJob make_job(const UncertainModel& model, const InputList& list, const std::vector<SegmentInput>& segments,
                     std::size_t fault_count, const RunSettings& settings, const stats::Sampler& sampler,
                     std::uint64_t n_all, std::optional<std::pair<std::size_t, std::size_t>> only = std::nullopt) {
  const auto cols = static_cast<Eigen::Index>(n_all);
  const bool maps = !settings.map_points.empty();
  const auto rows = static_cast<Eigen::Index>(segments.size());
  return SamplingJob{model, list, segments, settings, sampler, fault_count, maps,
                     maps && settings.map_strike && settings.map_dip,
                     maps ? geomech::make_orientation_grid(5.0 * std::numbers::pi / 180.0, 5.0 * std::numbers::pi / 180.0)
                          : geomech::OrientationGrid{},
                     Eigen::MatrixXd(static_cast<Eigen::Index>(list.inputs.size()), cols),
                     Eigen::MatrixXf(static_cast<Eigen::Index>(2 * fault_count), cols),
                     only ? Eigen::MatrixXf::Constant(rows, cols, std::numeric_limits<float>::quiet_NaN())
                          : Eigen::MatrixXf(rows, cols),
                     Eigen::MatrixXf::Constant(2, cols, std::numeric_limits<float>::infinity()),
                     std::vector<geomech::CoulombPathChange>(settings.seismicity ? n_all * segments.size() : 0),
                     only ? only->first : 0, only ? only->second : segments.size()};
}

}  // namespace

std::vector<double> realization_critical_pressures(const UncertainModel& model, const InputList& list,
                                                   const std::vector<SegmentInput>& segments, std::size_t fault_count,
                                                   const RunSettings& settings, const stats::RealizationCount& count,
                                                   std::uint64_t i) {
  const stats::Sampler sampler(list.inputs, settings.method, settings.seed, count);
  SamplingJob job = make_job(model, list, segments, fault_count, settings, sampler, count.value());
  Scratch s;
  s.v.resize(list.inputs.size());
  s.dp.resize(segments.size());
  if (!draw_realization(job, i, s).valid) return {};
  return s.dp;
}

SampledRealizations sample_realizations(const UncertainModel& model, const InputList& list,
                                        const std::vector<SegmentInput>& segments, std::size_t fault_count,
                                        const RunSettings& settings, const stats::RealizationCount& count,
                                        std::optional<std::pair<std::size_t, std::size_t>> only_segments) {
  if (only_segments && (only_segments->first > only_segments->second || only_segments->second > segments.size() ||
                        settings.seismicity))
    throw InputError("segments sampled", std::to_string(only_segments->first) + " to " + std::to_string(only_segments->second),
                     "a range of the " + std::to_string(segments.size()) +
                         " segments, and every segment when the seismicity likelihood reads them all");
  const stats::Sampler sampler(list.inputs, settings.method, settings.seed, count);
  const std::uint64_t n_all = count.value();
  SamplingJob job = make_job(model, list, segments, fault_count, settings, sampler, n_all, only_segments);
  std::vector<Draw> draws(n_all);
  util::ParallelErrors errors;
#pragma omp parallel
  {
    Scratch s;
    errors.setup([&] {
      s.v.resize(list.inputs.size());
      s.dp.resize(segments.size());
    });
#pragma omp for schedule(dynamic, 64)
    for (std::uint64_t i = 0; i < n_all; ++i)
      errors.iteration(static_cast<std::size_t>(i), [&] { draws[i] = draw_realization(job, i, s); });
  }
  errors.rethrow();

  SampledRealizations out;
  out.drawn = n_all;
  for (std::uint64_t i = 0; i < n_all; ++i) {
    if (draws[i].valid) out.keep.push_back(static_cast<Eigen::Index>(i));
    out.beyond_frictional_limit += draws[i].valid && draws[i].beyond_limit;
  }
  out.sampler = sampler.descriptor();
  if (out.keep.empty())
    throw InputError("uncertainty", std::to_string(n_all) + " realizations",
                     "distributions that give at least one physical stress state (Shmin <= SHmax, stresses above "
                     "pore pressure, positive friction and hydraulic properties)");
  for (const Eigen::Index i : out.keep) {
    out.diffusivity.push_back(draws[static_cast<std::size_t>(i)].diffusivity);
    out.prefactor.push_back(draws[static_cast<std::size_t>(i)].prefactor);
  }
  if (out.keep.size() == n_all) {  // every realization valid: the matrices as drawn, not copied
    out.inputs = std::move(job.inputs);
    out.perturbation = std::move(job.perturbation);
    out.dp_crit = std::move(job.dp_crit);
    out.map_dp_crit = std::move(job.map_dp_crit);
  } else {
    out.inputs = job.inputs(Eigen::all, out.keep);
    out.perturbation = job.perturbation(Eigen::all, out.keep);
    out.dp_crit = job.dp_crit(Eigen::all, out.keep);
    out.map_dp_crit = job.map_dp_crit(Eigen::all, out.keep);
  }
  if (!job.coulomb_path.empty()) {
    const std::size_t n_seg = segments.size();
    out.coulomb_path.reserve(out.keep.size() * n_seg);
    for (const Eigen::Index i : out.keep)
      for (std::size_t k = 0; k < n_seg; ++k) out.coulomb_path.push_back(job.coulomb_path[static_cast<std::size_t>(i) * n_seg + k]);
  }
  return out;
}

}  // namespace slipscreen::probabilistic
