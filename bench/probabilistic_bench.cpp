// Regional benchmark of the probabilistic screen (issue 5), on the FICTIONAL scenario written by
// tools/make-bench-scenario.py: 200 wells with 20 years of monthly volumes, ~1,000 fault
// segments, 40 output times, a monthly tracking grid and 10,000 Latin hypercube realizations
// with hydrogeology, stress and friction uncertain.
//
// Prints: the wall time of the whole run (slipscreen run, all outputs) against the 60 s target,
// per stage, and its peak memory (ru_maxrss) against 4 GiB; the load average of the machine
// before and after (the cores may be shared); the deterministic screen against the exact
// PressureField sum at every tracked time on a subsample of segments (the method it replaced:
// speed ratio and largest peak-Δp difference); the time of the probabilistic screen alone; and,
// against the plain method on a subsample (every E1 term of every well and rate step evaluated
// directly for each audited realization and segment), the speed ratio per realization, the
// largest difference in P(slip by t) and the largest relative difference in Δp where Δp > 1 kPa.
//   probabilistic_bench [SCENARIO_DIR]   (default: generated into a temporary folder)
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <map>
#include <algorithm>
#include <string>
#include <utility>
#include <vector>

#include "bench_clock.hpp"
#include "core/hydro/pressure_field.hpp"
#include "screening/probabilistic_screen.hpp"
#include "run/run_scenario.hpp"
#include "screening/prepare.hpp"
#include "scenario/scenario.hpp"
#include "scenario/uncertainty.hpp"

namespace fs = std::filesystem;
using slipscreen::bench::Clock;
using slipscreen::bench::load_average;
using slipscreen::bench::since;
using namespace slipscreen;


