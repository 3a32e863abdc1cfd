// Δp_crit evaluations per second for a batch of fault planes × stress states (the Monte Carlo
// inner loop): the batched kernel (structure of arrays, vectorised, OpenMP) against a plain
// scalar version that takes one plane at a time through the general code (FaultPlane →
// resolve_normal → critical_pressure), measured in the same run. Prints figures, never asserts.
#include <omp.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <random>
#include <vector>

#include "core/geomech/a_phi.hpp"
#include "core/geomech/coulomb.hpp"
#include "core/geomech/critical_pressure_batch.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen::geomech;
using Clock = std::chrono::steady_clock;

namespace {

struct Inputs {
  std::vector<double> strike, dip;           // planes, rad
  std::vector<Eigen::Matrix3d> tensor;       // states
  std::vector<double> p0, kappa;
  std::vector<Friction> friction;
};

Inputs make_inputs(std::size_t planes, std::size_t states, bool poroelastic) {
  Inputs in;
  std::mt19937_64 rng(2026);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (std::size_t i = 0; i < planes; ++i) {
    in.strike.push_back(u(rng) * 2 * std::numbers::pi);
    in.dip.push_back(u(rng) * std::numbers::pi / 2);
  }
  for (std::size_t j = 0; j < states; ++j) {  // invented stress states spanning all regimes
    const double sv = 40e6 + 40e6 * u(rng), p0 = 0.4 * sv, mu = 0.5 + 0.4 * u(rng);
    const auto h = horizontal_stresses_from_a_phi(3.0 * u(rng), sv, p0, mu * (0.7 + 0.3 * u(rng)));
    in.tensor.push_back(stress_tensor_ned({sv, h.shmax, h.shmin, u(rng) * 2 * std::numbers::pi, p0}));
    in.p0.push_back(p0);
    in.friction.push_back({mu, 1e6 * u(rng)});
    in.kappa.push_back(poroelastic ? 0.3 + 0.3 * u(rng) : 0.0);
  }
  return in;
}

double seconds_since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

// The baseline: one plane at a time through the general one-plane code, one thread.
double scalar_pass(const Inputs& in, std::size_t states, std::vector<double>& out) {
  const std::size_t m = in.strike.size();
  const auto t0 = Clock::now();
  for (std::size_t j = 0; j < states; ++j)
    for (std::size_t i = 0; i < m; ++i) {
      const auto plane = FaultPlane::from_strike_dip(in.strike[i], in.dip[i]);
      out[j * m + i] = in.kappa[j] == 0.0
                           ? [&] {
                               const auto r = resolve_normal(in.tensor[j], plane.normal());
                               return critical_pressure(r.shear_stress, r.normal_stress, in.p0[j], in.friction[j]).dp;
                             }()
                           : critical_pressure_poroelastic(in.tensor[j], in.p0[j], plane.normal(), in.friction[j], in.kappa[j]).dp;
    }
  return seconds_since(t0);
}

// Best of `repeats` timed passes of the batched kernel (the planes' normals are prepared once).
double batched_pass(const PlaneBatch& planes, const StressBatch& states, std::vector<double>& out, int repeats) {
  double best = 1e300;
  for (int r = 0; r < repeats; ++r) {
    const auto t0 = Clock::now();
    critical_pressure_grid(planes, states, out);
    best = std::min(best, seconds_since(t0));
  }
  return best;
}

void run(const char* label, bool poroelastic) {
  const std::size_t m = 4096, k = 2048, k_scalar = 128;
  const Inputs in = make_inputs(m, k, poroelastic);
  PlaneBatch planes;
  for (std::size_t i = 0; i < m; ++i) planes.push_back(FaultPlane::from_strike_dip(in.strike[i], in.dip[i]));
  StressBatch states;
  for (std::size_t j = 0; j < k; ++j) states.push_back(in.tensor[j], in.p0[j], in.friction[j], in.kappa[j]);

  std::vector<double> scalar_out(m * k_scalar), batch_out(m * k);
  const double ts = scalar_pass(in, k_scalar, scalar_out);
  const double scalar_rate = static_cast<double>(m * k_scalar) / ts;

  const int threads = omp_get_max_threads();
  omp_set_num_threads(1);
  const double t1 = batched_pass(planes, states, batch_out, 3);
  omp_set_num_threads(threads);
  const double tn = batched_pass(planes, states, batch_out, 3);
  const double rate1 = static_cast<double>(m * k) / t1, raten = static_cast<double>(m * k) / tn;

  double max_diff = 0.0;
  for (std::size_t i = 0; i < m * k_scalar; ++i)
    if (std::isfinite(scalar_out[i])) max_diff = std::max(max_diff, std::fabs(scalar_out[i] - batch_out[i]));

  std::printf("%s: %zu planes x %zu stress states\n", label, m, k);
  std::printf("  scalar, one plane at a time (1 thread) : %8.2f million plane evaluations/s\n", scalar_rate / 1e6);
  std::printf("  batched kernel, 1 thread                : %8.2f million plane evaluations/s\n", rate1 / 1e6);
  std::printf("  batched kernel, %d threads               : %8.2f million plane evaluations/s\n", threads, raten / 1e6);
  std::printf("  ratio batched (%d threads) / scalar      : %8.1f x   (1 thread: %.1f x)\n", threads, raten / scalar_rate,
              rate1 / scalar_rate);
  std::printf("  largest |batched - scalar| over %zu values: %.3g Pa\n", m * k_scalar, max_diff);
}

}  // namespace

int main() {
  std::printf("coulomb_bench: dp_crit for planes x stress states (invented inputs; screening code)\n");
  run("closed form (no stress path)", false);
  run("poroelastic stress path (exact root)", true);
  return 0;
}
