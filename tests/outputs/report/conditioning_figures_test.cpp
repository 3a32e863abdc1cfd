// The conditioning figures against the conditioned tables of the demo run (its pressure
// observations are FICTIONAL), and none for a run that was not conditioned.
#include "outputs/report/conditioning_figures.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <map>
#include <set>

#include "outputs/report/figure_checks.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/demo_run_fixture.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::outputs::report;
using slipscreen::test::FigureRows;
using slipscreen::test::read_rows;
using slipscreen::test::Rows;

TEST_CASE("observation_figure_name: lower case, [a-z0-9-] kept, the rest '_'") {
  CHECK(observation_figure_name("OBS-A") == "observation_fit_obs-a");
  CHECK(observation_figure_name("MW 7/b") == "observation_fit_mw_7_b");
}

TEST_CASE("a run that was not conditioned has no conditioning figures") {
  test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  CHECK(conditioning_figures(test::source_of(out)).empty());
}

TEST_CASE("conditioning figures of the demo run draw the values of observation_fit.csv and posterior_inputs.csv") {
  const fs::path run = test::demo_run_folder();
  const auto figures = conditioning_figures(test::source_of(run));
  test::write_for_viewing(figures);
  std::map<std::string, const Figure*> by_name;
  for (const auto& f : figures) by_name[f.name] = &f;

  SUBCASE("one figure per observation point, its rows the table's in date order") {
    const Rows fit = read_rows(run, "observation_fit.csv");
    REQUIRE(fit.size() > 3);
    std::set<std::string> ids;
    for (std::size_t i = 0; i < fit.size(); ++i) ids.insert(fit.at(i, "observation_id"));
    REQUIRE(ids.size() >= 2);
    std::size_t rows = 0;
    for (const auto& id : ids) {
      REQUIRE_MESSAGE(by_name.count(observation_figure_name(id)), id);
      const FigureRows d{by_name[observation_figure_name(id)]->data};
      std::vector<std::size_t> mine;
      for (std::size_t i = 0; i < fit.size(); ++i)
        if (fit.at(i, "observation_id") == id) mine.push_back(i);
      std::stable_sort(mine.begin(), mine.end(), [&](std::size_t a, std::size_t b) { return fit.at(a, "date") < fit.at(b, "date"); });
      REQUIRE(d.data.rows.size() == mine.size());
      for (std::size_t k = 0; k < mine.size(); ++k) {
        CHECK(d.at(k, "observation_id") == id);
        CHECK(d.at(k, "date") == fit.at(mine[k], "date"));
        for (const char* c : {"observed_dp_MPa", "sigma_MPa", "prior_p05_MPa", "prior_p50_MPa", "prior_p95_MPa",
                              "conditioned_p05_MPa", "conditioned_p50_MPa", "conditioned_p95_MPa"})
          CHECK(d.at(k, c) == fit.at(mine[k], c));
      }
      rows += mine.size();
    }
    CHECK(rows == fit.size());
  }

  SUBCASE("prior against posterior: the table's values, drawn on the prior's P5-P95 scale") {
    REQUIRE(by_name.count("posterior_inputs"));
    const FigureRows d{by_name["posterior_inputs"]->data};
    const Rows post = read_rows(run, "posterior_inputs.csv");
    REQUIRE(d.data.rows.size() == post.size());  // every input listed is uncertain (a prior spread)
    for (std::size_t i = 0; i < post.size(); ++i) {
      CHECK(d.at(i, "input") == post.at(i, "input"));
      const double p05 = post.number(i, "prior_p05"), p95 = post.number(i, "prior_p95");
      for (const char* c : {"prior_p05", "prior_p50", "prior_p95", "posterior_p05", "posterior_p50", "posterior_p95"}) {
        CHECK(d.at(i, c) == post.at(i, c));
        // The drawn position: (v − prior P5) / (prior P95 − prior P5), to the CSV's 10 digits.
        CHECK(d.number(i, std::string(c) + "_scaled") ==
              doctest::Approx((post.number(i, c) - p05) / (p95 - p05)).epsilon(1e-9).scale(1.0));
      }
      CHECK(d.number(i, "prior_p05_scaled") == 0.0);
      CHECK(d.number(i, "prior_p95_scaled") == 1.0);
    }
  }
}
