#include "core/probabilistic/probability_maps.hpp"

#include <doctest/doctest.h>

#include <numbers>

#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDay = 86400.0;
constexpr double kDeg = std::numbers::pi / 180.0;

// Fictional case: one well injecting 0.05 m³/s for 10 years; strike-slip stress from
// gradients at 3 km with uncertain friction; pixels at 500 m and 150 km from the well.
struct Case {
  UncertainModel model;
  std::vector<WellInput> wells{WellInput{"W1", 0.0, 0.0, 0.1, {{0.0}, {0.05}}}};
  std::vector<SegmentInput> segments;
  RunSettings settings;
  Case() {
    model = test::strike_slip_model();
    // μ ≥ 0.6: limit ≥ 3.12 above the ratio (90 − 30)/(51 − 30) = 2.86, so no orientation is
    // critical before injection (Zoback 2007).
    model.friction = Distribution::uniform(0.6, 1.0);
    segments.push_back({{{1500.0, 0.0}}, 15 * kDeg, 80 * kDeg, 0});
    for (int m = 1; m <= 120; ++m) settings.tracking_times.push_back(m * 30 * kDay);
    settings.output_index = {11, 59, 119};
    settings.realizations = 200;
    settings.method = stats::SamplingMethod::monte_carlo;
    settings.map_points = {{500.0, 0.0}, {150000.0, 0.0}};
  }
};
}  // namespace

TEST_CASE("probability maps: counts grow with time, far pixels never slip, already critical counted apart") {
  Case c;
  const InputList list = make_inputs(c.model, c.wells, 1);
  auto r = sample_realizations(c.model, list, c.segments, 1, c.settings, stats::RealizationCount(200));
  // Two realizations made critical before injection: counted apart, never as induced slips.
  r.map_dp_crit(0, 0) = -1.0f;
  r.map_dp_crit(0, 1) = 0.0f;
  const PressureModel m = build_pressure_model(c.wells, c.segments, c.settings, list, r);
  const ProbabilityMaps maps = probability_maps(m, r, c.settings);
  REQUIRE(maps.dangerous.size() == 2 * 3);
  CHECK(maps.oriented.empty());  // no orientation given
  CHECK(maps.dangerous_already_critical == 2);
  CHECK(maps.dangerous[0] <= maps.dangerous[1]);
  CHECK(maps.dangerous[1] <= maps.dangerous[2]);
  CHECK(maps.dangerous[2] > 0);
  CHECK(maps.dangerous[2] <= 198);
  // 150 km after 10 years: u = r²/(4Dt) ≈ 6.4e4, E1 underflows to 0 — no pressure at all.
  CHECK(maps.dangerous[3] == 0);
  CHECK(maps.dangerous[5] == 0);
}

TEST_CASE("probability maps: no pixels, no maps; the oriented map is never more likely than the dangerous one") {
  Case c;
  c.settings.map_strike = 15 * kDeg;
  c.settings.map_dip = 80 * kDeg;
  const InputList list = make_inputs(c.model, c.wells, 1);
  const auto r = sample_realizations(c.model, list, c.segments, 1, c.settings, stats::RealizationCount(200));
  const PressureModel m = build_pressure_model(c.wells, c.segments, c.settings, list, r);
  const ProbabilityMaps maps = probability_maps(m, r, c.settings);
  REQUIRE(maps.oriented.size() == maps.dangerous.size());
  for (std::size_t i = 0; i < maps.oriented.size(); ++i) CHECK(maps.oriented[i] <= maps.dangerous[i]);
  RunSettings none = c.settings;
  none.map_points.clear();
  const ProbabilityMaps empty = probability_maps(m, r, none);
  CHECK(empty.dangerous.empty());
  CHECK(empty.oriented.empty());
}

TEST_CASE("probability maps: the same counts once the model's tables are released") {
  // The 150 km pixel lies beyond the segment's tables, so the map's surrogate needs its own wider
  // tables; with only the 500 m pixel it is built from the model's tables before they go.
  for (bool far_pixel : {true, false}) {
    CAPTURE(far_pixel);
    Case c;
    if (!far_pixel) c.settings.map_points.pop_back();
    c.settings.attribute_median = true;
    const InputList list = make_inputs(c.model, c.wells, 1);
    const auto r = sample_realizations(c.model, list, c.segments, 1, c.settings, stats::RealizationCount(200));
    PressureModel m = build_pressure_model(c.wells, c.segments, c.settings, list, r);
    const ProbabilityMaps before = probability_maps(m, r, c.settings);
    const std::vector<float> last_nodes = m.tables[0].nodes_at(c.settings.output_index.back());
    release_tables(m, c.settings);
    CHECK(m.tables.empty());
    REQUIRE(m.map_surrogate.has_value());
    REQUIRE(m.median_nodes.size() == c.settings.output_index.size() * c.wells.size());
    CHECK(m.median_nodes.back() == last_nodes);  // the output times' columns, kept bit for bit
    const ProbabilityMaps after = probability_maps(m, r, c.settings);
    CHECK(after.dangerous == before.dangerous);
    CHECK(after.dangerous_already_critical == before.dangerous_already_critical);
  }
}
