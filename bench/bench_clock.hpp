#pragma once
// What the benchmarks share: seconds since a time point, and the machine's load average, printed
// beside every figure because the cores may be shared.
#include <chrono>
#include <fstream>
#include <string>

namespace slipscreen::bench {

using Clock = std::chrono::steady_clock;

inline double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

// The 1, 5 and 15 minute load averages from /proc/loadavg ("" when it cannot be read).
inline std::string load_average() {
  std::ifstream f("/proc/loadavg");
  std::string a, b, c;
  f >> a >> b >> c;
  return a + " " + b + " " + c;
}

}  // namespace slipscreen::bench
