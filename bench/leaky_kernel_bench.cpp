// Cost of the leaky well function where runs pay for it: the lag kernel of the similarity tables
// (hydro/similarity_table.hpp), one W(u, r/B) (Hantush & Jacob 1955) per (table node, whole-day
// lag) in place of one batched E1, both built on one thread over the same grid. The ratio is the
// factor screening/run_cost.hpp counts a leaky term as (kLeakyWellFunctionCost); it depends on
// the leakage, so two leakage factors B are timed. Prints figures; asserts nothing about time.
#include <omp.h>

#include <cmath>
#include <cstdio>

#include "bench_clock.hpp"
#include "core/hydro/similarity_table.hpp"

namespace {

using namespace slipscreen;

double kernel_seconds(const hydro::SimilarityGrid& g, std::size_t lags, int repeats) {
  return bench::best_seconds(repeats, [&] {
    const hydro::LagKernel k(g, 86400.0, lags);
    if (k.row(lags)[0] < 0) std::printf("?");  // keeps the kernel alive
  });
}

}  // namespace

int main() {
  omp_set_num_threads(1);
  // A regional grid: D = 0.5 m²/s, from a 0.1 m well radius to 20 km, one year of daily lags.
  const double d = 0.5, rw = 0.1, r_max = 20e3;
  const std::size_t lags = 365;
  hydro::SimilarityGrid g{std::log(rw * rw / (4 * d)) - 0.1, std::log(r_max * r_max / (4 * d)) + 0.1, 0.025, 0.0};
  std::printf("lag kernel, %zu nodes x %zu daily lags, one thread (load average %s):\n", g.node_count(), lags,
              bench::load_average().c_str());
  const double theis = kernel_seconds(g, lags, 25);
  std::printf("  Theis E1 (batched)     %9.4f s   1.0x\n", theis);
  for (double b : {1e3, 1e5}) {
    g.leakage_rate = d / (b * b);
    const double leaky = kernel_seconds(g, lags, 1);
    std::printf("  leaky W, B = %6.0f m   %9.4f s   %.0fx E1\n", b, leaky, leaky / theis);
  }
  return 0;
}
