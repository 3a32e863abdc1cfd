// Benchmark of conditioning on observed pressures (issue 15; docs/conditioning.md) on the
// FICTIONAL demo scenario (regions/marrowick), whose observations tools/make-demo-observations.py
// generated from a stated true parameter set (permeability 45 mD, porosity 0.07). Prints:
//   - the probabilistic screen's time without [observations] (the baseline, in the same run) and
//     with them, each the best of 3 runs, and their ratio;
//   - n_eff, and for every uncertain input the prior and posterior P5–P95 with the ratio of
//     widths; for permeability and porosity whether the true value lies inside the posterior
//     P5–P95 (figures only: nothing is asserted here; the tests assert on a small case);
//   - with [catalog.rate_state]: the time with the seismicity likelihood added, and its ratios.
//   conditioning_bench [SCENARIO]   (default: regions/marrowick/scenario.toml)
#include <chrono>
#include <cstdio>
#include <exception>
#include <filesystem>
#include <fstream>
#include <limits>
#include <string>

#include "bench_clock.hpp"
#include "scenario/scenario.hpp"
#include "screening/conditioning_summary.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"

using slipscreen::bench::Clock;
using slipscreen::bench::load_average;
using slipscreen::bench::since;
using namespace slipscreen;


int main(int argc, char** argv) try {
  const std::filesystem::path path =
      argc > 1 ? std::filesystem::path(argv[1])
               : std::filesystem::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick/scenario.toml";
  const scenario::ResolvedScenario with = scenario::load_scenario(path);
  if (!with.observations || !with.uncertainty.given) {
    std::fprintf(stderr, "conditioning_bench: %s has no [observations] and [uncertainty]\n", path.string().c_str());
    return 1;
  }
  scenario::ResolvedScenario without = with;
  without.observations.reset();
  const screening::PreparedRun p = screening::prepare_run(with, false);
  std::printf("conditioning_bench: %s, %zu segments, %zu wells, %llu realizations, %zu observations; load average "
              "before %s\n",
              path.string().c_str(), p.segments.size(), p.inputs.wells.size(),
              static_cast<unsigned long long>(with.uncertainty.realizations.value()), with.observations->pressure.size(),
              load_average().c_str());
  double t_without = std::numeric_limits<double>::infinity(), t_with = t_without;
  screening::ProbabilisticRun run;
  for (int rep = 0; rep < 3; ++rep) {
    auto t0 = Clock::now();
    screening::run_probabilistic_screen(without, p, without.uncertainty);
    t_without = std::min(t_without, since(t0));
    t0 = Clock::now();
    run = screening::run_probabilistic_screen(with, p, with.uncertainty);
    t_with = std::min(t_with, since(t0));
  }
  std::printf("probabilistic screen, best of 3: without observations %.3f s (baseline), with %.3f s, ratio %.3f\n",
              t_without, t_with, t_with / t_without);
  const auto& c = *run.result.conditioning;
  std::printf("effective sample size %.1f of %llu realizations\n", c.weights.n_eff,
              static_cast<unsigned long long>(run.result.realizations));
  std::printf("%-26s %14s %14s %14s %14s %8s\n", "input", "prior P5", "prior P95", "posterior P5", "posterior P95",
              "width ratio");
  for (std::size_t j = 0; j < c.input_prior.size(); ++j) {
    if (!c.input_uncertain[j]) continue;
    const auto& a = c.input_prior[j];
    const auto& b = c.input_posterior[j];
    std::printf("%-26s %14.6g %14.6g %14.6g %14.6g %8.3f\n", run.result.input_names[j].c_str(), a.p05, a.p95, b.p05,
                b.p95, (b.p95 - b.p05) / (a.p95 - a.p05));
  }
  // The true values of tools/make-demo-observations.py (the demo's defaults only).
  const double truth_k = 45.0 * 9.869233e-16, truth_phi = 0.07;
  for (std::size_t j = 0; j < c.input_prior.size(); ++j) {
    const std::string& n = run.result.input_names[j];
    if (n != "permeability" && n != "porosity") continue;
    const double t = n == "permeability" ? truth_k : truth_phi;
    std::printf("true %s %.6g: %s the posterior P5-P95\n", n.c_str(), t,
                c.input_posterior[j].p05 <= t && t <= c.input_posterior[j].p95 ? "inside" : "OUTSIDE");
  }
  // The seismicity likelihood ([observations] seismicity = true; docs/conditioning.md) on the same
  // scenario when it has [catalog.rate_state]: one rate-state pass per (realization, segment).
  if (with.catalog && with.catalog->rate_state) {
    scenario::ResolvedScenario seis = with;
    seis.observations->seismicity = true;
    double t_seis = std::numeric_limits<double>::infinity();
    screening::ProbabilisticRun rs;
    for (int rep = 0; rep < 3; ++rep) {
      const auto t0 = Clock::now();
      rs = screening::run_probabilistic_screen(seis, p, seis.uncertainty);
      t_seis = std::min(t_seis, since(t0));
    }
    std::printf("with the seismicity likelihood too, best of 3: %.3f s, ratio %.3f to the baseline, %.3f to pressures "
                "only; n_eff %.1f\n",
                t_seis, t_seis / t_without, t_seis / t_with, rs.result.conditioning->weights.n_eff);
    std::printf("  %s\n", screening::seismicity_sentence(*rs.seismicity).c_str());
  }
  return 0;
} catch (const std::exception& e) {
  std::fprintf(stderr, "conditioning_bench: %s\n", e.what());
  return 1;
}
