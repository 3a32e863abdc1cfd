#include "core/probabilistic/slip_probability.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <limits>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/critical_pressure_batch.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/orientation_search.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/stats/random_stream.hpp"
#include "core/stats/rank_correlation.hpp"
#include "core/units/units.hpp"

namespace slipscreen::probabilistic {
namespace {

// The sampled inputs in a fixed order; `Slot` remembers where each model input sits.
struct InputList {
  std::vector<stats::UncertainInput> inputs;
  std::size_t k = 0, h = 0, phi = 0, ct = 0, mu_f = 0, t = 0, s = 0;
  std::size_t sv_grad = 0, pp_grad = 0, azimuth = 0, shmax_g = 0, shmin_g = 0, aphi = 0, poisson = 0;
  std::size_t friction = 0, cohesion = 0, rate = 0;
  std::vector<std::size_t> fault_friction;  // per fault, npos when global
  std::vector<std::size_t> well_rate;       // per well, npos when none
  static constexpr std::size_t npos = std::numeric_limits<std::size_t>::max();

  std::size_t add(std::string name, const stats::Distribution& d) {
    inputs.push_back({std::move(name), d});
    return inputs.size() - 1;
  }
};

InputList make_inputs(const UncertainModel& m, const std::vector<WellInput>& wells, std::size_t fault_count) {
  InputList l;
  if (m.from_transmissivity) {
    l.t = l.add("transmissivity", m.transmissivity);
    l.s = l.add("storativity", m.storativity);
  } else {
    l.k = l.add("permeability", m.permeability);
    l.h = l.add("thickness", m.thickness);
    l.phi = l.add("porosity", m.porosity);
    l.ct = l.add("total_compressibility", m.total_compressibility);
    l.mu_f = l.add("viscosity", m.viscosity);
  }
  l.sv_grad = l.add("vertical_gradient", m.vertical_gradient);
  l.pp_grad = l.add("pore_pressure_gradient", m.pore_pressure_gradient);
  l.azimuth = l.add("shmax_azimuth", m.shmax_azimuth);
  switch (m.model) {
    case HorizontalStressModel::gradients:
      l.shmax_g = l.add("shmax_gradient", m.shmax_gradient);
      l.shmin_g = l.add("shmin_gradient", m.shmin_gradient);
      break;
    case HorizontalStressModel::uniaxial_strain: l.poisson = l.add("poisson_ratio", m.poisson_ratio); break;
    case HorizontalStressModel::a_phi: l.aphi = l.add("a_phi", m.a_phi); break;
  }
  l.friction = l.add("friction", m.friction);
  l.cohesion = l.add("cohesion", m.cohesion);
  l.fault_friction.assign(fault_count, InputList::npos);
  for (std::size_t f = 0; f < fault_count && f < m.fault_friction.size(); ++f)
    if (m.fault_friction[f])
      l.fault_friction[f] =
          l.add("friction[" + (f < m.fault_ids.size() ? m.fault_ids[f] : std::to_string(f)) + "]", *m.fault_friction[f]);
  l.rate = l.add("rate_factor", m.rate_factor);
  l.well_rate.assign(wells.size(), InputList::npos);
  for (std::size_t w = 0; w < wells.size() && w < m.well_rate_factor.size(); ++w)
    if (m.well_rate_factor[w]) l.well_rate[w] = l.add("rate_factor[" + wells[w].id + "]", *m.well_rate_factor[w]);
  return l;
}

struct Realization {
  bool valid = false;
  bool beyond_limit = false;
  double diffusivity = 0.0, prefactor = 0.0;
};

}  // namespace

double MedianAttribution::share(std::size_t w) const {
  double total = 0.0;
  for (double v : well_dp) total += v;
  return total > 0.0 ? well_dp.at(w) / total : 0.0;
}

std::vector<std::string> sampled_input_names(const UncertainModel& model, const std::vector<WellInput>& wells,
                                             std::size_t fault_count) {
  std::vector<std::string> names;
  for (const auto& in : make_inputs(model, wells, fault_count).inputs) names.push_back(in.name);
  names.emplace_back("strike_perturbation");
  names.emplace_back("dip_perturbation");
  return names;
}

ProbabilisticResult run_probabilistic(const UncertainModel& model, const std::vector<WellInput>& wells,
                                      const std::vector<SegmentInput>& segments, const RunSettings& settings) {
  const stats::RealizationCount count(static_cast<std::int64_t>(settings.realizations), "realizations");
  if (wells.empty()) throw InputError("wells", "(none)", "at least one well with an injection history");
  if (segments.empty()) throw InputError("fault segments", "(none)", "at least one fault segment");
  if (settings.tracking_times.empty() || settings.output_index.empty())
    throw InputError("output times", "(none)", "at least one output time on the tracking grid");
  if (!(model.depth > 0.0)) throw InputError("reference depth", std::to_string(model.depth), "a depth > 0 m");
  std::size_t fault_count = 0;
  for (const auto& s : segments) {
    if (s.check_points.empty()) throw InputError("segment check points", "0", "at least one check point per segment");
    fault_count = std::max(fault_count, s.fault + 1);
  }

  const InputList list = make_inputs(model, wells, fault_count);
  const stats::Sampler sampler(list.inputs, settings.method, settings.seed, count);
  const std::uint64_t n_all = count.value();
  const std::size_t n_inputs = list.inputs.size();
  const std::size_t n_seg = segments.size();

  // ---- per realization: inputs, hydrogeology, stress and Δp_crit of every segment ----
  std::vector<Realization> real(n_all);
  Eigen::MatrixXd x(static_cast<Eigen::Index>(n_inputs), static_cast<Eigen::Index>(n_all));
  Eigen::MatrixXf perturb(static_cast<Eigen::Index>(2 * fault_count), static_cast<Eigen::Index>(n_all));
  Eigen::MatrixXf crit_all(static_cast<Eigen::Index>(n_seg), static_cast<Eigen::Index>(n_all));
  const bool maps = !settings.map_points.empty();
  const bool oriented = maps && settings.map_strike && settings.map_dip;
  const geomech::OrientationGrid orientations =
      maps ? geomech::make_orientation_grid(5.0 * std::numbers::pi / 180.0, 5.0 * std::numbers::pi / 180.0)
           : geomech::OrientationGrid{};
  Eigen::MatrixXf map_crit(2, static_cast<Eigen::Index>(n_all));  // row 0: most dangerous, row 1: given
  map_crit.setConstant(std::numeric_limits<float>::infinity());
  const double z = model.depth;
  std::exception_ptr failure;
#pragma omp parallel
  {
    std::vector<double> v(n_inputs), dp(n_seg);
    geomech::PlaneBatch planes;
    geomech::StressBatch states;
#pragma omp for schedule(dynamic, 64)
    for (std::uint64_t i = 0; i < n_all; ++i) {
      try {
        const auto col = static_cast<Eigen::Index>(i);
        sampler.draw(i, v);
        for (std::size_t j = 0; j < n_inputs; ++j) x(static_cast<Eigen::Index>(j), col) = v[j];
        // Orientation perturbations: per fault, from the realization's auxiliary stream.
        stats::RandomStream aux(settings.seed, i, stats::StreamPurpose::auxiliary);
        for (std::size_t f = 0; f < fault_count; ++f) {
          perturb(static_cast<Eigen::Index>(2 * f), col) =
              static_cast<float>(model.strike_perturbation.quantile(aux.uniform()));
          perturb(static_cast<Eigen::Index>(2 * f + 1), col) =
              static_cast<float>(model.dip_perturbation.quantile(aux.uniform()));
        }
        Realization& r = real[i];
        // Hydrogeology: D and the Theis prefactor (Theis 1935).
        if (model.from_transmissivity) {
          const double t = v[list.t], s = v[list.s];
          if (!(t > 0.0) || !(s > 0.0)) continue;
          r.diffusivity = t / s;
          r.prefactor = model.fluid_density * units::kStandardGravity / (4.0 * std::numbers::pi * t);
        } else {
          const double k = v[list.k], h = v[list.h], phi = v[list.phi], ct = v[list.ct], mu = v[list.mu_f];
          if (!(k > 0.0) || !(h > 0.0) || !(phi > 0.0) || !(ct > 0.0) || !(mu > 0.0)) continue;
          r.diffusivity = k / (mu * phi * ct);
          r.prefactor = mu / (4.0 * std::numbers::pi * k * h);
        }
        // Stress at the reference depth.
        geomech::AndersonianStress st;
        st.sv = v[list.sv_grad] * z;
        st.pore_pressure = v[list.pp_grad] * z;
        st.shmax_azimuth = v[list.azimuth];
        const double mu_global = v[list.friction];
        if (!(mu_global > 0.0) || v[list.cohesion] < 0.0) continue;
        geomech::HorizontalStresses hs{};
        try {
          switch (model.model) {
            case HorizontalStressModel::gradients:
              hs = geomech::horizontal_stresses_from_gradients(v[list.shmax_g], v[list.shmin_g], z);
              break;
            case HorizontalStressModel::uniaxial_strain: {
              geomech::UniaxialStrainModel um = model.uniaxial;
              um.poisson = v[list.poisson];
              hs = geomech::horizontal_stresses_uniaxial_strain(um, st.sv, st.pore_pressure);
              break;
            }
            case HorizontalStressModel::a_phi:
              hs = geomech::horizontal_stresses_from_a_phi(v[list.aphi], st.sv, st.pore_pressure,
                                                           model.equilibrium_friction.value_or(mu_global));
              break;
          }
          st.shmax = hs.shmax;
          st.shmin = hs.shmin;
          geomech::check(st);
        } catch (const InputError&) {
          continue;  // not a physical stress state: rejected and counted
        }
        r.valid = true;
        // Frictional limit (Jaeger & Cook; Zoback 2007): (S1 − p)/(S3 − p) ≤ [√(μ²+1) + μ]².
        const double s1 = std::max({st.sv, st.shmax, st.shmin}), s3 = std::min({st.sv, st.shmax, st.shmin});
        const double lim = std::pow(std::sqrt(mu_global * mu_global + 1.0) + mu_global, 2.0);
        r.beyond_limit = (s1 - st.pore_pressure) > lim * (s3 - st.pore_pressure);
        const Eigen::Matrix3d tensor = geomech::stress_tensor_ned(st);
        planes = {};
        states = {};
        planes.reserve(n_seg);
        states.reserve(n_seg);
        for (const auto& seg : segments) {
          const double ds = perturb(static_cast<Eigen::Index>(2 * seg.fault), col);
          const double dd = perturb(static_cast<Eigen::Index>(2 * seg.fault + 1), col);
          const double dip = std::clamp(seg.dip + dd, 0.0, std::numbers::pi / 2);
          planes.push_back(geomech::FaultPlane::from_strike_dip(geomech::wrap_azimuth(seg.strike + ds), dip));
          const std::size_t fj = list.fault_friction[seg.fault];
          const double mu_f = fj == InputList::npos ? mu_global : v[fj];
          states.push_back(tensor, st.pore_pressure, geomech::Friction{std::max(mu_f, 1e-6), v[list.cohesion]},
                           model.stress_path_kappa);
        }
        geomech::critical_pressure_paired(planes, states, dp);
        for (std::size_t s = 0; s < n_seg; ++s) crit_all(static_cast<Eigen::Index>(s), col) = static_cast<float>(dp[s]);
        if (maps) {
          geomech::StressBatch one;
          one.push_back(tensor, st.pore_pressure, geomech::Friction{mu_global, v[list.cohesion]}, model.stress_path_kappa);
          const auto table = geomech::tabulate_critical_pressure(orientations, one);
          map_crit(0, col) = static_cast<float>(*std::min_element(table.begin(), table.end()));
          if (oriented) {
            geomech::PlaneBatch p1;
            p1.push_back(geomech::FaultPlane::from_strike_dip(*settings.map_strike, *settings.map_dip));
            double v1 = 0.0;
            geomech::critical_pressure_grid(p1, one, std::span<double>(&v1, 1));
            map_crit(1, col) = static_cast<float>(v1);
          }
        }
      } catch (...) {
#pragma omp critical(probabilistic_failure)
        if (!failure) failure = std::current_exception();
      }
    }
  }
  if (failure) std::rethrow_exception(failure);

  // ---- keep the valid realizations, in order ----
  std::vector<Eigen::Index> keep;
  ProbabilisticResult out;
  for (std::uint64_t i = 0; i < n_all; ++i) {
    if (real[i].valid) keep.push_back(static_cast<Eigen::Index>(i));
    out.beyond_frictional_limit += real[i].valid && real[i].beyond_limit;
  }
  out.realizations = keep.size();
  out.rejected = n_all - keep.size();
  out.sampler = sampler.descriptor();
  out.input_names = sampled_input_names(model, wells, fault_count);
  if (keep.empty())
    throw InputError("uncertainty", std::to_string(n_all) + " realizations",
                     "distributions that give at least one physical stress state (Shmin <= SHmax, stresses above "
                     "pore pressure, positive friction and hydraulic properties)");
  const auto n = static_cast<Eigen::Index>(keep.size());
  std::vector<double> d(keep.size()), pre(keep.size());
  for (std::size_t c = 0; c < keep.size(); ++c) {
    d[c] = real[static_cast<std::size_t>(keep[c])].diffusivity;
    pre[c] = real[static_cast<std::size_t>(keep[c])].prefactor;
  }
  const Eigen::MatrixXf crit = crit_all(Eigen::all, keep);
  const Eigen::MatrixXd xv = x(Eigen::all, keep);
  const Eigen::MatrixXf pv = perturb(Eigen::all, keep);
  out.diffusivity_min = *std::min_element(d.begin(), d.end());
  out.diffusivity_max = *std::max_element(d.begin(), d.end());

  // ---- pressure model: similarity tables, sources with images, surrogate in D ----
  std::vector<hydro::RateSteps> steps;
  for (const auto& w : wells) steps.push_back(w.steps);
  std::vector<std::size_t> group_of(wells.size(), 0);
  std::size_t groups = 1;
  for (std::size_t w = 0; w < wells.size(); ++w)
    if (list.well_rate[w] != InputList::npos) group_of[w] = groups++;
  std::vector<hydro::PressureSource> sources;
  std::vector<std::size_t> first_source(wells.size() + 1, 0);  // sources of well w: [first[w], first[w+1])
  double rw_min = std::numeric_limits<double>::infinity();
  for (std::size_t w = 0; w < wells.size(); ++w) {
    rw_min = std::min(rw_min, wells[w].radius);
    first_source[w] = sources.size();
    for (const auto& im : hydro::image_wells(wells[w].x, wells[w].y, settings.boundaries))
      sources.push_back({im.x, im.y, wells[w].radius, w, im.sign, group_of[w]});
  }
  first_source[wells.size()] = sources.size();
  std::vector<hydro::ObservationPoint> points;
  std::vector<std::vector<std::size_t>> seg_points(n_seg);
  double r2_max = 0.0;
  for (std::size_t s = 0; s < n_seg; ++s)
    for (const auto& p : segments[s].check_points) {
      seg_points[s].push_back(points.size());
      points.push_back(p);
      for (const auto& src : sources)
        r2_max = std::max(r2_max, (p.x - src.x) * (p.x - src.x) + (p.y - src.y) * (p.y - src.y));
    }
  const hydro::SimilarityGrid grid{std::log(rw_min * rw_min / (4.0 * out.diffusivity_max)) - 0.1,
                            std::log(std::max(r2_max, 1.0) / (4.0 * out.diffusivity_min)) + 0.1, 0.025};
  const auto tables = hydro::build_tables(steps, settings.tracking_times, grid);
  const std::size_t nodes =
      settings.surrogate_nodes > 0
          ? settings.surrogate_nodes
          : std::clamp<std::size_t>(
                static_cast<std::size_t>(std::ceil(8.0 * std::log(out.diffusivity_max / out.diffusivity_min))), 4, 64);
  const hydro::PressureSurrogate surrogate(tables, sources, points, groups, out.diffusivity_min, out.diffusivity_max, nodes);
  out.surrogate_error = surrogate.max_relative_error();
  Eigen::MatrixXd factor(static_cast<Eigen::Index>(groups), n);
  for (Eigen::Index c = 0; c < n; ++c) {
    factor(0, c) = xv(static_cast<Eigen::Index>(list.rate), c);
    for (std::size_t w = 0; w < wells.size(); ++w)
      if (group_of[w] > 0)
        factor(static_cast<Eigen::Index>(group_of[w]), c) =
            factor(0, c) * xv(static_cast<Eigen::Index>(list.well_rate[w]), c);
  }
  const PressureDraws draws = make_pressure_draws(surrogate, d, pre, factor);

  // ---- ranks of the sampled inputs, for the sensitivity of every segment ----
  std::vector<std::vector<double>> input_ranks(n_inputs);
  for (std::size_t j = 0; j < n_inputs; ++j) {
    std::vector<double> col(keep.size());
    for (std::size_t c = 0; c < keep.size(); ++c) col[c] = xv(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(c));
    input_ranks[j] = stats::average_ranks(col);
  }

  // ---- tracking and accumulation, one segment at a time ----
  const std::size_t n_out = settings.output_index.size();
  // For the median attribution: every table's nodes at every output time [t * wells + w].
  std::vector<std::vector<float>> median_nodes;
  if (settings.attribute_median)
    for (std::size_t t = 0; t < n_out; ++t)
      for (std::size_t w = 0; w < wells.size(); ++w) median_nodes.push_back(tables[w].nodes_at(settings.output_index[t]));
  out.segments.resize(n_seg);
  // Audited pairs: kept columns of the audited realizations.
  std::vector<std::pair<std::uint64_t, Eigen::Index>> audit_cols;
  for (std::uint64_t i : settings.audit_realizations) {
    const auto it = std::lower_bound(keep.begin(), keep.end(), static_cast<Eigen::Index>(i));
    if (it != keep.end() && *it == static_cast<Eigen::Index>(i)) audit_cols.emplace_back(i, it - keep.begin());
  }
  std::vector<std::vector<AuditEntry>> audit_by_segment(n_seg);
  std::vector<char> audited(n_seg, 0);
  for (std::size_t s : settings.audit_segments)
    if (s < n_seg) audited[s] = 1;
  track_slip(surrogate, seg_points, draws, crit, settings.output_index, [&](const SegmentOutcome& o) {
    if (audited[o.segment])
      for (const auto& [i, c] : audit_cols) {
        AuditEntry a;
        a.realization = i;
        a.segment = o.segment;
        a.diffusivity = d[static_cast<std::size_t>(c)];
        a.prefactor = pre[static_cast<std::size_t>(c)];
        for (Eigen::Index g = 0; g < factor.rows(); ++g) a.group_scale.push_back(factor(g, c));
        a.well_group = group_of;
        a.dp_crit = crit(static_cast<Eigen::Index>(o.segment), c);
        a.first_crossing = o.first_crossing[static_cast<std::size_t>(c)];
        for (std::size_t t = 0; t < n_out; ++t) a.dp_at_output.push_back(o.dp_at_output(static_cast<Eigen::Index>(t), c));
        audit_by_segment[o.segment].push_back(std::move(a));
      }
    SegmentResult res;
    res.slipped_by.assign(n_out, 0);
    res.dp.assign(n_out, stats::QuantileSketch());
    const auto s = static_cast<Eigen::Index>(o.segment);
    std::vector<double> margin(keep.size());
    // Δp by output time, each time's realizations contiguous (column t).
    const Eigen::MatrixXd by_time = o.dp_at_output.transpose();
    for (std::size_t t = 0; t < n_out; ++t)  // one sketch at a time (its buckets stay in cache)
      for (std::size_t c = 0; c < keep.size(); ++c)
        res.dp[t].add(by_time(static_cast<Eigen::Index>(c), static_cast<Eigen::Index>(t)));
    for (std::size_t c = 0; c < keep.size(); ++c) {
      const auto ci = static_cast<Eigen::Index>(c);
      const double dc = crit(s, ci);
      margin[c] = dc - o.dp_at_output(static_cast<Eigen::Index>(n_out - 1), ci);
      if (std::isinf(dc)) {
        ++res.never_critical;
        margin[c] = std::numeric_limits<double>::max();  // ranks last, keeps ranks finite
        continue;
      }
      res.dp_crit.add(dc);
      if (dc <= 0.0) {
        ++res.already_critical;
        continue;
      }
      const int first = o.first_crossing[c];
      if (first < 0) continue;
      for (std::size_t t = 0; t < n_out; ++t)
        if (settings.output_index[t] >= static_cast<std::size_t>(first)) ++res.slipped_by[t];
    }
    const auto margin_ranks = stats::average_ranks(margin);
    res.sensitivity.resize(n_inputs + 2);
    for (std::size_t j = 0; j < n_inputs; ++j) res.sensitivity[j] = stats::spearman_from_ranks(input_ranks[j], margin_ranks).rho;
    if (settings.attribute_median) {
      std::vector<double> sorted;
      sorted.reserve(keep.size());
      const std::size_t rank = (keep.size() - 1) / 2;
      const auto& cps = segments[o.segment].check_points;
      res.median.resize(n_out);
      for (std::size_t t = 0; t < n_out; ++t) {
        // The value of rank `rank`: the sketch's estimate bounds it (relative accuracy α), so
        // only the values in that window need ordering (all of them if the window misses).
        // Then the realization holding it (ties by index: the (rank − #smaller)-th equal one).
        const double* vals = by_time.col(static_cast<Eigen::Index>(t)).data();
        const double est = res.dp[t].quantile(0.5);
        const double half = 2.0 * res.dp[t].relative_accuracy() * std::abs(est) + res.dp[t].zero_threshold();
        const double lo = est - half, hi = est + half;
        std::size_t below = 0;
        sorted.clear();
        for (std::size_t j = 0; j < keep.size(); ++j) {
          if (vals[j] < lo) ++below;
          else if (vals[j] <= hi) sorted.push_back(vals[j]);
        }
        if (!(below <= rank && rank < below + sorted.size())) {  // not in the window: order all
          sorted.assign(vals, vals + keep.size());
          below = 0;
        }
        std::nth_element(sorted.begin(), sorted.begin() + static_cast<std::ptrdiff_t>(rank - below), sorted.end());
        const double median = sorted[rank - below];
        std::size_t tie = rank - static_cast<std::size_t>(std::count_if(vals, vals + keep.size(), [&](double y) { return y < median; }));
        Eigen::Index c = 0;
        for (std::size_t j = 0; j < keep.size(); ++j)
          if (vals[j] == median && tie-- == 0) {
            c = static_cast<Eigen::Index>(j);
            break;
          }
        MedianAttribution& m = res.median[t];
        m.realization = static_cast<std::uint64_t>(keep[static_cast<std::size_t>(c)]);
        m.dp = median;
        // The check point holding the maximum (fast path; the first one on ties).
        const std::size_t k = settings.output_index[t];
        double best = -std::numeric_limits<double>::infinity();
        for (std::size_t p = 0; p < cps.size(); ++p) {
          double v = 0.0;
          for (std::size_t g = 0; g < groups; ++g)
            v += surrogate.table(seg_points[o.segment][p], g).row(static_cast<Eigen::Index>(k)).dot(draws.basis.col(c)) *
                 draws.scale(static_cast<Eigen::Index>(g), c);
          if (v > best) {
            best = v;
            m.check_point = p;
          }
        }
        // Each well's contribution there, from its table's nodes at that time.
        const auto& cp = cps[m.check_point];
        const double inv4d = 0.25 / d[static_cast<std::size_t>(c)];
        m.well_dp.assign(wells.size(), 0.0);
        for (std::size_t w = 0; w < wells.size(); ++w) {
          const float* h_nodes = median_nodes[t * wells.size() + w].data();
          double h = 0.0;
          for (std::size_t j = first_source[w]; j < first_source[w + 1]; ++j) {
            const auto& src = sources[j];
            const double dx = cp.x - src.x, dy = cp.y - src.y;
            const double r2 = std::max(dx * dx + dy * dy, src.radius * src.radius);
            h += src.sign * hydro::SimilarityTable::value_from_nodes(tables[w].tap(r2 * inv4d), h_nodes);
          }
          m.well_dp[w] = pre[static_cast<std::size_t>(c)] * factor(static_cast<Eigen::Index>(group_of[w]), c) * h;
        }
      }
    }
    const std::size_t f = segments[o.segment].fault;
    for (std::size_t a = 0; a < 2; ++a) {
      std::vector<double> pert(keep.size());
      for (std::size_t c = 0; c < keep.size(); ++c)
        pert[c] = pv(static_cast<Eigen::Index>(2 * f + a), static_cast<Eigen::Index>(c));
      res.sensitivity[n_inputs + a] = stats::spearman_from_ranks(stats::average_ranks(pert), margin_ranks).rho;
    }
    out.segments[o.segment] = std::move(res);
  });

  for (auto& v : audit_by_segment)
    for (auto& a : v) out.audit.push_back(std::move(a));
  std::sort(out.audit.begin(), out.audit.end(), [](const AuditEntry& a, const AuditEntry& b) {
    return std::make_pair(a.realization, a.segment) < std::make_pair(b.realization, b.segment);
  });

  // ---- probability maps: each pixel is a one-point segment sharing the realization's Δp_crit ----
  if (maps) {
    const Eigen::MatrixXf mc = map_crit(Eigen::all, keep);
    std::vector<std::vector<std::size_t>> pixel_points(settings.map_points.size());
    double r2m = 0.0;
    for (std::size_t p = 0; p < settings.map_points.size(); ++p) {
      pixel_points[p] = {p};
      for (const auto& src : sources) {
        const double dx = settings.map_points[p].x - src.x, dy = settings.map_points[p].y - src.y;
        r2m = std::max(r2m, dx * dx + dy * dy);
      }
    }
    const hydro::SimilarityGrid map_grid{grid.ln_x_min, std::max(grid.ln_x_max, std::log(std::max(r2m, 1.0) /
                                                                                   (4.0 * out.diffusivity_min)) + 0.1),
                                  0.025};
    const auto map_tables = map_grid.ln_x_max > grid.ln_x_max ? hydro::build_tables(steps, settings.tracking_times, map_grid)
                                                              : tables;
    const hydro::PressureSurrogate map_sur(map_tables, sources, settings.map_points, groups, out.diffusivity_min,
                                    out.diffusivity_max, nodes);
    const PressureDraws map_draws = make_pressure_draws(map_sur, d, pre, factor);
    for (int which = 0; which < (oriented ? 2 : 1); ++which) {
      auto& counts = which == 0 ? out.map_dangerous : out.map_oriented;
      auto& already = which == 0 ? out.map_dangerous_already_critical : out.map_oriented_already_critical;
      counts.assign(settings.map_points.size() * n_out, 0);
      const Eigen::MatrixXf row = mc.row(which);
      already = static_cast<std::uint64_t>((row.array() <= 0.0f).count());
      track_slip(map_sur, pixel_points, map_draws, row, settings.output_index, [&](const SegmentOutcome& o) {
        for (std::size_t c = 0; c < keep.size(); ++c) {
          const int first = o.first_crossing[c];
          if (first < 0 || !(row(0, static_cast<Eigen::Index>(c)) > 0.0f)) continue;
          for (std::size_t t = 0; t < n_out; ++t)
            if (settings.output_index[t] >= static_cast<std::size_t>(first)) ++counts[o.segment * n_out + t];
        }
      });
    }
  }
  return out;
}

AuditEntry plain_slip_check(const AuditEntry& fast, const std::vector<WellInput>& wells,
                            const std::vector<SegmentInput>& segments, const RunSettings& settings) {
  AuditEntry a = fast;
  const auto& seg = segments.at(a.segment);
  const std::size_t n_t = settings.tracking_times.size();
  std::vector<double> best(n_t, 0.0);
  for (std::size_t p = 0; p < seg.check_points.size(); ++p) {
    std::vector<double> dp(n_t, 0.0);
    for (std::size_t w = 0; w < wells.size(); ++w) {
      const double f = a.prefactor * a.group_scale.at(a.well_group.at(w));
      for (const auto& im : hydro::image_wells(wells[w].x, wells[w].y, settings.boundaries)) {
        const double dx = seg.check_points[p].x - im.x, dy = seg.check_points[p].y - im.y;
        const double r2 = std::max(dx * dx + dy * dy, wells[w].radius * wells[w].radius);
        for (std::size_t k = 0; k < n_t; ++k)
          dp[k] += f * im.sign * hydro::SimilarityTable::direct(wells[w].steps, r2 / (4.0 * a.diffusivity), settings.tracking_times[k]);
      }
    }
    for (std::size_t k = 0; k < n_t; ++k) best[k] = p == 0 ? dp[k] : std::max(best[k], dp[k]);
  }
  a.first_crossing = -1;
  if (a.dp_crit <= 0.0) a.first_crossing = 0;
  else
    for (std::size_t k = 0; k < n_t; ++k)
      if (best[k] >= a.dp_crit) {
        a.first_crossing = static_cast<int>(k);
        break;
      }
  a.dp_at_output.clear();
  for (std::size_t o : settings.output_index) a.dp_at_output.push_back(best[o]);
  return a;
}

}  // namespace slipscreen::probabilistic
