// Sampler benchmark: draws per second for plain Monte Carlo and Latin hypercube sampling of
// ten uncertain inputs, against a simple baseline measured in the same run: one shared
// boost::random::mt19937_64 stream (no per-realization streams, no strata) feeding the same
// quantile functions. The ratio shows what reproducible per-realization streams cost.
#include <boost/random/mersenne_twister.hpp>
#include <chrono>
#include <cstdio>
#include <vector>

#include "core/stats/random_stream.hpp"
#include "core/stats/sampler.hpp"

using namespace slipscreen::stats;

namespace {

std::vector<UncertainInput> inputs() {
  return {{"shmin_gradient", Distribution::uniform(15e3, 18e3)},
          {"shmax_gradient", Distribution::uniform(22e3, 28e3)},
          {"shmax_azimuth", Distribution::normal(1.2, 0.1)},
          {"pore_pressure_gradient", Distribution::normal(10.0e3, 0.3e3)},
          {"friction", Distribution::truncated_normal(0.6, 0.1, 0.3, 0.9)},
          {"cohesion", Distribution::triangular(0.0, 0.0, 2e6)},
          {"permeability", Distribution::lognormal(1e-14, 0.8)},
          {"porosity", Distribution::truncated_normal(0.1, 0.03, 0.02, 0.3)},
          {"thickness", Distribution::uniform(50.0, 150.0)},
          {"rate_factor", Distribution::lognormal(1.0, 0.2)}};
}

double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

}  // namespace

int main() {
  constexpr std::int64_t n = 200'000;
  const auto in = inputs();
  const double draws = static_cast<double>(n) * static_cast<double>(in.size());
  std::vector<double> x(in.size());
  double sink = 0.0;

  // Baseline: one stream for everything.
  auto t0 = std::chrono::steady_clock::now();
  boost::random::mt19937_64 engine(42);
  for (std::int64_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < in.size(); ++j) sink += in[j].distribution.quantile(open_unit_interval(engine()));
  const double t_base = seconds_since(t0);

  double t_method[2] = {0.0, 0.0}, t_setup[2] = {0.0, 0.0};
  for (int m = 0; m < 2; ++m) {
    t0 = std::chrono::steady_clock::now();
    const Sampler s(in, m == 0 ? SamplingMethod::monte_carlo : SamplingMethod::latin_hypercube, 42, RealizationCount(n));
    t_setup[m] = seconds_since(t0);
    t0 = std::chrono::steady_clock::now();
    for (std::uint64_t i = 0; i < static_cast<std::uint64_t>(n); ++i) {
      s.draw(i, x);
      for (double v : x) sink += v;
    }
    t_method[m] = seconds_since(t0);
  }

  std::printf("sampler_bench: %lld realizations x %zu inputs (checksum %.6g)\n", static_cast<long long>(n), in.size(), sink);
  std::printf("  baseline (one shared mt19937_64 stream): %8.3f s  %6.2f M draws/s\n", t_base, draws / t_base / 1e6);
  const char* names[2] = {"monte-carlo", "latin-hypercube"};
  for (int m = 0; m < 2; ++m)
    std::printf("  %-16s setup %6.3f s, draws %8.3f s  %6.2f M draws/s  %8.0f realizations/s  (%.2fx baseline time)\n",
                names[m], t_setup[m], t_method[m], draws / t_method[m] / 1e6, static_cast<double>(n) / t_method[m],
                t_method[m] / t_base);
  std::printf("  latin-hypercube / monte-carlo time (incl. setup): %.2f\n",
              (t_method[1] + t_setup[1]) / (t_method[0] + t_setup[0]));
  return 0;
}
