// The report's cost against the run it reports on (docs/report.md, "Speed"): the demo scenario
// (the fictional Marrowick Basin) run without its report, then its report built from the run
// folder (`slipscreen report --reproducible`), timed separately in the same process. Prints the
// times and the ratio (target: the report under 10 % of the run), never asserts. Wall-clock
// times on a shared machine swing with the other processes' load (an OpenMP run more than the
// report), so the processor time of each part (all threads, getrusage) and its ratio are printed too.
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <string>
#include <sys/resource.h>
#include <unistd.h>

#include "run/report_job.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"

using namespace slipscreen;
using Clock = std::chrono::steady_clock;
namespace fs = std::filesystem;

namespace {

double seconds_since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

// User and system time of every thread of this process so far, in seconds.
double cpu_seconds() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  const auto s = [](const timeval& t) { return static_cast<double>(t.tv_sec) + 1e-6 * static_cast<double>(t.tv_usec); };
  return s(u.ru_utime) + s(u.ru_stime);
}

}  // namespace

int main() {
  const fs::path root = SLIPSCREEN_SOURCE_DIR;
  const fs::path out = fs::temp_directory_path() / ("slipscreen-report-bench-" + std::to_string(::getpid()));
  // The demo scenario names its inputs relative to itself and is run from the source folder, as `demo` does.
  fs::current_path(root);
  scenario::ResolvedScenario s = scenario::load_scenario("regions/marrowick/scenario.toml");
  s.output.report = false;
  run::RunOptions o;
  o.out = out;
  o.force = true;
  o.reproducible = true;
  o.command_line = {"report_bench"};

  const auto t0 = Clock::now();
  const double c0 = cpu_seconds();
  run::run_scenario(s, o);
  const double run_s = seconds_since(t0), run_cpu = cpu_seconds() - c0;

  double report_s = 1e300, report_cpu = 1e300;
  std::size_t files = 0;
  for (int i = 0; i < 3; ++i) {  // the fastest of three builds (the first warms the font cache)
    const auto t1 = Clock::now();
    const double c1 = cpu_seconds();
    files = run::rebuild_report(out, {.page = "A4", .reproducible = true, .top = 5}).files.size();
    report_s = std::min(report_s, seconds_since(t1));
    report_cpu = std::min(report_cpu, cpu_seconds() - c1);
  }
  std::error_code ec;
  fs::remove_all(out, ec);

  std::printf("demo run (every screen, %d realizations, no report): %8.3f s\n",
              static_cast<int>(s.uncertainty.realizations.value()), run_s);
  std::printf("report from its run folder (%zu files):            %8.3f s\n", files, report_s);
  std::printf("ratio report / run: %.3f (target < 0.10)\n", report_s / run_s);
  std::printf("processor time, all threads: run %.3f s, report %.3f s, ratio %.3f\n", run_cpu, report_cpu,
              report_cpu / run_cpu);
  return 0;
}
