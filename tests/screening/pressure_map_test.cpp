// The pressure map of a run (screening/pressure_map.cpp) against the exact Theis superposition of
// core/hydro/pressure_field (Theis 1935, with image wells), evaluated cell by cell.
#include "screening/pressure_map.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/hydro/pressure_field.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;

TEST_CASE("the pressure map agrees with the exact Theis sum at every cell centre") {
  const test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const screening::PreparedRun p = screening::prepare_run(s, false);
  const screening::PressureMap map = screening::pressure_map(s, p);
  REQUIRE(map.dp.size() == s.output.times.size());

  std::vector<hydro::WellSource> wells;
  for (const auto& w : p.inputs.wells) wells.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(wells), p.inputs.boundaries);
  std::vector<hydro::FieldPoint> centres;
  for (int j = 0; j < p.grid.rows; ++j)
    for (int i = 0; i < p.grid.columns; ++i) centres.push_back({p.grid.cell_centre(i, j).x, p.grid.cell_centre(i, j).y});
  const hydro::PressureResult exact = field.evaluate(field.prepare(centres), s.output.times, p.inputs.formation);

  // The grid engine's stated accuracy (core/hydro/pressure_grid.hpp): within 1e-4 relative where
  // |Δp| >= 1 kPa, within 0.1 Pa elsewhere.
  std::size_t significant = 0;
  for (std::size_t k = 0; k < map.dp.size(); ++k) {
    REQUIRE(map.dp[k].size() == p.grid.cell_count());
    for (int j = 0; j < p.grid.rows; ++j)
      for (int i = 0; i < p.grid.columns; ++i) {
        const double want = exact.at(static_cast<std::size_t>(j * p.grid.columns + i), k);
        const double got = map.dp[k][p.grid.index(i, j)];
        if (std::abs(want) >= 1e3) {
          ++significant;
          CHECK(std::abs(got - want) <= 1e-4 * std::abs(want));
        } else {
          CHECK(std::abs(got - want) <= 0.1);
        }
      }
  }
  CHECK(significant > 10);  // the comparison covers the pressure footprint, not only zeros
}

TEST_CASE("a leaky formation with a huge aquitard resistance is Theis to 1e-10 in a run's screens") {
  // Hantush & Jacob (1955): W(u, r/B) → E1(u) as B → ∞. B = 1e12 m: c_L t ≈ 1e-16 here.
  const test::TinyScenario theis;
  test::TinyScenario leaky;
  leaky.replace("region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"0.5 cP\"\nmodel = \"leaky\"\nleakage_factor = \"1e12 m\"");
  const auto st = scenario::load_scenario(theis.scenario());
  const auto sl = scenario::load_scenario(leaky.scenario());
  const screening::PreparedRun pt = screening::prepare_run(st, false), pl = screening::prepare_run(sl, false);
  REQUIRE(pl.inputs.formation.leakage_rate > 0.0);
  const auto rt = screen::deterministic_screen(pt.inputs), rl = screen::deterministic_screen(pl.inputs);
  std::size_t compared = 0;
  for (std::size_t i = 0; i < rt.segments.size(); ++i)
    for (std::size_t k = 0; k < rt.segments[i].dp.size(); ++k) {
      const double a = rt.segments[i].dp[k], b = rl.segments[i].dp[k];  // exact sums at the output times
      if (a == 0.0) continue;
      CHECK(std::abs(b - a) <= 1e-10 * std::abs(a));
      ++compared;
    }
  CHECK(compared > 10);
  // The map takes the direct sum for a leaky formation: the same to 1e-10 where Δp ≥ 1 kPa.
  const auto mt = screening::pressure_map(st, pt), ml = screening::pressure_map(sl, pl);
  for (std::size_t k = 0; k < mt.dp.size(); ++k)
    for (std::size_t c = 0; c < mt.dp[k].size(); ++c)
      if (std::abs(mt.dp[k][c]) >= 1e3) CHECK(std::abs(ml.dp[k][c] - mt.dp[k][c]) <= 1e-4 * std::abs(mt.dp[k][c]));
}
