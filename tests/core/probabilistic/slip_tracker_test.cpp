#include "core/probabilistic/slip_tracker.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/pressure_surrogate.hpp"
#include "core/hydro/similarity_table.hpp"

using namespace slipscreen::hydro;
using namespace slipscreen::probabilistic;

namespace {
constexpr double kDay = 86400.0;
}

TEST_CASE("slip tracker finds the first tracking time where Δp reaches Δp_crit, also after shut-in") {
  // One well injecting 0.03 m³/s for 24 months, then shut in; a segment with two check points.
  RateSteps steps;
  steps.time = {0.0, 24 * 30 * kDay};
  steps.delta_rate = {0.03, -0.03};
  std::vector<double> times;
  for (int k = 1; k <= 120; ++k) times.push_back(k * 30.0 * kDay);
  std::vector<SimilarityTable> tables;
  tables.emplace_back(steps, times, SimilarityGrid{std::log(1e-3), std::log(1e10), 0.05});
  const std::vector<PressureSource> sources = {{0.0, 0.0, 0.1, 0, 1.0, 0}};
  const std::vector<ObservationPoint> points = {{8000.0, 0.0}, {9000.0, 0.0}};
  const double d = 0.2, prefactor = 1.0e5;  // fictional: Pa per m³/s
  const PressureSurrogate sur(tables, sources, points, 1, d, d);

  // Reference Δp at the nearer check point by direct superposition.
  std::vector<double> dp(times.size());
  for (std::size_t k = 0; k < times.size(); ++k)
    dp[k] = prefactor * SimilarityTable::direct(steps, 8000.0 * 8000.0 / (4 * d), times[k]);
  const auto peak_it = std::max_element(dp.begin(), dp.end());
  const auto k_peak = static_cast<std::size_t>(peak_it - dp.begin());
  CHECK(k_peak > 24);  // at 8 km the peak arrives after the shut-in (Theis recovery)

  // Thresholds: reached early, reached only at the post-shut-in peak, and never reached.
  const std::vector<double> crit = {0.5 * dp[10], *peak_it * (1 - 1e-4), *peak_it * 1.01, -1.0};
  const auto n = static_cast<Eigen::Index>(crit.size());
  Eigen::MatrixXd factor = Eigen::MatrixXd::Ones(1, n);
  const std::vector<double> ds(crit.size(), d), pre(crit.size(), prefactor);
  const auto draws = make_pressure_draws(sur, ds, pre, factor);
  Eigen::MatrixXf dpc(1, n);
  for (Eigen::Index r = 0; r < n; ++r) dpc(0, r) = static_cast<float>(crit[static_cast<std::size_t>(r)]);
  const std::vector<std::size_t> outputs = {11, 59, 119};
  std::vector<SegmentOutcome> got;
  track_slip(sur, {{0, 1}}, draws, dpc, outputs, [&](const SegmentOutcome& o) { got.push_back(o); });
  REQUIRE(got.size() == 1);
  const auto first_at_or_above = [&](double c) {
    for (std::size_t k = 0; k < dp.size(); ++k)
      if (dp[k] >= c) return static_cast<int>(k);
    return -1;
  };
  CHECK(got[0].first_crossing[0] == first_at_or_above(crit[0]));
  CHECK(got[0].first_crossing[1] == static_cast<int>(k_peak));
  CHECK(got[0].first_crossing[2] == -1);
  CHECK(got[0].first_crossing[3] == 0);  // already critical before any injection
  CHECK(std::abs(got[0].dp_at_output(1, 0) - dp[59]) <= 1e-5 * *peak_it);
}

TEST_CASE("slip tracker rejects mismatched shapes") {
  RateSteps steps{{0.0}, {0.01}};
  const std::vector<double> times = {kDay, 2 * kDay};
  std::vector<SimilarityTable> tables;
  tables.emplace_back(steps, times, SimilarityGrid{std::log(1e-3), std::log(1e8), 0.05});
  const std::vector<PressureSource> sources = {{0.0, 0.0, 0.1, 0, 1.0, 0}};
  const std::vector<ObservationPoint> points = {{100.0, 0.0}};
  const PressureSurrogate sur(tables, sources, points, 1, 0.1, 0.1);
  const std::vector<double> ds = {0.1}, pre = {1.0};
  const auto draws = make_pressure_draws(sur, ds, pre, Eigen::MatrixXd::Ones(1, 1));
  const Eigen::MatrixXf wrong(2, 1);
  CHECK_THROWS_AS(track_slip(sur, {{0}}, draws, wrong, std::vector<std::size_t>{1}, [](const SegmentOutcome&) {}),
                  slipscreen::InputError);
}
