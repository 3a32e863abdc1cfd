// E1 / well function throughput: the project's batched and scalar E1 against Boost.Math
// expint(1, u) (default policy) in the same run, on the same arguments, plus the largest relative
// difference seen. Two argument orders: "ordered" (log-spaced, as along a time series or across
// a grid, where neighbouring arguments fall in the same piece) and "shuffled" (a fixed
// pseudo-random permutation: every vector mixes both pieces, the worst case).
#include <algorithm>
#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <cstdio>
#include <random>
#include <vector>

#include "core/hydro/hantush.hpp"
#include "bench_clock.hpp"
#include "core/hydro/well_function.hpp"

namespace {

using slipscreen::bench::best_seconds;

volatile double g_sink;

void run(const char* label, const std::vector<double>& u) {
  const std::size_t n = u.size();
  std::vector<double> out(n);
  constexpr int kBatchedPasses = 20;
  const double t_batched = best_seconds(7, [&] {
    for (int p = 0; p < kBatchedPasses; ++p) slipscreen::hydro::well_function(u.data(), out.data(), n);
    g_sink = out[n / 2];
  }) / kBatchedPasses;
  const double t_scalar = best_seconds(7, [&] {
    double s = 0;
    for (double x : u) s += slipscreen::hydro::well_function(x);
    g_sink = s;
  });
  const double t_boost = best_seconds(7, [&] {
    double s = 0;
    for (double x : u) s += boost::math::expint(1, x);
    g_sink = s;
  });
  double worst = 0, worst_u = 0;
  slipscreen::hydro::well_function(u.data(), out.data(), n);
  for (std::size_t i = 0; i < n; ++i) {
    const double ref = boost::math::expint(1, u[i]);
    const double e = std::abs(out[i] / ref - 1.0);
    if (e > worst) {
      worst = e;
      worst_u = u[i];
    }
  }
  const double r_batched = n / t_batched, r_scalar = n / t_scalar, r_boost = n / t_boost;
  std::printf("%-9s batched %8.1f M/s   scalar %7.1f M/s   Boost.Math %6.2f M/s   "
              "batched/Boost %5.1fx   scalar/Boost %4.1fx   max rel. error %.2e (u = %.3g)\n",
              label, r_batched / 1e6, r_scalar / 1e6, r_boost / 1e6, r_batched / r_boost,
              r_scalar / r_boost, worst, worst_u);
}

// The leaky well function W(u, r/B) (Hantush & Jacob 1955; core/hydro/hantush.hpp) beside the
// scalar E1 on the same u, for several r/B: evaluations per second and the ratio.
void run_leaky(const std::vector<double>& u_all) {
  std::vector<double> u;
  for (std::size_t i = 0; i < u_all.size(); i += 16) u.push_back(u_all[i]);  // 1024 arguments
  const double t_e1 = best_seconds(5, [&] {
    double s = 0;
    for (double x : u) s += slipscreen::hydro::well_function(x);
    g_sink = s;
  });
  for (double beta : {1e-3, 0.1, 1.0, 5.0}) {
    const double t = best_seconds(3, [&] {
      double s = 0;
      for (double x : u) s += slipscreen::hydro::leaky_well_function(x, beta);
      g_sink = s;
    });
    std::printf("leaky W(u, r/B = %-5g) %8.3f M/s   scalar E1 %7.1f M/s   E1/leaky %6.0fx\n", beta,
                u.size() / t / 1e6, u.size() / t_e1 / 1e6, t / t_e1);
  }
}

}  // namespace

int main() {
  constexpr std::size_t kN = 1 << 14;
  std::vector<double> u(kN);
  const double lo = std::log(1e-12), hi = std::log(700.0);
  for (std::size_t i = 0; i < kN; ++i) u[i] = std::exp(lo + (hi - lo) * (i + 0.5) / kN);
  std::printf("E1(u) evaluations per second, %zu arguments log-spaced over 1e-12 <= u <= 700 "
              "(best of 7)\n", kN);
  run("ordered", u);
  std::shuffle(u.begin(), u.end(), std::mt19937_64(20261201));
  run("shuffled", u);
  std::printf("Target: batched >= 20x Boost.Math at 1e-13 relative accuracy.\n");
  std::printf("Leaky well function, %zu of the same arguments (log-spaced, best of 3):\n", kN / 16);
  std::sort(u.begin(), u.end());
  run_leaky(u);
  return 0;
}
