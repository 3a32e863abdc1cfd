// Benchmark: Δp on a regional raster — 200 fictional wells with 20 years of monthly history,
// a 500 × 500 grid and 40 output times — by the fast path (tabulated radial profiles) and by
// the direct sum (every pixel, well and rate step), with their throughput, ratio and the error
// of the fast path on a subsample. Prints figures only; it asserts nothing about time.
#include <omp.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <string_view>
#include <numbers>
#include <random>
#include <vector>

#include "core/hydro/pressure_grid.hpp"

using namespace slipscreen::hydro;

namespace {

constexpr double kMonth = 365.25 * 86400.0 / 12.0;

// Uniform in [0, 1) from the raw 64-bit Mersenne Twister output (whose sequence is fixed by the
// standard), so the fictional basin is the same on every platform.
double uniform(std::mt19937_64& rng) { return double(rng() >> 11) * 0x1.0p-53; }

// 200 fictional wells: positions over the map and a 10 km margin, start months over the first
// 12 years, rates log-uniform between 500 and 25000 bbl/d-equivalent (0.001–0.046 m³/s) with a
// monthly wobble, a third of them shut in (rate 0) for good at some month.
std::vector<GridSource> fictional_wells(const GridGeometry& g, int wells, int months) {
  std::mt19937_64 rng(20261201);
  const double w = g.nx * g.cell_x, hgt = g.ny * -g.cell_y, margin = 10000.0;
  std::vector<GridSource> out;
  for (int n = 0; n < wells; ++n) {
    GridSource s;
    s.x = g.origin_x - margin + uniform(rng) * (w + 2 * margin);
    s.y = g.origin_y + margin - uniform(rng) * (hgt + 2 * margin);
    const int first = int(uniform(rng) * 144);
    const int shut = uniform(rng) < 1.0 / 3.0 ? first + 12 + int(uniform(rng) * (months - first)) : months;
    const double q = 0.001 * std::pow(46.0, uniform(rng));
    const double phase = 6.28 * uniform(rng);
    for (int m = first; m < months; ++m) {
      s.start.push_back(m * kMonth);
      s.rate.push_back(m >= shut ? 0.0 : q * (1.0 + 0.25 * std::sin(0.5 * m + phase) * (0.5 + uniform(rng))));
    }
    out.push_back(std::move(s));
  }
  return out;
}

double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

}  // namespace

int main(int argc, char** argv) {
  GridGeometry g;
  g.origin_x = 400000.0;
  g.origin_y = 4300000.0;
  g.cell_x = 200.0;
  g.cell_y = -200.0;
  g.nx = 500;
  g.ny = 500;
  const int months = 240;
  const std::vector<GridSource> wells = fictional_wells(g, 200, months);
  std::vector<double> times;
  for (int k = 1; k <= 40; ++k) times.push_back(k * 6.0 * kMonth);  // every 6 months, 20 years
  // Fictional formation: k = 1e-13 m² (about 100 mD), h = 50 m, μ = 1 mPa·s, φ c_t = 1e-10 1/Pa.
  GridFormation f;
  f.prefactor = 1e-3 / (4.0 * std::numbers::pi * 1e-13 * 50.0);
  f.diffusivity = 1e-13 / (1e-3 * 1e-10);
  f.well_radius = 0.1;

  // Terms of the direct sum per pixel: Σ_k Σ_w (rate steps of w before t_k).
  double terms_per_pixel = 0.0;
  for (double t : times)
    for (const GridSource& s : wells)
      terms_per_pixel += double(std::lower_bound(s.start.begin(), s.start.end(), t) - s.start.begin());
  const double pixels = double(g.nx * g.ny);

  std::printf("pressure_grid_bench: %zu fictional wells, %d months of history, %zux%zu grid, %zu output times, %d threads\n",
              wells.size(), months, g.nx, g.ny, times.size(), omp_get_max_threads());
  std::printf("  pixel·time·well·rate-step terms in the whole grid: %.3e\n", terms_per_pixel * pixels);

  // Fast path, whole grid.
  auto t0 = std::chrono::steady_clock::now();
  std::clock_t c0 = std::clock();
  const PressureGrid fast = pressure_grid(g, f, wells, times);
  const double fast_s = seconds_since(t0), fast_cpu = double(std::clock() - c0) / CLOCKS_PER_SEC;
  const double fast_rate = terms_per_pixel * pixels / fast_s;
  std::printf("  fast path:  whole grid in %.2f s wall (%.2f s CPU over all threads) -> %.3e terms/s\n"
              "              node spacing h = %.4f in ln r, %zu profile nodes, error bound %.3g Pa\n",
              fast_s, fast_cpu, fast_rate, fast.node_spacing, fast.profile_nodes, fast.error_bound);

  if (argc > 1 && std::string_view(argv[1]) == "--fast-only") return 0;  // skip the slow baseline
  // Direct sum on a regular subsample of pixels (every 25th column and row: 400 pixels),
  // extrapolated to the whole grid by the pixel count.
  std::vector<std::size_t> sample_i, sample_j;
  for (std::size_t j = 12; j < g.ny; j += 25)
    for (std::size_t i = 12; i < g.nx; i += 25) {
      sample_i.push_back(i);
      sample_j.push_back(j);
    }
  const std::size_t ns = sample_i.size();
  std::vector<std::vector<double>> direct(ns);
  t0 = std::chrono::steady_clock::now();
  c0 = std::clock();
#pragma omp parallel for schedule(dynamic)
  for (std::size_t p = 0; p < ns; ++p)
    direct[p] = pressure_direct_at(f, wells, g.centre_x(sample_i[p]), g.centre_y(sample_j[p]), times);
  const double direct_s = seconds_since(t0), direct_cpu = double(std::clock() - c0) / CLOCKS_PER_SEC;
  const double direct_rate = terms_per_pixel * double(ns) / direct_s;
  std::printf("  direct sum: %zu-pixel subsample in %.2f s wall (%.2f s CPU) -> %.3e terms/s;\n"
              "              whole grid extrapolated from the subsample by pixel count: %.0f s wall\n",
              ns, direct_s, direct_cpu, direct_rate, direct_s * pixels / double(ns));
  std::printf("  ratio fast / direct throughput: %.0fx\n", fast_rate / direct_rate);

  double worst_rel = 0.0, worst_abs = 0.0;
  std::size_t significant = 0;
  for (std::size_t p = 0; p < ns; ++p)
    for (std::size_t k = 0; k < times.size(); ++k) {
      const double ref = direct[p][k], e = std::abs(fast.at(k, sample_i[p], sample_j[p]) - ref);
      worst_abs = std::max(worst_abs, e);
      if (std::abs(ref) > 1e3) {
        ++significant;
        worst_rel = std::max(worst_rel, e / std::abs(ref));
      }
    }
  std::printf("  fast vs direct on the subsample: max relative error %.2e where |Δp| > 1 kPa (%zu values; stated bound 1e-4), max absolute %.2e Pa (bound %.3g Pa)\n",
              worst_rel, significant, worst_abs, fast.error_bound);
  return 0;
}
