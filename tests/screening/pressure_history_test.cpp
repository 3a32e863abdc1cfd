// The monthly Δp by well at the segments closest to failure (screening/pressure_history.cpp)
// against the deterministic screen itself: at the output times both are the exact Theis sum
// (Theis 1935, hydro/pressure_field.hpp), so the segment's Δp, its check point and each well's
// part must agree to rounding.
#include "screening/pressure_history.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "core/util/civil_date.hpp"
#include "scenario/scenario.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;

TEST_CASE("the pressure history equals the screen's Δp and well shares at the output times") {
  const test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const screening::PreparedRun p = screening::prepare_run(s, false);
  const screen::ScreenResult r = screen::deterministic_screen(p.inputs);
  const screening::SegmentPressureHistory h = screening::segment_pressure_history(p, r, 3);
  REQUIRE(h.segments.size() == std::min<std::size_t>(3, p.segments.size()));
  REQUIRE(h.wells.size() == p.inputs.wells.size());
  const std::size_t T = h.time_count(), W = h.wells.size();

  // The segments are the smallest margins Δp_crit − peak Δp, in order.
  for (std::size_t i = 0; i + 1 < h.segments.size(); ++i) {
    const auto& a = r.segments[h.segments[i]];
    const auto& b = r.segments[h.segments[i + 1]];
    CHECK(a.dp_crit - a.peak_dp <= b.dp_crit - b.peak_dp);
  }
  for (std::size_t j = 0; j < r.segments.size(); ++j)
    if (std::find(h.segments.begin(), h.segments.end(), j) == h.segments.end())
      CHECK(r.segments[j].dp_crit - r.segments[j].peak_dp >=
            r.segments[h.segments.back()].dp_crit - r.segments[h.segments.back()].peak_dp);

  // Times: monthly (first of the month) and every output time, increasing.
  std::size_t found = 0;
  for (std::size_t k = 0; k < T; ++k) {
    if (k) CHECK(h.times[k] > h.times[k - 1]);
    const auto d = util::date_at(h.times[k]);
    const bool output = std::binary_search(s.output.times.begin(), s.output.times.end(), h.times[k]);
    CHECK((d.day == 1 || output));
    found += output;
  }
  CHECK(found == s.output.times.size());

  std::size_t compared = 0;
  for (std::size_t i = 0; i < h.segments.size(); ++i) {
    const auto& g = r.segments[h.segments[i]];
    for (std::size_t k = 0; k < T; ++k) {
      double sum = 0;
      for (std::size_t w = 0; w < W; ++w) sum += h.contribution[(i * T + k) * W + w];
      CHECK(std::abs(sum - h.dp[i * T + k]) <= 1e-9 * std::max(1.0, h.dp[i * T + k]));  // parts add up (Pa)
      const auto out = std::find(s.output.times.begin(), s.output.times.end(), h.times[k]);
      if (out == s.output.times.end()) continue;
      const std::size_t q = static_cast<std::size_t>(out - s.output.times.begin());
      // Same Theis sums: agreement to rounding, 1e-9 relative (pressure_field.hpp: ~1e-13).
      CHECK(std::abs(h.dp[i * T + k] - g.dp[q]) <= 1e-9 * std::max(1.0, g.dp[q]));
      if (g.dp[q] > 0) {
        CHECK(h.check_point[i * T + k] == g.dp_point[q]);
        for (std::size_t w = 0; w < W; ++w)
          CHECK(std::abs(h.contribution[(i * T + k) * W + w] - g.dp[q] * g.well_share[q * W + w]) <=
                1e-9 * g.dp[q]);
        ++compared;
      }
    }
  }
  CHECK(compared > 0);
}

TEST_CASE("no segments asked, none given") {
  const test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const screening::PreparedRun p = screening::prepare_run(s, false);
  const screen::ScreenResult r = screen::deterministic_screen(p.inputs);
  const auto h = screening::segment_pressure_history(p, r, 0);
  CHECK(h.segments.empty());
  CHECK(h.times.empty());
  CHECK(h.dp.empty());
}
