#include "outputs/probabilistic_tables.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "core/caution.hpp"
#include "core/stats/wilson_interval.hpp"
#include "formats/files/text_file.hpp"
#include "formats/gis/geotiff.hpp"
#include "outputs/conditioning_tables.hpp"
#include "outputs/gis_styles.hpp"
#include "outputs/styled_raster.hpp"
#include "formats/table/csv.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::outputs {
using formats::csv_field;
using util::fixed_decimals;

namespace {


// What every table and raster of the probabilistic screen needs.
struct Context {
  const formats::RunFolder& folder;
  const scenario::ResolvedScenario& s;
  const screening::PreparedRun& p;
  const screening::ProbabilisticRun& run;
  double n;       // valid realizations
  double z;       // z of the Wilson interval's confidence
  std::size_t K;  // output times
  OutputUnits units;
};

constexpr Quantity P = Quantity::pressure;
std::string f3(double v) { return fixed_decimals(v, 4); }

// segment_probability.csv: P(slip by t) per segment and output time with its interval.
void write_segment_probability(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
  std::ostringstream t;
  t << "segment_id,fault_id,date,p_slip,p_slip_ci_low,p_slip_ci_high,p_already_critical," << u.column("dp_p05", P)
    << ',' << u.column("dp_p50", P) << ',' << u.column("dp_p95", P) << ",thresholds_reached"
    << conditioned_columns_header(run, u) << '\n';
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
        << u.text(seg.dp[k].quantile(0.05), P, 4) << ',' << u.text(seg.dp[k].quantile(0.5), P, 4) << ','
        << u.text(seg.dp[k].quantile(0.95), P, 4) << ',' << reached << conditioned_columns(run, i, k, z, u) << '\n';
    }
  }
  formats::write_text_file(folder.output("output.files.segment_probability", "segment_probability.csv"), t.str());
}

// segment_probability_summary.csv: per segment, Δp_crit percentiles, final P and first dates.
void write_probability_summary(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
  std::ostringstream t;
  t << "segment_id,fault_id," << u.column("dp_crit_p05", P) << ',' << u.column("dp_crit_p50", P) << ','
    << u.column("dp_crit_p95", P)
    << ",p_already_critical,p_never_critical,p_slip_final,p_slip_final_ci_low,p_slip_final_ci_high";
  for (double th : run.thresholds) t << ",first_date_p_" << fixed_decimals(th, 3);
  t << conditioned_summary_header(run, u) << '\n';
  for (std::size_t i = 0; i < res.segments.size(); ++i) {
    const auto& seg = res.segments[i];
    const auto ci = stats::wilson_interval(seg.slipped_by[K - 1], res.realizations, z);
    const bool any = !seg.dp_crit.empty();
    const auto dp_crit = [&](double q) { return any ? u.text(seg.dp_crit.quantile(q), P, 4) : ""; };
    t << csv_field(p.segments[i].segment_id) << ',' << csv_field(p.segments[i].fault_id) << ',' << dp_crit(0.05)
      << ',' << dp_crit(0.5) << ',' << dp_crit(0.95) << ',' << f3(static_cast<double>(seg.already_critical) / n)
      << ',' << f3(static_cast<double>(seg.never_critical) / n) << ',' << f3(ci.estimate) << ',' << f3(ci.lower)
      << ',' << f3(ci.upper);
    for (double th : run.thresholds) t << ',' << screening::first_date_reaching(run, i, th);
    t << conditioned_summary_columns(run, i, z, u) << '\n';
  }
  formats::write_text_file(folder.output("output.files.segment_probability_summary", "segment_probability_summary.csv"), t.str());
}

// dp_crit_quantiles.csv: the distribution of Δp_crit over the realizations for the segments
// closest to slipping (docs/outputs.md), read from the same quantile sketches as the P5/P50/P95
// of segment_probability_summary.csv.
void write_dp_crit_quantiles(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
  std::vector<std::size_t> order;
  for (std::size_t i = 0; i < res.segments.size(); ++i)
    if (!res.segments[i].dp_crit.empty()) order.push_back(i);
  std::vector<double> median(res.segments.size(), 0.0);
  for (std::size_t i : order) median[i] = res.segments[i].dp_crit.quantile(0.5);
  // Highest final P(slip) first; ties: lowest median Δp_crit, then file order.
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    const auto pa = res.segments[a].slipped_by[K - 1], pb = res.segments[b].slipped_by[K - 1];
    return pa != pb ? pa > pb : median[a] < median[b];
  });
  if (order.size() > kDpCritQuantileSegments) order.resize(kDpCritQuantileSegments);
  std::string t = "segment_id,fault_id,rank,quantile," + u.column("dp_crit", P) + "\n";
  for (std::size_t r = 0; r < order.size(); ++r) {
    const auto& seg = res.segments[order[r]];
    const std::string head = csv_field(p.segments[order[r]].segment_id) + ',' +
                             csv_field(p.segments[order[r]].fault_id) + ',' + std::to_string(r + 1) + ',';
    for (int q = 1; q <= 99; ++q)
      t += head + fixed_decimals(q / 100.0, 2) + ',' + u.text(seg.dp_crit.quantile(q / 100.0), P, 6) + '\n';
  }
  formats::write_text_file(folder.output("output.files.dp_crit_quantiles", "dp_crit_quantiles.csv"), t);
}

// sensitivity.csv: per fault, at its segment with the highest final probability (ties: file order).
void write_sensitivity(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
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
        << f3(screening::slip_probability(run, best, K - 1)) << ',' << res.input_names[order[r]] << ','
        << fixed_decimals(sens[order[r]], 3) << ',' << (r + 1) << '\n';
  }
  formats::write_text_file(folder.output("output.files.sensitivity", "sensitivity.csv"), v.str());
}

