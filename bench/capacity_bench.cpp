// Benchmark of the allowable rate and a what-if variant (issue 13): what [capacity] and one
// [[what_if]] add to the probabilistic screen's time, on the FICTIONAL demo scenario
// (regions/marrowick: 220 segments, 14 wells, 2,000 realizations, group MW-P1). Prints the
// probabilistic screen's time without either (the baseline, in the same run), with [capacity]
// only, with the what-if only and with both, each the best of 3 interleaved runs, then the
// answers' time (allowable factors, deterministic answer, what-if table) and the added share
// against the 30 % target. The what-if is the scenario's first [[what_if]], or half the rates of
// the group's wells from the capacity date or 2027-02-01 when it has none.
//   capacity_bench [SCENARIO]   (default: regions/marrowick/scenario.toml)
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <exception>
#include <filesystem>
#include <fstream>
#include <string>

#include "bench_clock.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/capacity.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "screening/what_if.hpp"

using slipscreen::bench::Clock;
using slipscreen::bench::cpu_seconds;
using slipscreen::bench::load_average;
using slipscreen::bench::since;
using namespace slipscreen;


int main(int argc, char** argv) try {
  const std::filesystem::path path =
      argc > 1 ? std::filesystem::path(argv[1])
               : std::filesystem::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick/scenario.toml";
  scenario::ResolvedScenario with = scenario::load_scenario(path);
  if (!with.capacity || !with.uncertainty.given) {
    std::fprintf(stderr, "capacity_bench: %s has no [capacity] and [uncertainty]\n", path.string().c_str());
    return 1;
  }
  if (with.what_if.size() > 1) with.what_if.resize(1);
  if (with.what_if.empty()) {
    scenario::WhatIfSpec w;
    w.name = "half";
    w.wells = with.capacity->wells;
    w.factor = 0.5;
    w.from = with.capacity->from.value_or(1801440000.0);  // 2027-02-01T00:00:00Z
    with.what_if.push_back(w);
  }
  scenario::ResolvedScenario without = with;
  without.capacity.reset();
  without.what_if.clear();
  scenario::ResolvedScenario capacity_only = with, what_if_only = with;
  capacity_only.what_if.clear();
  what_if_only.capacity.reset();
  const screening::PreparedRun p = screening::prepare_run(with, false);
  const screen::ScreenResult det = screen::deterministic_screen(p.inputs);
  std::printf("capacity_bench: %s, %zu segments, %zu wells, %llu realizations; load average before %s\n",
              path.string().c_str(), p.segments.size(), p.wells.size(),
              static_cast<unsigned long long>(with.uncertainty.realizations.value()), load_average().c_str());
  // Best of 3 of each screen, the four interleaved so that a change in the machine's load falls
  // on all of them alike.
  // Wall time, and CPU time of all threads (steadier when other jobs share the cores).
  struct Best {
    double wall = 1e300, cpu = 1e300;
  } base, t_cap, t_what, t_both, answer;
  const auto best = [](Best& b, const auto& f) {
    const auto t0 = Clock::now();
    const double c0 = cpu_seconds();
    f();
    b.cpu = std::min(b.cpu, cpu_seconds() - c0);
    b.wall = std::min(b.wall, since(t0));
  };
  for (int rep = 0; rep < 3; ++rep) {
    best(base, [&] { (void)screening::run_probabilistic_screen(without, p, without.uncertainty); });
    best(t_cap, [&] { (void)screening::run_probabilistic_screen(capacity_only, p, capacity_only.uncertainty); });
    best(t_what, [&] { (void)screening::run_probabilistic_screen(what_if_only, p, what_if_only.uncertainty); });
    screening::ProbabilisticRun prob;
    best(t_both, [&] { prob = screening::run_probabilistic_screen(with, p, with.uncertainty); });
    best(answer, [&] {
      const auto cap = screening::capacity_answer(with, p, det, prob);
      const auto wi = screening::what_if_result(with, p, prob);
      if (rep == 0)
        std::printf("  answer (upper end of the Wilson interval) at the first threshold %.3g: f <= %.4g\n",
                    cap.thresholds.front().threshold, cap.thresholds.front().wilson.allowed);
      (void)wi;
    });
  }
  const auto share = [&](const Best& t, const Best& b) {
    char line[96];
    std::snprintf(line, sizeof line, "%.3f s (%+.1f %%), CPU %.3f s (%+.1f %%)", t.wall, 100.0 * (t.wall - b.wall) / b.wall,
                  t.cpu, 100.0 * (t.cpu - b.cpu) / b.cpu);
    return std::string(line);
  };
  std::printf("  probabilistic screen without [capacity] and [[what_if]] (baseline): %.3f s, CPU %.3f s\n", base.wall,
              base.cpu);
  std::printf("  with [capacity] only:                 %s\n", share(t_cap, base).c_str());
  std::printf("  with one [[what_if]] only:            %s\n", share(t_what, base).c_str());
  std::printf("  with both:                            %s\n", share(t_both, base).c_str());
  std::printf("  answers (allowable factors, deterministic answer, what-if table): %.3f s, CPU %.3f s\n", answer.wall,
              answer.cpu);
  const double added = t_both.wall - base.wall + answer.wall, added_cpu = t_both.cpu - base.cpu + answer.cpu;
  std::printf("  added by [capacity] and one [[what_if]]: %.3f s = %.1f %% of the baseline (target < 30 %%; ratio %.3f); "
              "CPU %.3f s = %.1f %% (ratio %.3f)\n",
              added, 100.0 * added / base.wall, (base.wall + added) / base.wall, added_cpu, 100.0 * added_cpu / base.cpu,
              (base.cpu + added_cpu) / base.cpu);
  std::printf("  load average after %s (the cores may be shared)\n", load_average().c_str());
  return 0;
} catch (const std::exception& e) {
  std::fprintf(stderr, "capacity_bench: %s\n", e.what());
  return 1;
}
