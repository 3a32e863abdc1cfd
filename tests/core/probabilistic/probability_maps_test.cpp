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

TEST_CASE("probability maps: the surrogates and the median's table nodes are the same, built by blocks of wells") {
  // The 150 km pixel lies beyond the segment's tables, so the map's surrogate needs its own wider
  // tables; with only the 500 m pixel it is built from the model's tables. A block budget of one
  // byte builds the tables well by well (three wells here), the default all at once; the
  // reference is a surrogate built from every table at once (pressure_surrogate.hpp).
  for (bool far_pixel : {true, false}) {
    CAPTURE(far_pixel);
    Case c;
    if (!far_pixel) c.settings.map_points.pop_back();
    c.settings.attribute_median = true;
    c.wells.push_back(WellInput{"W2", 3000.0, 500.0, 0.1, {{100 * kDay}, {0.03}}});
    c.wells.push_back(WellInput{"W3", -2000.0, -800.0, 0.1, {{400 * kDay, 900 * kDay}, {0.02, -0.02}}});
    const InputList list = make_inputs(c.model, c.wells, 1);
    const auto r = sample_realizations(c.model, list, c.segments, 1, c.settings, stats::RealizationCount(200));
    const PressureModel whole = build_pressure_model(c.wells, c.segments, c.settings, list, r);
    RunSettings by_well = c.settings;
    by_well.table_block_bytes = 1.0;
    const PressureModel blocks = build_pressure_model(c.wells, c.segments, by_well, list, r);
    REQUIRE(blocks.map_surrogate.has_value());
    REQUIRE(whole.map_surrogate.has_value());
    const auto same = [](const hydro::PressureSurrogate& a, const hydro::PressureSurrogate& b) {
      REQUIRE(a.point_count() == b.point_count());
      for (std::size_t p = 0; p < a.point_count(); ++p)
        for (std::size_t g = 0; g < a.group_count(); ++g) CHECK(a.table(p, g) == b.table(p, g));
      CHECK(a.max_relative_error() == b.max_relative_error());
    };
    same(*blocks.surrogate, *whole.surrogate);
    same(*blocks.map_surrogate, *whole.map_surrogate);
    // Against every table built at once, on the map's grid (the model's, or wider for 150 km).
    double r2m = 0.0;
    for (const auto& p : c.settings.map_points)
      for (const auto& s : whole.sources) r2m = std::max(r2m, (p.x - s.x) * (p.x - s.x) + (p.y - s.y) * (p.y - s.y));
    hydro::SimilarityGrid grid = whole.grid;
    grid.ln_x_max = std::max(grid.ln_x_max, std::log(r2m / (4.0 * whole.diffusivity_min)) + 0.1);
    CHECK((grid.ln_x_max > whole.grid.ln_x_max) == far_pixel);
    const auto tables = hydro::build_tables(whole.steps, c.settings.tracking_times, grid);
    same(*blocks.map_surrogate, hydro::PressureSurrogate(tables, whole.sources, c.settings.map_points, whole.groups,
                                                         whole.diffusivity_min, whole.diffusivity_max, whole.nodes));
    const auto model_tables = hydro::build_tables(whole.steps, c.settings.tracking_times, whole.grid);
    REQUIRE(blocks.median_nodes.size() == c.settings.output_index.size() * c.wells.size());
    for (std::size_t t = 0; t < c.settings.output_index.size(); ++t)
      for (std::size_t w = 0; w < c.wells.size(); ++w)
        CHECK(blocks.median_nodes[t * c.wells.size() + w] == model_tables[w].nodes_at(c.settings.output_index[t]));
    CHECK(probability_maps(blocks, r, by_well).dangerous == probability_maps(whole, r, c.settings).dangerous);
  }
}

TEST_CASE("probability maps: a model built without the map's points is refused, not mapped") {
  Case c;
  const InputList list = make_inputs(c.model, c.wells, 1);
  const auto r = sample_realizations(c.model, list, c.segments, 1, c.settings, stats::RealizationCount(50));
  RunSettings none = c.settings;
  none.map_points.clear();
  const PressureModel m = build_pressure_model(c.wells, c.segments, none, list, r);
  CHECK_FALSE(m.map_surrogate.has_value());
  CHECK_THROWS_AS(probability_maps(m, r, c.settings), InputError);
}