int main(int argc, char** argv) {
  fs::path dir = argc > 1 ? fs::path(argv[1]) : fs::temp_directory_path() / "slipscreen-bench-scenario";
  if (argc <= 1) {
    const std::string cmd = std::string("python3 '") + SLIPSCREEN_SOURCE_DIR + "/tools/make-bench-scenario.py' '" +
                            dir.string() + "'";
    if (std::system(cmd.c_str()) != 0) {
      std::fprintf(stderr, "probabilistic_bench: could not run %s\n", cmd.c_str());
      return 1;
    }
  }
  const scenario::ResolvedScenario s = scenario::load_scenario(dir / "scenario.toml");

  // 1. The whole run, as `slipscreen run --force` does it.
  run::RunOptions o;
  o.out = dir / "bench-run";
  o.force = true;
  o.command_line = {"probabilistic_bench"};
  // Wall time per stage of the run (a stage lasts until the next one starts).
  std::vector<std::pair<std::string, Clock::time_point>> stages;
  o.progress = [&](const std::string& stage, double) {
    if (stages.empty() || stages.back().first != stage) stages.emplace_back(stage, Clock::now());
  };
  const std::string load_before = load_average();
  auto t0 = Clock::now();
  const screening::RunSummary summary = run::run_scenario(s, o);
  const double t_run = since(t0);
  const auto t_end = Clock::now();
  rusage ru{};
  getrusage(RUSAGE_SELF, &ru);
  const double peak_gib = static_cast<double>(ru.ru_maxrss) / (1024.0 * 1024.0);

  const screening::PreparedRun p = screening::prepare_run(s, false);

  // 2. The deterministic screen's tracking against the exact PressureField sum at every tracked
  // time (the method it replaced) on every 80th segment.
  double t_det = 0.0;
  for (std::size_t i = 0; i + 1 < stages.size(); ++i)
    if (stages[i].first == "pressure at fault segments")
      t_det = std::chrono::duration<double>(stages[i + 1].second - stages[i].second).count();
  std::map<std::string, double> peak_of;
  for (const auto& line : summary.closest) peak_of[line.segment_id] = line.peak_dp;
  std::vector<hydro::WellSource> sources;
  for (const auto& w : p.inputs.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(sources, p.inputs.boundaries);
  std::vector<double> tracked;
  std::merge(p.inputs.tracking_times.begin(), p.inputs.tracking_times.end(), p.inputs.output_times.begin(),
             p.inputs.output_times.end(), std::back_inserter(tracked));
  tracked.erase(std::unique(tracked.begin(), tracked.end()), tracked.end());
  t0 = Clock::now();
  std::vector<std::size_t> sample;
  for (std::size_t i = 0; i < p.segments.size(); i += 40) sample.push_back(i);
  std::vector<double> diff_pa(sample.size()), diff_rel(sample.size());
  std::exception_ptr failure;  // an exception must not leave an OpenMP region
#pragma omp parallel for schedule(dynamic, 1)  // segments over threads (evaluate() then runs serially)
  for (std::size_t j = 0; j < sample.size(); ++j) try {
    std::vector<hydro::FieldPoint> pts;
    for (const auto& c : p.inputs.segments[sample[j]].check_points) pts.push_back({c.x, c.y});
    const auto res = field.evaluate(field.prepare(pts), tracked, p.inputs.formation);
    double peak = 0.0;
    for (double v : res.total) peak = std::max(peak, v);
    diff_pa[j] = std::abs(peak - peak_of.at(p.segments[sample[j]].segment_id));
    diff_rel[j] = peak > 0.0 ? diff_pa[j] / peak : 0.0;
  } catch (...) {
#pragma omp critical(bench_failure)
    if (!failure) failure = std::current_exception();
  }
  if (failure) std::rethrow_exception(failure);
  const double t_exact = since(t0) / static_cast<double>(sample.size()) * static_cast<double>(p.segments.size());
  const double worst_peak = *std::max_element(diff_pa.begin(), diff_pa.end());
  const double worst_peak_rel = *std::max_element(diff_rel.begin(), diff_rel.end());
  const std::size_t exact_segments = sample.size();
  const std::string load_after = load_average();

  // 3. The probabilistic screen alone, auditing a subsample against the plain method.
  const scenario::UncertaintySpec& spec = s.uncertainty;
  std::vector<std::uint64_t> audit_r;
  for (std::uint64_t i = 0; i < 8; ++i) audit_r.push_back(i * 1249);
  std::vector<std::size_t> audit_s;
  for (std::size_t i = 0; i < p.segments.size(); i += p.segments.size() / 12) audit_s.push_back(i);
  t0 = Clock::now();
  const screening::ProbabilisticRun run = screening::run_probabilistic_screen(s, p, spec, audit_r, audit_s);
  const double t_prob = since(t0);

  t0 = Clock::now();
  double worst_dp = 0.0;
  std::size_t mismatched = 0;
  std::map<std::pair<std::size_t, std::size_t>, long> diff;  // (segment, output) -> fast − plain slips
  for (const auto& fast : run.result.audit) {
    const auto plain = probabilistic::plain_slip_check(fast, run.wells, run.segments, run.settings);
    mismatched += fast.first_crossing != plain.first_crossing;
    for (std::size_t k = 0; k < run.settings.output_index.size(); ++k) {
      const auto idx = static_cast<int>(run.settings.output_index[k]);
      const int a = fast.first_crossing >= 0 && fast.first_crossing <= idx;
      const int b = plain.first_crossing >= 0 && plain.first_crossing <= idx;
      diff[{fast.segment, k}] += a - b;
      if (plain.dp_at_output[k] > 1000.0)
        worst_dp = std::max(worst_dp, std::abs(fast.dp_at_output[k] - plain.dp_at_output[k]) / plain.dp_at_output[k]);
    }
  }
  const double t_plain = since(t0);
  double worst_p = 0.0;
  for (const auto& [key, d] : diff) worst_p = std::max(worst_p, std::abs(static_cast<double>(d)) / audit_r.size());
  const double pairs = static_cast<double>(run.result.audit.size());
  const double plain_per_real = t_plain / pairs * static_cast<double>(p.segments.size());
  const double fast_per_real = t_prob / static_cast<double>(run.result.realizations);

  std::printf("probabilistic screen benchmark (fictional regional scenario, %s)\n", dir.string().c_str());
  std::printf("  %zu wells, %zu fault segments x %zu check points, %zu output times, %zu tracking times, %llu "
              "realizations (%s)\n",
              p.wells.size(), p.segments.size(), run.segments.front().check_points.size(), s.output.times.size(),
              run.tracked_times.size(), static_cast<unsigned long long>(run.result.realizations),
              summary.probabilistic ? summary.probabilistic->sampler.c_str() : "?");
  std::printf("  whole run (all outputs):     %7.1f s   (target < 60 s)   peak memory %.2f GiB (target < 4)\n", t_run,
              peak_gib);
  for (std::size_t i = 0; i < stages.size(); ++i)
    std::printf("    %-32s %7.1f s\n", stages[i].first.c_str(),
                std::chrono::duration<double>((i + 1 < stages.size() ? stages[i + 1].second : t_end) - stages[i].second)
                    .count());
  std::printf("  load average (1, 5, 15 min) before the run: %s, after the exact check: %s\n", load_before.c_str(),
              load_after.c_str());
  std::printf("  deterministic screen: %.1f s; exact PressureField at every tracked time (%zu segments, "
              "extrapolated): %.1f s; ratio %.1fx\n",
              t_det, exact_segments, t_exact, t_exact / t_det);
  std::printf("  largest peak-dp difference tables vs exact: %.3g Pa (%.2e relative)\n", worst_peak, worst_peak_rel);
  std::printf("  probabilistic screen alone:  %7.1f s   = %.2f ms per realization\n", t_prob, 1e3 * fast_per_real);
  std::printf("  plain method, %0.f audited (realization, segment) pairs: %.1f s = %.1f s per realization\n", pairs,
              t_plain, plain_per_real);
  std::printf("  ratio plain / fast per realization: %.0fx   (target >= 100x)\n", plain_per_real / fast_per_real);
  std::printf("  largest difference in P(slip by t) on the subsample: %.4f (%zu of %.0f first-crossing times "
              "differ)   (target < 0.002)\n",
              worst_p, mismatched, pairs);
  std::printf("  largest relative difference in dp where dp > 1 kPa: %.2e   (target < 1e-4)\n", worst_dp);
  return 0;
}
