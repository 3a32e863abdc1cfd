#include "io/probabilistic_run.hpp"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>

#include "core/errors.hpp"
#include "core/geomech/depth_profile.hpp"
#include "core/screen/tracking_grid.hpp"
#include "core/stats/wilson_interval.hpp"
#include "io/geotiff_writer.hpp"
#include "io/run.hpp"
#include "io/run_outputs.hpp"

namespace slipscreen::io {
namespace {

using stats::Distribution;
constexpr double kMPa = 1.0e6;

Distribution fixed(double v, const char* what) { return Distribution::fixed(std::isnan(v) ? 0.0 : v, what); }

}  // namespace

probabilistic::UncertainModel uncertain_model(const ResolvedScenario& s, const PreparedRun& p,
                                              const UncertaintySpec& spec, std::vector<std::string>& fault_ids,
                                              std::vector<std::size_t>& segment_fault) {
  probabilistic::UncertainModel m;
  const RegionSpec& rg = s.region;
  const FormationSpec& fm = rg.formation;
  m.from_transmissivity = fm.from_transmissivity;
  m.permeability = fixed(fm.permeability, "permeability");
  m.thickness = fixed(fm.thickness, "thickness");
  m.porosity = fixed(fm.porosity, "porosity");
  m.total_compressibility = fixed(fm.total_compressibility, "total_compressibility");
  m.viscosity = fixed(fm.viscosity, "viscosity");
  m.transmissivity = fixed(fm.transmissivity, "transmissivity");
  m.storativity = fixed(fm.storativity, "storativity");
  m.fluid_density = fm.fluid_density;
  m.depth = rg.reference_depth;
  const StressSpec& st = rg.stress;
  // The integrated overburden at the reference depth, as a mean gradient (exact at that depth).
  m.vertical_gradient = fixed(p.inputs.stress.sv / rg.reference_depth, "vertical_gradient");
  m.pore_pressure_gradient = fixed(p.inputs.stress.pore_pressure / rg.reference_depth, "pore_pressure_gradient");
  m.shmax_azimuth = fixed(p.inputs.stress.shmax_azimuth, "shmax_azimuth");
  switch (st.model) {
    case StressModel::gradients:
      m.model = probabilistic::HorizontalStressModel::gradients;
      m.shmax_gradient = fixed(st.shmax_gradient, "shmax_gradient");
      m.shmin_gradient = fixed(st.shmin_gradient, "shmin_gradient");
      break;
    case StressModel::uniaxial_strain:
      m.model = probabilistic::HorizontalStressModel::uniaxial_strain;
      m.poisson_ratio = fixed(st.poisson_ratio, "poisson_ratio");
      m.uniaxial = uniaxial_strain_model_of(st);
      break;
    case StressModel::a_phi:
      m.model = probabilistic::HorizontalStressModel::a_phi;
      m.a_phi = fixed(st.a_phi, "a_phi");
      // Magnitudes at frictional equilibrium for the region's friction (best estimate), so that
      // sampled fault friction changes how close faults are to failure.
      m.equilibrium_friction = std::isnan(st.equilibrium_friction) ? rg.faults.friction : st.equilibrium_friction;
      break;
  }
  m.friction = fixed(p.inputs.friction.mu, "friction");
  m.cohesion = fixed(p.inputs.friction.cohesion, "cohesion");

  // Faults in order of first appearance; a fault's own friction from the fault map is fixed.
  std::map<std::string, std::size_t> index;
  segment_fault.clear();
  fault_ids.clear();
  for (std::size_t i = 0; i < p.segments.size(); ++i) {
    const auto [it, added] = index.emplace(p.segments[i].fault_id, fault_ids.size());
    if (added) {
      fault_ids.push_back(p.segments[i].fault_id);
      m.fault_friction.emplace_back();
      if (p.inputs.segments[i].friction)
        m.fault_friction.back() = Distribution::fixed(*p.inputs.segments[i].friction, "friction");
    }
    segment_fault.push_back(it->second);
  }
  m.fault_ids = fault_ids;
  check_fault_ids(spec, fault_ids);
  m.well_rate_factor.assign(p.inputs.wells.size(), std::nullopt);

  // The scenario's distributions replace the best estimates they name.
  for (const auto& v : spec.values) {
    const auto& d = v.distribution;
    const std::string& k = v.key;
    if (k == "pore_pressure_gradient") m.pore_pressure_gradient = d;
    else if (k == "rate_factor") m.rate_factor = d;
    else if (k == "stress.vertical_gradient") m.vertical_gradient = d;
    else if (k == "stress.shmax_azimuth") m.shmax_azimuth = d;
    else if (k == "stress.shmax_gradient") m.shmax_gradient = d;
    else if (k == "stress.shmin_gradient") m.shmin_gradient = d;
    else if (k == "stress.poisson_ratio") m.poisson_ratio = d;
    else if (k == "stress.a_phi") m.a_phi = d;
    else if (k == "formation.permeability") m.permeability = d;
    else if (k == "formation.thickness") m.thickness = d;
    else if (k == "formation.porosity") m.porosity = d;
    else if (k == "formation.total_compressibility") m.total_compressibility = d;
    else if (k == "formation.viscosity") m.viscosity = d;
    else if (k == "formation.transmissivity") m.transmissivity = d;
    else if (k == "formation.storativity") m.storativity = d;
    else if (k == "faults.friction") m.friction = d;
    else if (k == "faults.cohesion") m.cohesion = d;
    else if (k == "faults.strike_perturbation") m.strike_perturbation = d;
    else if (k == "faults.dip_perturbation") m.dip_perturbation = d;
    else if (k.rfind("fault.", 0) == 0 && k.size() > 15 && k.substr(k.size() - 9) == ".friction") {
      const std::string id = k.substr(6, k.size() - 15);
      m.fault_friction[index.at(id)] = d;
    } else if (k.rfind("well.", 0) == 0 && k.size() > 17 && k.substr(k.size() - 12) == ".rate_factor") {
      const std::string id = k.substr(5, k.size() - 17);
      for (std::size_t w = 0; w < p.inputs.wells.size(); ++w)
        if (p.inputs.wells[w].id == id) m.well_rate_factor[w] = d;
    } else {
      throw InputError(k, v.text, "an input of the probabilistic screen", v.where);
    }
  }
  return m;
}

ProbabilisticRun run_probabilistic_screen(const ResolvedScenario& s, const PreparedRun& p,
                                          const UncertaintySpec& spec,
                                          std::vector<std::uint64_t> audit_realizations,
                                          std::vector<std::size_t> audit_segments) {
  ProbabilisticRun run;
  const auto model = uncertain_model(s, p, spec, run.fault_ids, run.segment_fault);
  run.confidence = spec.confidence;
  run.thresholds = spec.thresholds;

  std::vector<probabilistic::WellInput> wells;
  std::vector<double> changes;
  for (const auto& w : p.inputs.wells) {
    probabilistic::WellInput in;
    in.id = w.id;
    in.x = w.x;
    in.y = w.y;
    in.radius = w.radius;
    for (const auto& c : w.history.changes()) {
      in.steps.time.push_back(c.time);
      in.steps.delta_rate.push_back(c.delta);
      changes.push_back(c.time);
    }
    wells.push_back(std::move(in));
  }
  std::vector<probabilistic::SegmentInput> segments;
  for (std::size_t i = 0; i < p.inputs.segments.size(); ++i) {
    probabilistic::SegmentInput in;
    for (const auto& c : p.inputs.segments[i].check_points) in.check_points.push_back({c.x, c.y});
    in.strike = p.inputs.segments[i].strike;
    in.dip = p.inputs.segments[i].dip;
    in.fault = run.segment_fault[i];
    segments.push_back(std::move(in));
  }

  probabilistic::RunSettings set;
  set.seed = s.seed;
  set.realizations = spec.realizations.value();
  set.method = spec.sampler;
  set.boundaries = p.inputs.boundaries;
  run.tracked_times = screen::tracking_grid(changes, s.output.times);
  if (run.tracked_times.empty()) run.tracked_times = s.output.times;
  set.tracking_times = run.tracked_times;
  for (double t : s.output.times) {
    const auto it = std::lower_bound(run.tracked_times.begin(), run.tracked_times.end(), t);
    set.output_index.push_back(static_cast<std::size_t>(it - run.tracked_times.begin()));
  }

  // Probability maps: the output grid, coarsened by a whole factor to at most kMapCells cells.
  run.map_grid = geometry::coarsened(p.grid, spec.map_cell_size > 0.0 ? spec.map_cell_size : p.grid.cell_size,
                                     kMapCells);
  for (int j = 0; j < run.map_grid.rows; ++j)
    for (int i = 0; i < run.map_grid.columns; ++i) {
      const auto c = run.map_grid.cell_centre(i, j);
      set.map_points.push_back({c.x, c.y});
    }
  if (spec.map_strike) {
    run.map_strike = spec.map_strike;
    run.map_dip = spec.map_dip;
    set.map_strike = spec.map_strike;
    set.map_dip = spec.map_dip;
  }

  set.attribute_median = s.output.tables;  // written to median_well_shares.csv
  set.audit_realizations = std::move(audit_realizations);
  set.audit_segments = std::move(audit_segments);
  run.result = probabilistic::run_probabilistic(model, wells, segments, set);
  run.wells = std::move(wells);
  run.segments = std::move(segments);
  run.settings = std::move(set);
  const double z = stats::z_for_confidence(run.confidence);
  for (const auto& seg : run.result.segments)
    for (auto n : seg.slipped_by) {
      const auto ci = stats::wilson_interval(n, run.result.realizations, z);
      run.mc_half_width_max = std::max(run.mc_half_width_max, 0.5 * (ci.upper - ci.lower));
    }
  run.manifest = probabilistic_manifest(run, spec);
  return run;
}

double slip_probability(const ProbabilisticRun& run, std::size_t segment, std::size_t k) {
  return static_cast<double>(run.result.segments[segment].slipped_by[k]) /
         static_cast<double>(run.result.realizations);
}

void write_probabilistic_outputs(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                                 const ProbabilisticRun& run) {
  const auto& res = run.result;
  const double n = static_cast<double>(res.realizations);
  const double z = stats::z_for_confidence(run.confidence);
  const std::size_t K = s.output.times.size();
  const auto f3 = [](double v) { return fixed_decimals(v, 4); };
  const auto mpa = [](double v) { return fixed_decimals(v / kMPa, 4); };

  if (s.output.tables) {
    std::ostringstream t;
    t << "segment_id,fault_id,date,p_slip,p_slip_ci_low,p_slip_ci_high,p_already_critical,dp_p05_MPa,dp_p50_MPa,"
         "dp_p95_MPa,thresholds_reached\n";
    for (std::size_t i = 0; i < res.segments.size(); ++i) {
      const auto& seg = res.segments[i];
      for (std::size_t k = 0; k < K; ++k) {
        const auto ci = stats::wilson_interval(seg.slipped_by[k], res.realizations, z);
        std::string reached;
        for (double th : run.thresholds)
          if (ci.estimate >= th) {
            if (!reached.empty()) reached += ';';
            reached += fixed_decimals(th, 3);
          }
        t << csv_field(p.segments[i].segment_id) << ',' << csv_field(p.segments[i].fault_id) << ','
          << util::format_iso_date(s.output.dates[k]) << ',' << f3(ci.estimate) << ',' << f3(ci.lower) << ','
          << f3(ci.upper) << ',' << f3(static_cast<double>(seg.already_critical) / n) << ','
          << mpa(seg.dp[k].quantile(0.05)) << ',' << mpa(seg.dp[k].quantile(0.5)) << ','
          << mpa(seg.dp[k].quantile(0.95)) << ',' << reached << '\n';
      }
    }
    std::ofstream(folder.output("output.files.segment_probability", "segment_probability.csv"), std::ios::binary)
        << t.str();

    std::ostringstream u;
    u << "segment_id,fault_id,dp_crit_p05_MPa,dp_crit_p50_MPa,dp_crit_p95_MPa,p_already_critical,p_never_critical,"
         "p_slip_final,p_slip_final_ci_low,p_slip_final_ci_high";
    for (double th : run.thresholds) u << ",first_date_p_" << fixed_decimals(th, 3);
    u << '\n';
    for (std::size_t i = 0; i < res.segments.size(); ++i) {
      const auto& seg = res.segments[i];
      const auto ci = stats::wilson_interval(seg.slipped_by[K - 1], res.realizations, z);
      const bool any = !seg.dp_crit.empty();
      u << csv_field(p.segments[i].segment_id) << ',' << csv_field(p.segments[i].fault_id) << ','
        << (any ? mpa(seg.dp_crit.quantile(0.05)) : "") << ',' << (any ? mpa(seg.dp_crit.quantile(0.5)) : "") << ','
        << (any ? mpa(seg.dp_crit.quantile(0.95)) : "") << ',' << f3(static_cast<double>(seg.already_critical) / n)
        << ',' << f3(static_cast<double>(seg.never_critical) / n) << ',' << f3(ci.estimate) << ',' << f3(ci.lower)
        << ',' << f3(ci.upper);
      for (double th : run.thresholds) {
        std::string first;
        for (std::size_t k = 0; k < K && first.empty(); ++k)
          if (static_cast<double>(seg.slipped_by[k]) / n >= th) first = util::format_iso_date(s.output.dates[k]);
        u << ',' << first;
      }
      u << '\n';
    }
    std::ofstream(folder.output("output.files.segment_probability_summary", "segment_probability_summary.csv"),
                  std::ios::binary)
        << u.str();

    // Sensitivity per fault, at its segment with the highest final probability (ties: lowest
    // median Δp_crit margin, then file order).
    std::ostringstream v;
    v << "fault_id,segment_id,p_slip_final,input,spearman_rho,rank\n";
    for (std::size_t f = 0; f < run.fault_ids.size(); ++f) {
      std::size_t best = res.segments.size();
      for (std::size_t i = 0; i < res.segments.size(); ++i)
        if (run.segment_fault[i] == f &&
            (best == res.segments.size() || res.segments[i].slipped_by[K - 1] > res.segments[best].slipped_by[K - 1]))
          best = i;
      if (best == res.segments.size()) continue;
      const auto& sens = res.segments[best].sensitivity;
      std::vector<std::size_t> order;
      for (std::size_t j = 0; j < sens.size(); ++j)
        if (!std::isnan(sens[j])) order.push_back(j);
      std::stable_sort(order.begin(), order.end(),
                       [&](std::size_t a, std::size_t b) { return std::abs(sens[a]) > std::abs(sens[b]); });
      for (std::size_t r = 0; r < order.size(); ++r)
        v << csv_field(run.fault_ids[f]) << ',' << csv_field(p.segments[best].segment_id) << ','
          << f3(slip_probability(run, best, K - 1)) << ',' << res.input_names[order[r]] << ','
          << fixed_decimals(sens[order[r]], 3) << ',' << (r + 1) << '\n';
    }
    std::ofstream(folder.output("output.files.sensitivity", "sensitivity.csv"), std::ios::binary) << v.str();

    // Well attribution of the median Δp: per segment and output time, the wells with a share of
    // at least kMedianShareMin (largest first, ties in file order), then one row for the rest.
    std::string m;
    m = "segment_id,fault_id,date,median_realization,dp_MPa,check_point,well_id,wells,well_dp_MPa,share\n";
    for (std::size_t i = 0; i < res.segments.size(); ++i)
      for (std::size_t k = 0; k < res.segments[i].median.size(); ++k) {
        const auto& a = res.segments[i].median[k];
        double total = 0.0;
        for (double dp : a.well_dp) total += dp;
        if (!(total > 0.0)) continue;  // no pressure at the median yet
        std::vector<std::size_t> order(a.well_dp.size());
        for (std::size_t w = 0; w < order.size(); ++w) order[w] = w;
        std::stable_sort(order.begin(), order.end(),
                         [&](std::size_t x, std::size_t y) { return a.well_dp[x] > a.well_dp[y]; });
        const std::string head = csv_field(p.segments[i].segment_id) + ',' + csv_field(p.segments[i].fault_id) + ',' +
                                 util::format_iso_date(s.output.dates[k]) + ',' + std::to_string(a.realization) + ',' +
                                 fixed_decimals(a.dp / kMPa, 6) + ',' + std::to_string(a.check_point) + ',';
        double rest = 0.0;
        std::size_t rest_count = 0;
        for (std::size_t w : order) {
          const double share = a.well_dp[w] / total;
          if (std::abs(share) < kMedianShareMin) {
            rest += a.well_dp[w];
            ++rest_count;
            continue;
          }
          m += head + csv_field(p.wells[w].id) + ",1," + fixed_decimals(a.well_dp[w] / kMPa, 6) + ',' +
               fixed_decimals(share, 6) + '\n';
        }
        if (rest_count > 0)
          m += head + ',' + std::to_string(rest_count) + ',' + fixed_decimals(rest / kMPa, 6) + ',' +
               fixed_decimals(rest / total, 6) + '\n';
      }
    std::ofstream(folder.output("output.files.median_well_shares", "median_well_shares.csv"), std::ios::binary) << m;
  }

  if (s.output.rasters && !res.map_dangerous.empty()) {
    const auto raster = [&](const std::vector<std::uint64_t>& counts, const char* file, const char* key,
                            const std::string& what) {
      std::vector<RasterBand> bands(K);
      for (std::size_t k = 0; k < K; ++k) {
        bands[k].description = util::format_iso_date(s.output.dates[k]);
        bands[k].values.resize(run.map_grid.cell_count());
        for (std::size_t c = 0; c < run.map_grid.cell_count(); ++c)
          bands[k].values[c] = static_cast<float>(static_cast<double>(counts[c * K + k]) / n);
      }
      GeoTiffOptions opt;
      opt.cloud_optimized = s.output.cog;
      opt.unit = "probability";
      opt.metadata = {{"QUANTITY", what},
                      {"REALIZATIONS", std::to_string(res.realizations)},
                      {"CAUTION", kScreeningCaution},
                      {"SCENARIO", s.file}};
      write_geotiff(folder.output(key, file), run.map_grid, p.working, bands, opt);
    };
    raster(res.map_dangerous, "slip_probability_dangerous.tif", "output.files.slip_probability_dangerous",
           "probability that a fault of the most dangerous orientation has slipped by the band date "
           "(injection-induced; " + fixed_decimals(static_cast<double>(res.map_dangerous_already_critical) / n, 4) +
               " of realizations are critical before injection everywhere)");
    if (!res.map_oriented.empty())
      raster(res.map_oriented, "slip_probability_oriented.tif", "output.files.slip_probability_oriented",
             "probability that a fault of strike " + fixed_decimals(*run.map_strike * 180.0 / M_PI, 1) +
                 " deg, dip " + fixed_decimals(*run.map_dip * 180.0 / M_PI, 1) +
                 " deg has slipped by the band date (injection-induced)");
  }
}

nlohmann::json probabilistic_manifest(const ProbabilisticRun& run, const UncertaintySpec& spec) {
  const auto& r = run.result;
  return {{"uncertainty", to_json(spec)},
          {"realizations_valid", r.realizations},
          {"realizations_rejected_unphysical_stress", r.rejected},
          {"realizations_beyond_frictional_limit", r.beyond_frictional_limit},
          {"sampler", std::string(stats::sampling_method_name(r.sampler.method))},
          {"stream", std::string(r.sampler.stream)},
          {"inputs", r.input_names},
          {"diffusivity_range_m2_per_s", {r.diffusivity_min, r.diffusivity_max}},
          {"surrogate_interpolation_error_estimate", r.surrogate_error},
          {"monte_carlo_max_ci_half_width", run.mc_half_width_max},
          {"tracked_times", run.tracked_times.size()},
          {"tracking_grid", kTrackingGridStatement},
          {"map_cell_size_m", run.map_grid.cell_size}};
}

}  // namespace slipscreen::io
