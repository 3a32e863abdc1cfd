#include "core/geomech/critical_pressure_batch.hpp"

#include <doctest/doctest.h>
#include <omp.h>

#include <numbers>
#include <random>
#include <vector>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
struct Setup {
  std::vector<FaultPlane> planes;
  std::vector<Eigen::Matrix3d> tensors;
  std::vector<double> p0, kappa;
  std::vector<Friction> friction;
  PlaneBatch plane_batch;
  StressBatch state_batch;
};

Setup make_setup(std::size_t m, std::size_t k, bool poroelastic) {
  Setup s;
  std::mt19937_64 rng(99);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (std::size_t i = 0; i < m; ++i) {
    s.planes.push_back(FaultPlane::from_strike_dip(u(rng) * 2 * std::numbers::pi, u(rng) * std::numbers::pi / 2));
    s.plane_batch.push_back(s.planes.back());
  }
  for (std::size_t j = 0; j < k; ++j) {
    const double sv = 40e6 + 40e6 * u(rng), p0 = 0.4 * sv, mu = 0.5 + 0.4 * u(rng);
    const auto h = horizontal_stresses_from_a_phi(3.0 * u(rng), sv, p0, mu * (0.7 + 0.5 * u(rng)));
    s.tensors.push_back(stress_tensor_ned({sv, h.shmax, h.shmin, u(rng) * 2 * std::numbers::pi, p0}));
    s.p0.push_back(p0);
    s.friction.push_back({mu, 1e6 * u(rng)});
    s.kappa.push_back(poroelastic ? 0.6 * u(rng) : 0.0);
    s.state_batch.push_back(s.tensors.back(), p0, s.friction.back(), s.kappa.back());
  }
  return s;
}
}  // namespace

TEST_CASE("batched kernel agrees with the one-plane general code") {
  for (bool poro : {false, true}) {
    CAPTURE(poro);
    const auto s = make_setup(257, 13, poro);
    std::vector<double> out(257 * 13);
    critical_pressure_grid(s.plane_batch, s.state_batch, out);
    for (std::size_t j = 0; j < 13; ++j)
      for (std::size_t i = 0; i < 257; ++i) {
        const double ref = critical_pressure_poroelastic(s.tensors[j], s.p0[j], s.planes[i].normal(), s.friction[j], s.kappa[j]).dp;
        const double got = out[j * 257 + i];
        if (std::isinf(ref)) CHECK(got == ref);
        else CHECK_NEAR(got, ref, 1e-6 + 1e-12 * std::fabs(ref));  // Pa
      }
  }
}

TEST_CASE("paired kernel and thread-count independence") {
  const auto s = make_setup(64, 64, true);
  std::vector<double> grid(64 * 64), paired(64);
  critical_pressure_grid(s.plane_batch, s.state_batch, grid);
  critical_pressure_paired(s.plane_batch, s.state_batch, paired);
  for (std::size_t i = 0; i < 64; ++i) CHECK(paired[i] == grid[i * 64 + i]);
  const int previous = omp_get_max_threads();
  omp_set_num_threads(1);
  std::vector<double> one(64 * 64);
  critical_pressure_grid(s.plane_batch, s.state_batch, one);
  omp_set_num_threads(2);
  std::vector<double> two(64 * 64);
  critical_pressure_grid(s.plane_batch, s.state_batch, two);
  omp_set_num_threads(previous);
  CHECK(one == two);
  CHECK(one == grid);
}

TEST_CASE("batched kernel bad input") {
  const auto s = make_setup(4, 3, false);
  std::vector<double> wrong(11);
  CHECK_THROWS_WITH_AS(critical_pressure_grid(s.plane_batch, s.state_batch, wrong), doctest::Contains("field 'output size'"), InputError);
  StressBatch b;
  CHECK_THROWS_WITH_AS(b.push_back(Eigen::Matrix3d::Identity(), 0.0, {0.0, 0.0}), doctest::Contains("field 'friction'"), InputError);
  CHECK_THROWS_WITH_AS(b.push_back(Eigen::Matrix3d::Identity(), 0.0, {0.6, 0.0}, 1.5), doctest::Contains("stress-path coefficient"), InputError);
}
