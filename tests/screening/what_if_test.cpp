// What-if variants (screening/what_if.hpp) against separate runs of the full probabilistic screen
// with the changed rates and the same seed: every segment's slip count by every output time is
// the same (issue 13, "done when": a variant equals a separate run to the last bit of P).
#include "screening/what_if.hpp"

#include <doctest/doctest.h>

#include <algorithm>

#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "support/rate_steps_fixture.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::screening;
using slipscreen::test::TinyScenario;

namespace {
const char* kScenario =
    "\n[uncertainty]\nrealizations = 300\nsampler = \"latin-hypercube\"\nthresholds = [0.05]\n"
    "[uncertainty.formation]\npermeability = \"lognormal(median=200 mD, sigma_ln=0.4)\"\n"
    "[uncertainty.faults]\nfriction = \"truncnormal(mean=0.6, sd=0.05, min=0.4, max=0.8)\"\n"
    "[uncertainty.well.\"P1\"]\nrate_factor = \"uniform(0.8, 1.2)\"\n"
    "[[what_if]]\nname = \"half\"\nwells = [\"W1\"]\nfactor = 0.5\nfrom = \"2020-02-15\"\n"
    "[[what_if]]\nname = \"p1_double\"\nwells = [\"P1\"]\nfactor = 2\nfrom = \"2022-01-01\"\n"
    "[[what_if]]\nname = \"near_f1\"\nfault = \"F1\"\nradius = \"50 km\"\nfactor = 1.5\nfrom = \"2021-06-01\"\n";
}  // namespace

TEST_CASE("what-if variants equal separate runs with the changed rates, count for count") {
  TinyScenario t;
  t.append("scenario.toml", kScenario);
  const scenario::ResolvedScenario s = scenario::load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  ProbabilisticRun prob = run_probabilistic_screen(s, p, s.uncertainty);
  const WhatIfResult w = what_if_result(s, p, prob);
  REQUIRE(w.variant.size() == 3);
  std::vector<std::string> fault_ids;
  std::vector<std::size_t> segment_fault;
  const auto model = uncertain_model(s, p, s.uncertainty, fault_ids, segment_fault);
  auto settings = prob.settings;
  settings.what_if.clear();
  settings.map_points.clear();
  for (std::size_t v = 0; v < w.variant.size(); ++v) {
    CAPTURE(w.names[v]);
    auto wells = prob.wells;
    for (auto& well : wells)
      if (std::find(w.wells[v].begin(), w.wells[v].end(), well.id) != w.wells[v].end())
        well.steps = slipscreen::test::scaled_from(well.steps, w.factors[v], w.from[v]);
    const auto separate = probabilistic::run_probabilistic(model, wells, prob.segments, settings);
    REQUIRE(separate.realizations == w.realizations);
    std::uint64_t changed = 0;
    for (std::size_t i = 0; i < separate.segments.size(); ++i) {
      CAPTURE(w.segment_ids[i]);
      CHECK(w.variant[v][i] == separate.segments[i].slipped_by);
      for (std::size_t k = 0; k < w.base[i].size(); ++k)
        changed += w.variant[v][i][k] != w.base[i][k];
    }
    MESSAGE(w.names[v] << ": " << changed << " (segment, date) counts differ from the base");
  }
  CHECK(w.wells[2].size() >= 2);  // the radius around F1 holds several wells
}