// median_well_shares.csv: each well's share of the median realization's Δp.
void write_median_well_shares(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
  // Well attribution of the median Δp: per segment and output time, the wells with a share of
  // at least screening::kMedianShareMin (largest first, ties in file order), then one row for the rest.
  std::string m;
  m = "segment_id,fault_id,date,median_realization," + u.column("dp", P) + ",check_point,well_id,wells," +
      u.column("well_dp", P) + ",share\n";
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
                               u.text(a.dp, P, 6) + ',' + std::to_string(a.check_point) + ',';
      double rest = 0.0;
      std::size_t rest_count = 0;
      for (std::size_t w : order) {
        const double share = a.well_dp[w] / total;
        if (std::abs(share) < screening::kMedianShareMin) {
          rest += a.well_dp[w];
          ++rest_count;
          continue;
        }
        m += head + csv_field(p.wells[w].id) + ",1," + u.text(a.well_dp[w], P, 6) + ',' +
             fixed_decimals(share, 6) + '\n';
      }
      if (rest_count > 0)
        m += head + ',' + std::to_string(rest_count) + ',' + u.text(rest, P, 6) + ',' +
             fixed_decimals(rest / total, 6) + '\n';
    }
  formats::write_text_file(folder.output("output.files.median_well_shares", "median_well_shares.csv"), m);
}

// slip_probability_dangerous.tif and slip_probability_oriented.tif.
void write_probability_rasters(const Context& c) {
  const auto& [folder, s, p, run, n, z, K, u] = c;
  const auto& res = run.result;
  const auto raster = [&](const std::vector<std::uint64_t>& counts, const char* file, const char* key,
                          const std::string& what) {
    std::vector<formats::RasterBand> bands(K);
    for (std::size_t k = 0; k < K; ++k) {
      bands[k].description = util::format_iso_date(s.output.dates[k]);
      bands[k].values.resize(run.map_grid.cell_count());
      for (std::size_t cell = 0; cell < run.map_grid.cell_count(); ++cell)
        bands[k].values[cell] = static_cast<float>(static_cast<double>(counts[cell * K + k]) / n);
    }
    formats::GeoTiffOptions opt;
    opt.cloud_optimized = s.output.cog;
    opt.unit = "probability";
    opt.metadata = {{"QUANTITY", what},
                    {"REALIZATIONS", std::to_string(res.realizations)},
                    {"CAUTION", kScreeningCaution},
                    {"SCENARIO", s.file}};
    write_styled_geotiff(folder, key, file, run.map_grid, p.working, bands, opt,
                         probability_raster_qml(static_cast<int>(K)));
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

}  // namespace

void write_probabilistic_outputs(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                                 const screening::PreparedRun& p, const screening::ProbabilisticRun& run) {
  const Context c{folder, s, p, run, static_cast<double>(run.result.realizations),
                  stats::z_for_confidence(run.confidence), s.output.times.size(), OutputUnits(s.output.units)};
  if (s.output.tables) {
    write_segment_probability(c);
    write_probability_summary(c);
    write_dp_crit_quantiles(c);
    write_sensitivity(c);
    write_median_well_shares(c);
    write_conditioning_tables(folder, s, run, c.units);
  }
  if (s.output.rasters && !run.result.map_dangerous.empty()) write_probability_rasters(c);
}

std::vector<ReadmeFile> probabilistic_readme(const screening::ProbabilisticRun& run, units::UnitSystem system) {
  const std::string n = std::to_string(run.result.realizations) + " realizations";
  const std::string pressure(OutputUnits(system).symbol(Quantity::pressure));
  std::vector<ReadmeFile> files{{"segment_probability.csv", "probabilistic screen: P(slip by date) per fault segment and output time with "
                                      "its Wilson interval, and dp percentiles (" + pressure + "), over " + n},
          {"segment_probability_summary.csv", "probabilistic screen: per fault segment, dp_crit percentiles (" + pressure +
                                              "), the final P(slip) and the first date (monthly tracking grid) each threshold is reached"},
          {"dp_crit_quantiles.csv", "probabilistic screen: quantiles 0.01 to 0.99 of dp_crit (" + pressure + ") over the "
                                    "realizations, for the " + std::to_string(kDpCritQuantileSegments) +
                                    " fault segments with the highest final P(slip)"},
          {"sensitivity.csv", "probabilistic screen: per fault, Spearman's rho of each sampled input against the slip "
                              "margin, ranked"},
          {"median_well_shares.csv", "probabilistic screen: the wells that make the median realization's dp, per fault "
                                     "segment and output time"},
          {"slip_probability_dangerous.tif", "probabilistic screen: GeoTIFF of P(slip) of a fault of the most dangerous "
                                             "orientation, one band per output time"},
          {"slip_probability_oriented.tif", "probabilistic screen: GeoTIFF of P(slip) of a fault of the orientation of "
                                            "[uncertainty.maps], one band per output time"}};
  for (const char* raster : {"slip_probability_dangerous.tif", "slip_probability_oriented.tif"})
    for (auto& f : style_sidecar_readme(raster)) files.push_back(std::move(f));
  for (auto& f : conditioning_readme(run, system)) files.push_back(std::move(f));
  return files;
}

nlohmann::json probabilistic_manifest(const scenario::ResolvedScenario& s, const screening::ProbabilisticRun& run) {
  const auto& r = run.result;
  nlohmann::json j = {{"uncertainty", scenario::to_json(run.spec)},
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
          {"tracking_grid", screening::kTrackingGridStatement},
          {"map_cell_size_m", run.map_grid.cell_size}};
  if (r.conditioning) j["conditioning"] = conditioning_manifest(s, run);  // only when conditioned
  return j;
}

}  // namespace slipscreen::outputs
