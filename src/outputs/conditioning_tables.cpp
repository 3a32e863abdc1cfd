// The conditioned screen's files; see conditioning_tables.hpp and docs/conditioning.md.
#include "outputs/conditioning_tables.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "screening/conditioning.hpp"
#include "screening/conditioning_summary.hpp"

namespace slipscreen::outputs {
namespace {

using formats::csv_field;
using util::fixed_decimals;
constexpr Quantity P = Quantity::pressure;

// An input's SI unit (posterior_inputs.csv is in SI in either unit system: one row per input,
// so the unit cannot sit in a column name).
const char* si_unit_of(const std::string& name) {
  if (name == "permeability") return "m2";
  if (name.ends_with("_gradient")) return "Pa/m";
  if (name == "cohesion" || name == "a_sigma") return "Pa";
  if (name == "background_rate_per_km") return "1/(s km)";
  if (name == "thickness") return "m";
  if (name == "total_compressibility") return "1/Pa";
  if (name == "viscosity") return "Pa s";
  if (name == "transmissivity") return "m2/s";
  if (name == "shmax_azimuth") return "rad";
  return "1";
}

}  // namespace

std::string conditioned_columns_header(const screening::ProbabilisticRun& run, const OutputUnits& u) {
  if (!run.result.conditioning) return {};
  return ",p_slip_conditioned,p_slip_conditioned_ci_low,p_slip_conditioned_ci_high,p_already_critical_conditioned," +
         u.column("dp_p05_conditioned", P) + ',' + u.column("dp_p50_conditioned", P) + ',' +
         u.column("dp_p95_conditioned", P);
}

std::string conditioned_columns(const screening::ProbabilisticRun& run, std::size_t segment, std::size_t k, double z,
                                const OutputUnits& u) {
  if (!run.result.conditioning) return {};
  const auto& w = run.result.conditioning->weights;
  const auto& c = run.result.segments[segment].conditioned;
  const auto ci = probabilistic::weighted_proportion(c.slipped_by[k], w, z);
  const double crit = static_cast<double>(c.already_critical) / static_cast<double>(w.total);
  return ',' + fixed_decimals(ci.estimate, 4) + ',' + fixed_decimals(ci.lower, 4) + ',' + fixed_decimals(ci.upper, 4) +
         ',' + fixed_decimals(crit, 4) + ',' + u.text(c.dp[k].quantile(0.05), P, 4) + ',' +
         u.text(c.dp[k].quantile(0.5), P, 4) + ',' + u.text(c.dp[k].quantile(0.95), P, 4);
}

std::string conditioned_summary_header(const screening::ProbabilisticRun& run, const OutputUnits& u) {
  if (!run.result.conditioning) return {};
  return ",p_slip_final_conditioned,p_slip_final_conditioned_ci_low,p_slip_final_conditioned_ci_high," +
         u.column("dp_crit_p05_conditioned", P) + ',' + u.column("dp_crit_p50_conditioned", P) + ',' +
         u.column("dp_crit_p95_conditioned", P);
}

std::string conditioned_summary_columns(const screening::ProbabilisticRun& run, std::size_t segment, double z,
                                        const OutputUnits& u) {
  if (!run.result.conditioning) return {};
  const auto& c = run.result.segments[segment].conditioned;
  const auto ci = probabilistic::weighted_proportion(c.slipped_by.back(), run.result.conditioning->weights, z);
  // Δp_crit is empty (no finite value) or carries no weight: empty cells, as the prior's.
  const bool any = c.dp_crit.total_weight() > 0;
  const auto crit = [&](double q) { return any ? u.text(c.dp_crit.quantile(q), P, 4) : std::string(); };
  return ',' + fixed_decimals(ci.estimate, 4) + ',' + fixed_decimals(ci.lower, 4) + ',' + fixed_decimals(ci.upper, 4) +
         ',' + crit(0.05) + ',' + crit(0.5) + ',' + crit(0.95);
}

void write_conditioning_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                               const screening::ProbabilisticRun& run, const OutputUnits& u) {
  if (!run.result.conditioning || !s.observations) return;
  const auto& c = *run.result.conditioning;
  const auto& names = run.result.input_names;

  std::ostringstream t;
  t << "input,unit,prior_p05,prior_p50,prior_p95,posterior_p05,posterior_p50,posterior_p95,width_ratio,median_shift\n";
  std::vector<screening::InputShift> shifts = screening::input_shifts(c, names);
  std::sort(shifts.begin(), shifts.end(), [](const screening::InputShift& a, const screening::InputShift& b) { return a.index < b.index; });
  for (const auto& sh : shifts) {
    const auto& a = c.input_prior[sh.index];
    const auto& b = c.input_posterior[sh.index];
    t << csv_field(sh.input) << ',' << si_unit_of(sh.input);
    for (double v : {a.p05, a.p50, a.p95, b.p05, b.p50, b.p95}) t << ',' << util::number_text(v, 6);
    t << ',' << fixed_decimals(sh.width_ratio, 4) << ',' << fixed_decimals(sh.median_shift, 4) << '\n';
  }
  formats::write_text_file(folder.output("output.files.posterior_inputs", "posterior_inputs.csv"), t.str());

  std::ostringstream f;
  f << "observation_id,date,x,y," << u.column("observed_dp", P) << ',' << u.column("sigma", P) << ','
    << u.column("prior_p05", P) << ',' << u.column("prior_p50", P) << ',' << u.column("prior_p95", P) << ','
    << u.column("conditioned_p05", P) << ',' << u.column("conditioned_p50", P) << ','
    << u.column("conditioned_p95", P) << '\n';
  const auto& obs = run.settings.observations;
  for (std::size_t o = 0; o < obs.size(); ++o) {
    const auto& spec = s.observations->pressure.at(o);
    f << csv_field(spec.id) << ',' << util::format_iso_date(spec.date) << ',' << fixed_decimals(obs[o].x, 1) << ','
      << fixed_decimals(obs[o].y, 1);
    for (double v : {obs[o].observed, obs[o].sigma, c.fit_prior[o].p05, c.fit_prior[o].p50, c.fit_prior[o].p95,
                     c.fit_posterior[o].p05, c.fit_posterior[o].p50, c.fit_posterior[o].p95})
      f << ',' << u.text(v, P, 4);
    f << '\n';
  }
  formats::write_text_file(folder.output("output.files.observation_fit", "observation_fit.csv"), f.str());
}

