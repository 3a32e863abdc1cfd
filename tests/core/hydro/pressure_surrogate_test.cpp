#include "core/hydro/pressure_surrogate.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <span>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen::hydro;

namespace {
constexpr double kDay = 86400.0;

RateSteps history(double q, int start_month, int months) {
  RateSteps s;
  s.time = {start_month * 30.0 * kDay, (start_month + months) * 30.0 * kDay};
  s.delta_rate = {q, -q};  // injection then shut-in
  return s;
}

struct Fixture {
  std::vector<RateSteps> steps = {history(0.03, 0, 60), history(0.02, 12, 30), history(0.04, 24, 48)};
  std::vector<PressureSource> sources = {
      {0.0, 0.0, 0.1, 0, 1.0, 0}, {4000.0, 1000.0, 0.1, 1, 1.0, 0}, {-2500.0, 3000.0, 0.1, 2, 1.0, 1}};
  std::vector<ObservationPoint> points = {{1000.0, 0.0}, {2000.0, 2000.0}, {-6000.0, -4000.0}, {0.05, 0.0}};
  std::vector<double> times;
  std::vector<SimilarityTable> tables;
  Fixture() {
    for (int k = 1; k <= 100; ++k) times.push_back(k * 30.0 * kDay);
    for (const auto& s : steps) tables.emplace_back(s, times, SimilarityGrid{std::log(0.01 / 8.0), std::log(1e9 / 0.1), 0.05});
  }
  // Direct Theis superposition, in the same units as G (m³/s).
  double direct(std::size_t p, std::size_t group, double d, std::size_t k) const {
    double g = 0.0;
    for (const auto& s : sources) {
      if (s.group != group) continue;
      const double dx = points[p].x - s.x, dy = points[p].y - s.y;
      const double r2 = std::max(dx * dx + dy * dy, s.radius * s.radius);
      g += s.sign * SimilarityTable::direct(steps[s.table], r2 / (4.0 * d), times[k]);
    }
    return g;
  }
};
}  // namespace

TEST_CASE("surrogate reproduces direct Theis superposition across the diffusivity range") {
  const Fixture f;
  const double d_min = 0.05, d_max = 2.0;  // m²/s: a factor 40, a typical sampled range
  const PressureSurrogate sur(f.tables, f.sources, f.points, 2, d_min, d_max, 16);
  CHECK(sur.node_count() == 16);
  MESSAGE("self-estimated interpolation error: " << sur.max_relative_error());
  CHECK(sur.max_relative_error() < 1e-5);

  const std::vector<double> ds = {0.05, 0.0731, 0.2, 0.555, 1.3, 2.0};
  Eigen::MatrixXd basis(16, static_cast<Eigen::Index>(ds.size()));
  Eigen::MatrixXd scale(2, static_cast<Eigen::Index>(ds.size()));
  for (std::size_t r = 0; r < ds.size(); ++r) {
    sur.basis(ds[r], basis.col(static_cast<Eigen::Index>(r)).data());
    scale(0, static_cast<Eigen::Index>(r)) = 1.0;
    scale(1, static_cast<Eigen::Index>(r)) = 2.0;  // group 1 doubled (a rate factor)
  }
  Eigen::MatrixXd out;
  double worst = 0.0;
  for (std::size_t p = 0; p < f.points.size(); ++p) {
    sur.evaluate(p, basis, scale, out);
    for (std::size_t r = 0; r < ds.size(); ++r) {
      double peak = 0.0, err = 0.0;
      for (std::size_t k = 0; k < f.times.size(); ++k) {
        const double exact = f.direct(p, 0, ds[r], k) + 2.0 * f.direct(p, 1, ds[r], k);
        peak = std::max(peak, std::abs(exact));
        err = std::max(err, std::abs(out(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(r)) - exact));
      }
      worst = std::max(worst, err / peak);
    }
  }
  MESSAGE("surrogate worst error relative to the point's peak: " << worst);
  // Stated accuracy 1e-5 of the point's peak (double storage).
  CHECK(worst < 1e-5);
}

TEST_CASE("surrogate with a fixed diffusivity uses one node and is exact to the table rounding") {
  const Fixture f;
  const PressureSurrogate sur(f.tables, f.sources, f.points, 2, 0.3, 0.3);
  CHECK(sur.node_count() == 1);
  Eigen::MatrixXd basis(1, 1), scale(2, 1), out;
  sur.basis(0.3, basis.data());
  scale << 1.0, 1.0;
  sur.evaluate(0, basis, scale, out);
  const double exact = f.direct(0, 0, 0.3, 50) + f.direct(0, 1, 0.3, 50);
  CHECK(std::abs(out(50, 0) - exact) <= 1e-6 * std::abs(exact));
}

