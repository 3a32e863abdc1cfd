// Cost of the three pressure models per (point, time, rate step), and of the 3-D model's fault
// screen in depth per realization, each with its ratio to Theis measured in the same run.
//   Theis:   one E1 term, μ/(4π k h) E1(r²/(4Dt))               (hydro/theis.hpp)
//   leaky:   one W(u, r/B) term (Hantush & Jacob 1955)           (hydro/hantush.hpp)
//   3-D Δp:  one erfc term (Rudnicki 1986)                        (poro/rudnicki.hpp)
//   3-D Δp and Δσ: erfc, erf, exp and a 3×3 tensor                (poro/rudnicki.hpp)
// A realization of the screen in depth (core/poro/fault_screen.hpp) is one depth_screen of a
// fixed geometry; the Theis baseline for it is the same number of (point, time, rate step,
// interval point) terms by exact E1 sums. The Monte Carlo engine of the 3-D model
// (poro/depth_monte_carlo.hpp) is one such screen per realization, by direct sums, with no surrogate.
// Prints figures; asserts nothing about time.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <string>
#include <vector>

#include "bench_clock.hpp"
#include "core/hydro/theis.hpp"
#include "core/poro/depth_monte_carlo.hpp"
#include "core/poro/fault_screen.hpp"
#include "core/poro/rudnicki.hpp"

namespace {

using namespace slipscreen;
using slipscreen::bench::best_seconds;

volatile double g_sink;

poro::RudnickiConstants medium() {
  return poro::rudnicki_constants({6e9, 0.2, 0.33, 0.8, 10.0 * 9.869233e-16, 0.5e-3});
}

}  // namespace

int main() {
  const poro::RudnickiConstants k = medium();
  hydro::TheisParameters theis{k.diffusivity, 0.5e-3 / (4.0 * std::numbers::pi * 10.0 * 9.869233e-16 * 100.0), 0.0};
  hydro::TheisParameters leaky = theis;
  leaky.leakage_rate = theis.diffusivity / (14142.0 * 14142.0);
  // (distance, elapsed time) pairs: 64 distances from 100 m to 20 km × 64 times from 1 day to 20 years
  std::vector<double> r, t;
  for (int i = 0; i < 64; ++i)
    for (int j = 0; j < 64; ++j) {
      r.push_back(100.0 * std::pow(200.0, i / 63.0));
      t.push_back(86400.0 * std::pow(7305.0, j / 63.0));
    }
  const std::size_t n = r.size();
  const Eigen::Vector3d dir = Eigen::Vector3d(0.6, 0.48, 0.64).normalized();
  // Seconds per term of `term(i)` summed over the n (r, t) pairs, best of `repeats`.
  const auto per_term = [&](int repeats, const auto& term) {
    return best_seconds(repeats, [&] {
      double s = 0;
      for (std::size_t i = 0; i < n; ++i) s += term(i);
      g_sink = s;
    }) / static_cast<double>(n);
  };
  const double t_theis = per_term(5, [&](std::size_t i) { return hydro::theis_unit_response(theis, r[i], t[i]); });
  const double t_leaky = per_term(3, [&](std::size_t i) { return hydro::theis_unit_response(leaky, r[i], t[i]); });
  const double t_p3 = per_term(5, [&](std::size_t i) { return poro::point_source_pressure(k, r[i], t[i]); });
  const double t_s3 =
      per_term(5, [&](std::size_t i) { return poro::point_source_response(k, r[i] * dir, t[i]).dstress(0, 1); });
  std::printf("cost per (point, time, rate step), %zu terms:\n", n);
  std::printf("  Theis E1                 %8.1f ns   1.0x\n", t_theis * 1e9);
  std::printf("  leaky W(u, r/B)          %8.1f ns   %.1fx Theis\n", t_leaky * 1e9, t_leaky / t_theis);
  std::printf("  3-D dp (erfc)            %8.1f ns   %.1fx Theis\n", t_p3 * 1e9, t_p3 / t_theis);
  std::printf("  3-D dp and stress tensor %8.1f ns   %.1fx Theis\n", t_s3 * 1e9, t_s3 / t_theis);

  // One realization of the screen in depth: 20 segments × 5 along strike × 3 depths, 1 well of 6
  // interval points with 24 rate steps, 120 tracked times.
  poro::DepthScreenInputs in;
  in.medium = k;
  in.friction = {0.6, 0.0};
  poro::InjectionSource w;
  w.points = poro::open_interval_points(0.0, 0.0, 1900.0, 2000.0, 6);
  for (int j = 0; j < 24; ++j) w.changes.push_back({j * 30.0 * 86400.0, j % 2 ? -0.004 : 0.006});
  in.wells = {w};
  for (int m = 1; m <= 120; ++m) in.tracking_times.push_back(m * 30.0 * 86400.0);
  in.output_times = {in.tracking_times.back()};
  for (int g = 0; g < 20; ++g) {
    std::vector<Eigen::Vector2d> trace;
    for (int i = 0; i < 5; ++i) trace.emplace_back(3000.0 + 400.0 * g, -1000.0 + 500.0 * i);
    poro::DepthSegment seg;
    seg.segment_id = std::to_string(g);  // (a "s" + ... concatenation trips GCC 12's -Wrestrict)
    seg.strike = 0.3;
    seg.dip = 1.4;
    for (const Eigen::Vector3d& p : poro::depth_check_points(trace, 0.3, 1.4, 2000.0, 2100.0, 4100.0, 3))
      seg.points.push_back({p, {25e3 * p.z(), 31e3 * p.z(), 17e3 * p.z(), 1.0, 10e3 * p.z()}});
    in.segments.push_back(std::move(seg));
  }
  const double t_real = best_seconds(3, [&] { g_sink = poro::depth_screen(in).segments[0].peak_dcff; });
  const double terms = 20.0 * 15.0 * 120.0 * 24.0 * 6.0 / 2.0;  // ~half the steps precede a time on average
  const double t_real_theis = best_seconds(3, [&] {
    double s = 0;
    for (int g = 0; g < 20; ++g)
      for (int p = 0; p < 15; ++p)
        for (double tt : in.tracking_times)
          for (const auto& c : w.changes) {
            if (!(c.time < tt)) break;
            for (int q = 0; q < 6; ++q) s += c.delta * hydro::theis_unit_response(theis, 3000.0 + 400.0 * g + q, tt - c.time);
          }
    g_sink = s;
  });
  std::printf("one realization of the screen in depth (20 segments x 15 points, 120 times, 24 steps, 6 interval points,"
              " ~%.2g terms):\n", terms);
  std::printf("  3-D depth_screen         %8.2f ms\n", t_real * 1e3);
  std::printf("  Theis, same terms (E1)   %8.2f ms   3-D / Theis %.1fx\n", t_real_theis * 1e3, t_real / t_real_theis);
  // The Monte Carlo engine of the screen in depth (poro/depth_monte_carlo.hpp) on the same case:
  // 8 realizations with the permeability and friction varied; per realization, all threads.
  std::vector<poro::DepthRealization> draws;
  for (int i = 0; i < 8; ++i)
    draws.push_back({{6e9, 0.2, 0.33, 0.8, (5.0 + i) * 9.869233e-16, 0.5e-3}, 0.55 + 0.01 * i});
  const double t_mc = best_seconds(2, [&] { g_sink = poro::depth_slip_counts(in, draws).slipped[0][0]; }) / 8.0;
  std::printf("  Monte Carlo, per realization (8 realizations, all threads) %8.2f ms   / Theis terms %.1fx\n",
              t_mc * 1e3, t_mc / t_real_theis);
  return 0;
}
