// Quantile sketch benchmark: values added per second to a DDSketch (α = 0.01) and the cost of
// P5/P50/P95 from it, against a simple baseline measured in the same run: keeping every value
// and taking exact order statistics with std::nth_element. Also prints the memory of each and
// the largest relative difference between the sketch's and the exact percentiles.
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <vector>

#include "core/stats/distribution.hpp"
#include "core/stats/quantile_sketch.hpp"
#include "core/stats/random_stream.hpp"

using namespace slipscreen::stats;

namespace {
double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}
}  // namespace

int main() {
  // 400 sketches (e.g. 10 segments x 40 times) of 10000 realizations each: Δp-like values.
  constexpr int sketches = 400, n = 10000;
  const Distribution d = Distribution::lognormal(5e5, 0.9);
  std::vector<double> values(static_cast<std::size_t>(sketches) * n);
  RandomStream s(1, 0);
  for (auto& v : values) v = d.quantile(s.uniform());

  auto t0 = std::chrono::steady_clock::now();
  std::vector<QuantileSketch> sk(sketches, QuantileSketch(0.01));
  for (int k = 0; k < sketches; ++k)
    for (int i = 0; i < n; ++i) sk[k].add(values[static_cast<std::size_t>(k) * n + i]);
  const double t_add = seconds_since(t0);
  t0 = std::chrono::steady_clock::now();
  double sink = 0.0;
  for (const auto& q : sk) sink += q.quantile(0.05) + q.quantile(0.5) + q.quantile(0.95);
  const double t_query = seconds_since(t0);
  std::size_t words = 0;
  for (const auto& q : sk) words += q.encode().size();

  // Baseline: store everything, exact percentiles by nth_element.
  t0 = std::chrono::steady_clock::now();
  std::vector<std::vector<double>> kept(sketches);
  for (int k = 0; k < sketches; ++k) {
    kept[k].reserve(n);
    for (int i = 0; i < n; ++i) kept[k].push_back(values[static_cast<std::size_t>(k) * n + i]);
  }
  double worst = 0.0;
  for (int k = 0; k < sketches; ++k) {
    for (double q : {0.05, 0.5, 0.95}) {
      auto& v = kept[k];
      const auto r = static_cast<std::size_t>(std::floor(q * (n - 1)));
      std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(r), v.end());
      sink += v[r];
      worst = std::max(worst, std::abs(sk[k].quantile(q) - v[r]) / v[r]);
    }
  }
  const double t_base = seconds_since(t0);

  const double adds = static_cast<double>(sketches) * n;
  std::printf("quantile_sketch_bench: %d sketches x %d values, alpha = 0.01 (checksum %.6g)\n", sketches, n, sink);
  std::printf("  sketch:   add %.3f s (%.1f M values/s, %.1f ns/value), P5/P50/P95 %.4f s, memory %.2f MB\n", t_add,
              adds / t_add / 1e6, t_add / adds * 1e9, t_query, static_cast<double>(words) * 8 / 1e6);
  std::printf("  baseline (keep all + nth_element): %.3f s, memory %.2f MB\n", t_base, adds * 8 / 1e6);
  std::printf("  time ratio sketch/baseline %.2f, memory ratio %.4f, largest relative percentile difference %.4f\n",
              (t_add + t_query) / t_base, static_cast<double>(words) / adds, worst);
  return 0;
}
