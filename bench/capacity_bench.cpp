// Benchmark of the allowable rate and a what-if variant (issue 13): what [capacity] and one
// [[what_if]] add to the probabilistic screen's time, on the FICTIONAL demo scenario (regions/marrowick: 220 segments, 14 wells, 2,000
// realizations, group MW-P1). Prints the probabilistic screen's time without the group and with
// it (the group's pressure model, f_crit for every realization and segment), the answers' time
// (allowable factors, deterministic answer), each the best of 3 runs, and the added share
// against the 30 % target. The baseline is the same screen without [capacity], in the same run.
// With it, one what-if variant (the scenario's first [[what_if]], or half the rates of the
// group's wells from the capacity date or 2027-02-01 when it has none).
//   capacity_bench [SCENARIO]   (default: regions/marrowick/scenario.toml)
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <exception>
#include <filesystem>
#include <fstream>
#include <string>

#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/capacity.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "screening/what_if.hpp"

using Clock = std::chrono::steady_clock;
using namespace slipscreen;

static double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

static std::string load_average() {
  std::ifstream f("/proc/loadavg");
  std::string a, b, c;
  f >> a >> b >> c;
  return a + " " + b + " " + c;
}

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
  const screening::PreparedRun p = screening::prepare_run(with, false);
  const screen::ScreenResult det = screen::deterministic_screen(p.inputs);
  std::printf("capacity_bench: %s, %zu segments, %zu wells, %llu realizations; load average before %s\n",
              path.string().c_str(), p.segments.size(), p.wells.size(),
              static_cast<unsigned long long>(with.uncertainty.realizations.value()), load_average().c_str());
  double base = 1e300, screen_with = 1e300, answer = 1e300;
  for (int rep = 0; rep < 3; ++rep) {
    auto t0 = Clock::now();
    const auto plain = screening::run_probabilistic_screen(without, p, without.uncertainty);
    base = std::min(base, since(t0));
    t0 = Clock::now();
    auto prob = screening::run_probabilistic_screen(with, p, with.uncertainty);
    screen_with = std::min(screen_with, since(t0));
    t0 = Clock::now();
    const auto cap = screening::capacity_answer(with, p, det, prob);
    const auto wi = screening::what_if_result(with, p, prob);
    answer = std::min(answer, since(t0));
    if (rep == 0)
      std::printf("  answer (upper end of the Wilson interval) at the first threshold %.3g: f <= %.4g\n",
                  cap.thresholds.front().threshold, cap.thresholds.front().wilson.allowed);
    (void)plain;
    (void)wi;
  }
  const double added = screen_with - base + answer;
  std::printf("  probabilistic screen without [capacity] (baseline): %.3f s\n", base);
  std::printf("  with the group kept apart and one what-if variant:  %.3f s\n", screen_with);
  std::printf("  answers (allowable factors, deterministic answer, what-if table): %.3f s\n", answer);
  std::printf("  added by [capacity] and one [[what_if]]: %.3f s = %.1f %% of the baseline (target < 30 %%; ratio %.3f)\n", added,
              100.0 * added / base, (base + added) / base);
  std::printf("  load average after %s (the cores may be shared)\n", load_average().c_str());
  return 0;
} catch (const std::exception& e) {
  std::fprintf(stderr, "capacity_bench: %s\n", e.what());
  return 1;
}