TEST_CASE("surrogate rejects bad input") {
  const Fixture f;
  CHECK_THROWS_AS(PressureSurrogate(f.tables, f.sources, f.points, 2, 0.0, 1.0), slipscreen::InputError);
  CHECK_THROWS_AS(PressureSurrogate(f.tables, f.sources, f.points, 2, 2.0, 1.0), slipscreen::InputError);
  CHECK_THROWS_AS(PressureSurrogate(f.tables, f.sources, f.points, 1, 0.1, 1.0), slipscreen::InputError);
}

TEST_CASE("surrogates of ranges of the points hold the whole one's tables bit for bit, and the largest error estimate") {
  Fixture f;
  // 200 points on a spiral (fictional), so that the error estimate samples every third point.
  f.points.clear();
  for (int i = 0; i < 200; ++i) {
    const double a = 0.37 * i, r = 300.0 + 40.0 * i;
    f.points.push_back({r * std::cos(a), r * std::sin(a)});
  }
  const PressureSurrogate whole(f.tables, f.sources, f.points, 2, 0.05, 2.0, 16);
  REQUIRE(whole.max_relative_error() > 0.0);
  double largest = 0.0;
  const std::vector<std::size_t> cuts = {0, 1, 77, 150, 200};  // parts of 1, 76, 73 and 50 points
  for (std::size_t k = 0; k + 1 < cuts.size(); ++k) {
    const std::size_t first = cuts[k], count = cuts[k + 1] - cuts[k];
    const PressureSurrogate part(f.tables, f.sources, std::span(f.points).subspan(first, count), 2, 0.05, 2.0, 16,
                                 nullptr, PointRange{first, f.points.size()});
    REQUIRE(part.point_count() == count);
    for (std::size_t p = 0; p < count; ++p)
      for (std::size_t g = 0; g < 2; ++g) CHECK(part.table(p, g) == whole.table(first + p, g));
    // The part samples the whole set's points 0, 3, 6, ... (every 200/64-th) that fall in its
    // range: its estimate is the largest of those points' own estimates.
    double expected = 0.0;
    for (std::size_t g = first; g < first + count; ++g)
      if (g % 3 == 0)
        expected = std::max(expected, PressureSurrogate(f.tables, f.sources, std::span(f.points).subspan(g, 1), 2, 0.05,
                                                        2.0, 16).max_relative_error());
    CHECK(part.max_relative_error() == expected);
    largest = std::max(largest, part.max_relative_error());
  }
  CHECK(largest == whole.max_relative_error());
  // A range that does not fit the whole set is refused.
  CHECK_THROWS_AS(PressureSurrogate(f.tables, f.sources, std::span(f.points).subspan(150, 50), 2, 0.05, 2.0, 16, nullptr,
                                    PointRange{151, f.points.size()}),
                  slipscreen::InputError);
}

TEST_CASE("surrogate by blocks of tables: the one-block surrogate bit for bit, blocks out of order refused") {
  const Fixture f;
  const PressureSurrogate whole(f.tables, f.sources, f.points, 2, 0.05, 2.0, 16);
  PressureSurrogate blocks(f.points, 2, f.times.size(), 0.05, 2.0, 16);
  // Tables 0 and 1, then table 2 (the sources are ordered by table, as the pressure model's are).
  blocks.add(std::span(f.tables).subspan(0, 2), 0, f.sources);
  blocks.add(std::span(f.tables).subspan(2, 1), 2, f.sources);
  blocks.finish(f.tables.size());
  for (std::size_t p = 0; p < f.points.size(); ++p)
    for (std::size_t g = 0; g < 2; ++g) CHECK(blocks.table(p, g) == whole.table(p, g));
  CHECK(blocks.max_relative_error() == whole.max_relative_error());
  CHECK(blocks.max_relative_error() > 0.0);

  PressureSurrogate skipped(f.points, 2, f.times.size(), 0.05, 2.0, 16);
  CHECK_THROWS_AS(skipped.add(std::span(f.tables).subspan(1, 2), 1, f.sources), slipscreen::InputError);
  skipped.add(std::span(f.tables).subspan(0, 1), 0, f.sources);
  CHECK_THROWS_AS(skipped.finish(f.tables.size()), slipscreen::InputError);  // tables 1 and 2 never added

  // Sources not ordered by table cannot come in blocks (a point would add them in another order).
  std::vector<PressureSource> unordered = {f.sources[2], f.sources[0], f.sources[1]};
  PressureSurrogate mixed(f.points, 2, f.times.size(), 0.05, 2.0, 16);
  CHECK_THROWS_AS(mixed.add(std::span(f.tables).subspan(0, 1), 0, unordered), slipscreen::InputError);
  mixed.add(f.tables, 0, unordered);  // one block of every table takes them in any order
  mixed.finish(f.tables.size());
  CHECK(mixed.max_relative_error() < 1e-5);
}
