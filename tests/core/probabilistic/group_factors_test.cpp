// The group's critical factors and what-if variants in the engine (group_factors.hpp): two
// routes through the same realizations must agree. P(slip by T | f) from the f_crit values
// (closed form, critical_factor.hpp) against the first-crossing search of a what-if variant with
// the group's rates times f; and the variant at f = 1 against the screen's own counts. A count may
// differ by one where a realization's Δp equals Δp_crit to rounding (the two routes sum the same
// terms in a different order), so the checks allow that. Fictional case (strike_slip_case.hpp).
#include "core/probabilistic/group_factors.hpp"

#include <doctest/doctest.h>

#include <cstdlib>
#include <numbers>
#include <tuple>

#include "core/probabilistic/slip_probability.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDay = 86400.0;
constexpr double kDeg = std::numbers::pi / 180.0;

// Two wells (W2 starts 3 years later), segments at 1.5 to 9 km, uncertain friction and
// permeability, 400 realizations; the group is W2 (kept apart without a split).
struct Case {
  UncertainModel model = test::strike_slip_model();
  std::vector<WellInput> wells;
  std::vector<SegmentInput> segments;
  RunSettings settings;
  Case() {
    model.friction = Distribution::normal(0.6, 0.05);
    model.permeability = Distribution::lognormal(2e-14, 0.4);
    for (const auto& [id, x, on] : {std::tuple{"W1", 0.0, 0.0}, std::tuple{"W2", 2500.0, 3 * 365 * kDay}}) {
      WellInput w;
      w.id = id;
      w.x = x;
      w.steps.time = {on, on + 5 * 365 * kDay};
      w.steps.delta_rate = {0.04, -0.04};
      wells.push_back(w);
    }
    for (double r : {1500.0, 3000.0, 5000.0, 9000.0}) {
      SegmentInput s;
      s.check_points = {{r, -300.0}, {r, 0.0}, {r, 300.0}};
      s.strike = 15 * kDeg;
      s.dip = 80 * kDeg;
      s.fault = segments.size();
      segments.push_back(s);
    }
    for (int m = 1; m <= 120; ++m) settings.tracking_times.push_back(m * 30 * kDay);
    settings.output_index = {35, 119};
    settings.realizations = 400;
    settings.method = stats::SamplingMethod::latin_hypercube;
    settings.attribute_median = false;
  }
  GroupSplit group(double factor) const {
    GroupSplit g;
    g.wells = wells;
    g.origin = {0, 1};
    g.in_group = {0, 1};
    g.horizon = 119;
    g.f_max = 10.0;
    g.factor = factor;
    return g;
  }
};
}  // namespace

TEST_CASE("P(slip by T | f) from the critical factors equals what-if variants with the rates times f") {
  Case c;
  c.settings.capacity = c.group(1.0);
  for (double f : {0.0, 0.5, 1.0, 2.0, 4.0}) c.settings.what_if.push_back(c.group(f));
  const ProbabilisticResult r = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(r.capacity.size() == c.segments.size());
  REQUIRE(r.what_if.size() == 5);
  int moving = 0;
  for (std::size_t s = 0; s < c.segments.size(); ++s) {
    CAPTURE(s);
    const auto base = static_cast<long long>(r.segments[s].slipped_by.back());
    CHECK(std::llabs(static_cast<long long>(r.capacity[s].slipped(1.0)) - base) <= 1);
    CHECK(std::llabs(static_cast<long long>(r.what_if[2][s].back()) - base) <= 1);  // f = 1
    std::size_t v = 0;
    for (double f : {0.0, 0.5, 1.0, 2.0, 4.0}) {
      CAPTURE(f);
      CHECK(std::llabs(static_cast<long long>(r.capacity[s].slipped(f)) - static_cast<long long>(r.what_if[v][s].back())) <= 1);
      ++v;
    }
    moving += r.capacity[s].slipped(4.0) > r.capacity[s].slipped(0.0) + 10;
  }
  CHECK(moving >= 2);  // the group's factor changes the answer at several segments
}
