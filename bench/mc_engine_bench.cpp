// Benchmark of the Monte Carlo pore-pressure engine on a fictional regional case:
// 200 wells with 20 years of monthly rates, 1,000 fault segments (3 check points each),
// a monthly tracking grid over 25 years, 40 output times and 10,000 realizations with an
// uncertain diffusivity and prefactor. Prints the time of each stage, and compares with the
// plain method (every realization re-evaluates every E1 term) on a subsample: the speed ratio
// per realization and the largest relative difference in Δp.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <random>
#include <vector>

#include "core/hydro/well_function.hpp"
#include "core/hydro/pressure_surrogate.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/probabilistic/slip_tracker.hpp"

using namespace slipscreen::hydro;
using namespace slipscreen::probabilistic;
using Clock = std::chrono::steady_clock;

static double seconds_since(Clock::time_point t0) {
  return std::chrono::duration<double>(Clock::now() - t0).count();
}

int main() {
  // Month starts as whole days (calendar months average 30.4375 days), like dated inputs.
  const auto month = [](std::size_t m) { return std::floor(static_cast<double>(m) * 30.4375) * 86400.0; };
  const std::size_t n_wells = 200, n_months = 240, n_segments = 1000, n_real = 10000;
  std::mt19937_64 rng(20261201);
  std::uniform_real_distribution<double> pos(0.0, 100000.0), unit(0.0, 1.0);

  // Wells: monthly rates 500..5000 m³/d, each with a random start and possibly a shut-in.
  std::vector<RateSteps> steps(n_wells);
  std::vector<PressureSource> sources;
  for (std::size_t w = 0; w < n_wells; ++w) {
    const auto start = static_cast<std::size_t>(unit(rng) * 60);
    const auto stop = unit(rng) < 0.3 ? start + static_cast<std::size_t>(unit(rng) * 120) + 12 : n_months;
    double prev = 0.0;
    for (std::size_t m = start; m < std::min(stop, n_months); ++m) {
      const double q = (500.0 + 4500.0 * unit(rng)) / 86400.0;
      steps[w].time.push_back(month(m));
      steps[w].delta_rate.push_back(q - prev);
      prev = q;
    }
    steps[w].time.push_back(month(std::min(stop, n_months)));
    steps[w].delta_rate.push_back(-prev);
    sources.push_back({pos(rng), pos(rng), 0.1, w, 1.0, 0});
  }
  std::vector<double> track;
  for (std::size_t k = 1; k <= 300; ++k) track.push_back(month(k));
  std::vector<std::size_t> outputs;
  for (std::size_t o = 0; o < 40; ++o) outputs.push_back(7 * o + 6);

  std::vector<ObservationPoint> points;
  std::vector<std::vector<std::size_t>> seg_points(n_segments);
  for (std::size_t s = 0; s < n_segments; ++s) {
    const double x = pos(rng), y = pos(rng), a = unit(rng) * 3.14159;
    for (int c = -1; c <= 1; ++c) {
      seg_points[s].push_back(points.size());
      points.push_back({x + c * 400.0 * std::cos(a), y + c * 400.0 * std::sin(a)});
    }
  }
  // Realizations: lognormal permeability (factor ~3 either way) -> D and prefactor.
  std::normal_distribution<double> z(0.0, 1.0);
  std::vector<double> d(n_real), pre(n_real);
  for (std::size_t r = 0; r < n_real; ++r) {
    const double f = std::exp(0.6 * z(rng));
    d[r] = 0.3 * f;
    pre[r] = 2.0e5 / f;
  }
  const double d_min = *std::min_element(d.begin(), d.end()), d_max = *std::max_element(d.begin(), d.end());

  auto t0 = Clock::now();
  const double x_lo = std::log(0.01 / (4 * d_max)), x_hi = std::log(2.0e10 / (4 * d_min));
  const auto tables = build_tables(steps, track, SimilarityGrid{x_lo, x_hi, 0.025});
  const double t_tables = seconds_since(t0);
  t0 = Clock::now();
  const auto nodes = static_cast<std::size_t>(std::ceil(8.0 * std::log(d_max / d_min)));
  const PressureSurrogate sur(tables, sources, points, 1, d_min, d_max, nodes);
  const double t_surrogate = seconds_since(t0);

  Eigen::MatrixXf crit(static_cast<Eigen::Index>(n_segments), static_cast<Eigen::Index>(n_real));
  for (Eigen::Index s = 0; s < crit.rows(); ++s)
    for (Eigen::Index r = 0; r < crit.cols(); ++r) crit(s, r) = static_cast<float>(1.0e6 + 5.0e6 * unit(rng));
  t0 = Clock::now();
  const auto draws = make_pressure_draws(sur, d, pre, Eigen::MatrixXd::Ones(1, static_cast<Eigen::Index>(n_real)));
  std::vector<long> slipped(n_segments, 0);
  std::vector<float> dp_sub(n_segments * 8);
  track_slip(sur, seg_points, draws, crit, outputs, [&](const SegmentOutcome& o) {
    for (int f : o.first_crossing) slipped[o.segment] += f >= 0 && f <= static_cast<int>(outputs.back());
    for (int r = 0; r < 8; ++r) dp_sub[o.segment * 8 + r] = o.dp_at_output(39, r);
  });
  const double t_track = seconds_since(t0);
  const double total = t_tables + t_surrogate + t_track;

  // Plain method on a subsample: 8 realizations x 20 segments, every E1 term evaluated.
  t0 = Clock::now();
  double worst = 0.0, sink = 0.0;
  const std::size_t sub_seg = 20, sub_real = 8;
  for (std::size_t r = 0; r < sub_real; ++r)
    for (std::size_t s = 0; s < sub_seg; ++s) {
      double best_final = 0.0;
      for (std::size_t p : seg_points[s]) {
        for (std::size_t k = 0; k < track.size(); ++k) {
          double h = 0.0;
          for (const auto& src : sources) {
            const double dx = points[p].x - src.x, dy = points[p].y - src.y;
            const double x = std::max(dx * dx + dy * dy, 0.01) / (4 * d[r]);
            const auto& st = steps[src.table];
            for (std::size_t j = 0; j < st.time.size() && st.time[j] < track[k]; ++j)
              h += st.delta_rate[j] * slipscreen::hydro::well_function(x / (track[k] - st.time[j]));
          }
          if (k == outputs[39]) best_final = std::max(best_final, pre[r] * h);
          sink += h;
        }
      }
      if (best_final > 1000.0)
        worst = std::max(worst, std::abs(dp_sub[s * 8 + r] - best_final) / best_final);
    }
  const double t_plain = seconds_since(t0);
  const double per_real_fast = total / static_cast<double>(n_real);
  const double per_real_plain = t_plain / static_cast<double>(sub_real) * static_cast<double>(n_segments) / sub_seg;
  std::printf("mc engine: %zu wells x %zu months, %zu segments x 3 points, %zu tracking times, %zu realizations\n",
              n_wells, n_months, n_segments, track.size(), n_real);
  std::printf("  similarity tables  %8.2f s\n  surrogate build    %8.2f s (interp. error estimate %.2e)\n", t_tables,
              t_surrogate, sur.max_relative_error());
  std::printf("  slip tracking      %8.2f s\n  total              %8.2f s\n", t_track, total);
  std::printf("  plain method: %.3f s per realization (from %zu x %zu subsample) vs %.6f s fast: ratio %.0fx\n",
              per_real_plain, sub_real, sub_seg, per_real_fast, per_real_plain / per_real_fast);
  std::printf("  largest relative difference in final Δp (Δp > 1 kPa): %.2e   (checksum %.3g)\n", worst, sink);
  return 0;
}
