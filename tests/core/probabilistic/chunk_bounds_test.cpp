// The bounds of chunk_bounds.hpp against the series they bound: every evaluated Δp lies within
// its chunk's [lower, upper], the span bound contains every chunk's, and the bound is tighter than
// the triangle inequality Σ |ℓ_d| max |G_d| (the check that the split basis is doing its job).
#include "core/probabilistic/chunk_bounds.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <random>
#include <vector>

#include "core/hydro/pressure_surrogate.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/probabilistic/slip_tracker.hpp"

using namespace slipscreen::hydro;
using namespace slipscreen::probabilistic;

TEST_CASE("chunk bounds contain every evaluated series and are tighter than the triangle inequality") {
  constexpr double kDay = 86400.0;
  // Two wells with a shut-in and a restart (so Δp rises, falls and rises again), two rate groups,
  // three check points; D spread over two decades, so the basis has negative lobes.
  RateSteps a, b;
  a.time = {0.0, 400 * kDay, 900 * kDay};
  a.delta_rate = {0.03, -0.03, 0.02};
  b.time = {200 * kDay};
  b.delta_rate = {0.05};
  std::vector<double> times;
  for (int k = 1; k <= 70; ++k) times.push_back(k * 30.0 * kDay);
  std::vector<SimilarityTable> tables;
  const SimilarityGrid grid{std::log(1e-3), std::log(1e12), 0.05};
  tables.emplace_back(a, times, grid);
  tables.emplace_back(b, times, grid);
  const std::vector<PressureSource> sources = {{0.0, 0.0, 0.1, 0, 1.0, 0}, {3000.0, 500.0, 0.1, 1, 1.0, 1}};
  const std::vector<ObservationPoint> points = {{2000.0, 0.0}, {5000.0, 1000.0}, {9000.0, -2000.0}};
  const double d_min = 0.01, d_max = 1.0;
  const PressureSurrogate sur(tables, sources, points, 2, d_min, d_max, 12);

  std::mt19937_64 rng(5);
  std::uniform_real_distribution<double> U(0.0, 1.0);
  const Eigen::Index n = 300;
  std::vector<double> ds, pre;
  Eigen::MatrixXd factor(2, n);
  for (Eigen::Index r = 0; r < n; ++r) {
    ds.push_back(d_min * std::pow(d_max / d_min, U(rng)));
    pre.push_back(1e5 * (0.5 + U(rng)));  // fictional: Pa per m³/s
    factor(0, r) = 0.5 + U(rng);
    factor(1, r) = 0.5 + U(rng);
  }
  const auto draws = make_pressure_draws(sur, ds, pre, factor);
  const Eigen::MatrixXd parts = split_basis(draws.basis);
  const Eigen::Index rows = 70, chunk = 24, first = 0;
  std::vector<Eigen::Index> only;
  for (Eigen::Index r = 0; r < n; r += 3) only.push_back(r);
  int tighter = 0, compared = 0;
  for (std::size_t p = 0; p < points.size(); ++p) {
    Eigen::MatrixXd upper, lower, upper_only, lower_only;
    chunk_bounds(sur, p, first, rows, chunk, parts, draws.scale, upper, &lower);
    chunk_bounds(sur, p, first, rows, chunk, parts, draws.scale, upper_only, &lower_only, &only);
    Eigen::RowVectorXd span_upper, span_lower;
    span_bounds(sur, {p}, first, rows, parts, draws.scale, span_upper, &span_lower);
    // The series, evaluated as the tracker does (Σ_g table × (basis · s_g)).
    Eigen::MatrixXd series = Eigen::MatrixXd::Zero(rows, n);
    for (std::size_t g = 0; g < 2; ++g) {
      Eigen::MatrixXd block = draws.basis;
      for (Eigen::Index r = 0; r < n; ++r) block.col(r) *= draws.scale(static_cast<Eigen::Index>(g), r);
      series.noalias() += sur.table(p, g) * block;
    }
    for (Eigen::Index r = 0; r < n; ++r) {
      for (Eigen::Index k = 0; k < rows; ++k) {
        const Eigen::Index q = k / chunk;
        CHECK(series(k, r) <= upper(q, r));
        CHECK(series(k, r) >= lower(q, r));
      }
      CHECK(upper.col(r).maxCoeff() <= span_upper(r));
      CHECK(lower.col(r).minCoeff() >= span_lower(r));
      const bool in_only = r % 3 == 0;
      CHECK(upper_only(0, r) == (in_only ? upper(0, r) : -INFINITY));
      CHECK(lower_only(2, r) == (in_only ? lower(2, r) : INFINITY));
      // Triangle inequality: Σ_g |s_g| Σ_d |ℓ_d| max_k |G_d(t_k)| over the whole span.
      double tri = 0.0;
      for (std::size_t g = 0; g < 2; ++g)
        tri += std::abs(draws.scale(static_cast<Eigen::Index>(g), r)) *
               (sur.table(p, g).cwiseAbs().colwise().maxCoeff() * draws.basis.col(r).cwiseAbs())(0);
      ++compared;
      if (span_upper(r) < tri) ++tighter;
    }
  }
  CHECK(tighter == compared);
}