std::vector<ReadmeFile> conditioning_readme(const screening::ProbabilisticRun& run, units::UnitSystem system) {
  if (!run.result.conditioning) return {};
  const std::string pressure(OutputUnits(system).symbol(Quantity::pressure));
  return {{"posterior_inputs.csv", "conditioned screen: P5/P50/P95 of each uncertain input under the prior and weighted "
                                   "by the observations' likelihood, with the ratio of widths (docs/conditioning.md)"},
          {"observation_fit.csv", "conditioned screen: each pressure observation (" + pressure +
                                      ") with its sigma and the modelled dp P5/P50/P95 under the prior and conditioned"}};
}

nlohmann::json conditioning_manifest(const scenario::ResolvedScenario& s, const screening::ProbabilisticRun& run) {
  const auto& c = *run.result.conditioning;
  nlohmann::json j = {{"method", "importance weights of the prior realizations by the Gaussian likelihood of the "
                                 "observed pressure changes (docs/conditioning.md)"},
                      {"pressure_observations", run.settings.observations.size()},
                      {"effective_sample_size", c.weights.n_eff},
                      {"max_log_likelihood", c.weights.max_log_likelihood},
                      {"weight_units", probabilistic::kWeightUnits},
                      {"interval", "Wilson with n = effective sample size (an approximation)"}};
  if (s.observations) {
    j["pressure_file"] = s.observations->pressure_file;
    j["model_error_Pa"] = s.observations->model_error;
    j["at_injector"] = s.observations->at_injector;
  }
  if (run.seismicity) {  // only when given (pressure-only manifests stay unchanged)
    const auto& u = *run.seismicity;
    j["method"] = "importance weights of the prior realizations by the likelihood of the observed pressure changes "
                  "(Gaussian) and of the observed earthquakes (Poisson point process) (docs/conditioning.md)";
    j["seismicity"] = {{"method", "Poisson point-process log-likelihood (Ogata 1988) of the catalog's events at or above "
                                  "Mc, Dieterich (1994) rate per fault segment from each realization's Coulomb history, "
                                  "independent segments, a background pool of constant rate (docs/conditioning.md)"},
                       {"summary", screening::seismicity_sentence(u)},
                       {"mc", u.mc},
                       {"distance_m", u.distance},
                       {"window_start", formats::format_iso8601_utc(u.data.t0)},
                       {"window_end", formats::format_iso8601_utc(u.data.t1)},
                       {"catalog_events", u.catalog_events},
                       {"events_used", u.used},
                       {"events_assigned", u.assigned},
                       {"events_in_pool", u.pool},
                       {"events_below_mc", u.below_mc},
                       {"events_outside_window", u.outside_window},
                       {"pool_rate_per_s", u.data.pool_rate},
                       {"realizations_beyond_rate_domain", c.seismicity_beyond_domain}};
  }
  const std::string warning = screening::low_effective_sample_warning(c.weights.n_eff, run.result.realizations);
  if (!warning.empty()) j["warning"] = warning;
  return j;
}

}  // namespace slipscreen::outputs
