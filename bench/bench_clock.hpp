#pragma once
// What the benchmarks share: seconds since a time point, and the machine's load average, printed
// beside every figure because the cores may be shared.
#include <algorithm>
#include <chrono>
#include <ctime>
#include <fstream>
#include <string>

namespace slipscreen::bench {

using Clock = std::chrono::steady_clock;

inline double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

// The shortest wall time of `repeats` calls of f: the figure least disturbed by other jobs.
template <class F>
double best_seconds(int repeats, F&& f) {
  double best = 1e300;
  for (int r = 0; r < repeats; ++r) {
    const auto t0 = Clock::now();
    f();
    best = std::min(best, since(t0));
  }
  return best;
}

// CPU seconds used by the process so far, all threads (CLOCK_PROCESS_CPUTIME_ID): less sensitive
// than wall time to other jobs on shared cores.
inline double cpu_seconds() {
  timespec ts{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
  return static_cast<double>(ts.tv_sec) + 1e-9 * static_cast<double>(ts.tv_nsec);
}

// The 1, 5 and 15 minute load averages from /proc/loadavg ("" when it cannot be read).
inline std::string load_average() {
  std::ifstream f("/proc/loadavg");
  std::string a, b, c;
  f >> a >> b >> c;
  return a + " " + b + " " + c;
}

}  // namespace slipscreen::bench
