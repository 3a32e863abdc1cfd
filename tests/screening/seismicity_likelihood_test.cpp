// The earthquakes of a conditioned run ([observations] seismicity = true): the tiny scenario with
// a small projected catalog (invented events placed where the answer is known by construction).
#include "screening/seismicity_likelihood.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::screening;
using slipscreen::test::options_into;
using slipscreen::test::slurp;
using slipscreen::test::TinyScenario;

namespace {

// Events (invented, EPSG:32708 metres, depth in m); Mc is given as 1.1:
//   E1 M1.2 before any injection (the first injection is 2020-01-01): outside the window
//   E2 M1.5 693 m from fault F1's trace (its perpendicular distance from (501000, 6120000) to
//      (503000, 6123000)), far from F2
//   E3 M2.1 on F1's trace
//   E4 M1.0 below Mc, the catalog's last event (2022-07-01: the window's end)
const char* kCatalog =
    "# invented test events\n"
    "id,time,x,y,depth,magnitude,magnitude_type\n"
    "E1,2019-06-01T00:00:00Z,497000,6118000,3000,1.2,ML\n"
    "E2,2022-01-01T00:00:00Z,500500,6120500,3100,1.5,ML\n"
    "E3,2022-06-15T12:00:00Z,501250,6120375,2900,2.1,ML\n"
    "E4,2022-07-01T00:00:00Z,520000,6140000,3000,1.0,ML\n";

const char* kTables =
    "\n[catalog]\n"
    "file = \"catalog.csv\"\n"
    "columns = \"x=x;y=y;crs=EPSG:32708;depth_unit=m\"\n"
    "mc = 1.1\n"
    "\n[catalog.rate_state]\n"
    "background_rate_per_km = \"0.01 1/yr\"\n"
    "a_sigma = \"0.1 MPa\"\n"
    "aftershock_duration = \"100 yr\"\n"
    "\n[uncertainty]\n"
    "realizations = 64\n"
    "sampler = \"latin-hypercube\"\n"
    "[uncertainty.formation]\n"
    "permeability = \"lognormal(median=200 mD, sigma_ln=0.6)\"\n"
    "[uncertainty.seismicity]\n"
    "a_sigma = \"lognormal(median=0.1 MPa, sigma_ln=0.5)\"\n";

struct SeismicScenario : TinyScenario {
  explicit SeismicScenario(const std::string& observations = "seismicity = true\n") {
    write("catalog.csv", kCatalog);
    replace("scenario.toml", "cog = false\n", "cog = false\nreport = false\n");
    append("scenario.toml", std::string(kTables) + (observations.empty() ? "" : "\n[observations]\n" + observations));
  }
};

std::string refusal(const TinyScenario& t) {
  try {
    const auto s = scenario::load_scenario(t.scenario());
    seismicity_use(s, prepare_run(s, false));
  } catch (const InputError& e) {
    return e.what();
  }
  return "(not refused)";
}

}  // namespace

TEST_CASE("seismicity_use: events at or above Mc in the window, assigned within the distance") {
  SUBCASE("2 km (the default): E2 and E3 on F1's segments") {
    SeismicScenario t;
    const auto s = scenario::load_scenario(t.scenario());
    const auto u = seismicity_use(s, prepare_run(s, false));
    REQUIRE(u);
    CHECK(u->catalog_events == 4);
    CHECK(u->mc == 1.1);
    CHECK(u->distance == 2000.0);
    CHECK(u->below_mc == 1);        // E4
    CHECK(u->outside_window == 1);  // E1
    CHECK(u->used == 2);
    CHECK(u->assigned == 2);
    CHECK(u->pool == 0);
    CHECK(u->data.pool_rate == 0.0);
    CHECK(u->data.t0 == formats::parse_iso8601_utc("2020-01-01T00:00:00Z", "t0"));
    CHECK(u->data.t1 == formats::parse_iso8601_utc("2022-07-01T00:00:00Z", "t1"));
    // τ̇_r = Aσ / t_a of [catalog.rate_state]: 0.1 MPa per 100 years.
    CHECK(u->data.stressing_rate == doctest::Approx(1e5 / (100 * 365.25 * 86400)).epsilon(1e-3));
  }
  SUBCASE("0.5 km: E2 (693 m away) goes to the background pool at its maximum-likelihood rate") {
    SeismicScenario t("seismicity = true\nseismicity_distance = \"0.5 km\"\n");
    const auto s = scenario::load_scenario(t.scenario());
    const auto u = seismicity_use(s, prepare_run(s, false));
    REQUIRE(u);
    CHECK(u->assigned == 1);
    CHECK(u->pool == 1);
    CHECK(u->data.pool_rate == 1.0 / (u->data.t1 - u->data.t0));
  }
}

TEST_CASE("a run conditioned on the earthquakes only writes the weights and says what it used") {
  SeismicScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, options_into(out));
  const auto m = nlohmann::json::parse(slurp(out / "manifest.json"));
  const auto& c = m.at("parameters").at("probabilistic").at("conditioning");
  CHECK(c.at("pressure_observations") == 0);
  CHECK(c.at("seismicity").at("events_used") == 2);
  CHECK(c.at("seismicity").at("events_assigned") == 2);
  CHECK(c.at("seismicity").at("mc") == 1.1);
  CHECK(c.at("effective_sample_size").get<double>() < 64.0);  // the events carry information
  // The posterior of the uncertain Aσ is reported beside the prior's.
  const auto post = formats::read_csv(out / "posterior_inputs.csv", "posterior_inputs.csv");
  bool a_sigma = false;
  for (const auto& row : post.rows) a_sigma = a_sigma || (row.fields.at(0) == "a_sigma" && row.fields.at(1) == "Pa");
  CHECK(a_sigma);
}

TEST_CASE("seismicity inputs are refused before computing, naming [observations] seismicity") {
  SUBCASE("no [catalog]") {
    TinyScenario t;
    t.append("scenario.toml", "\n[uncertainty]\nrealizations = 16\n\n[observations]\nseismicity = true\n");
    const std::string e = refusal(t);
    CHECK(e.find("observations.seismicity") != std::string::npos);
    CHECK(e.find("a [catalog] table too") != std::string::npos);
  }
  SUBCASE("a distance out of range") {
    SeismicScenario t("seismicity = true\nseismicity_distance = \"80 km\"\n");
    CHECK(refusal(t).find("at most 50 km") != std::string::npos);
  }
  SUBCASE("a distance without seismicity = true") {
    SeismicScenario t("pressure = \"none.csv\"\nseismicity_distance = \"1 km\"\n");
    CHECK(refusal(t).find("seismicity = true under [observations] too") != std::string::npos);
  }
  SUBCASE("[uncertainty.seismicity] without seismicity = true") {
    SeismicScenario t("");  // no [observations] at all
    const std::string e = refusal(t);
    CAPTURE(e);
    CHECK(e.find("uncertainty.seismicity.a_sigma") != std::string::npos);
  }
  SUBCASE("a catalog period that ends before the first injection") {
    SeismicScenario t;
    t.replace("scenario.toml", "mc = 1.1\n", "mc = 1.1\nto = \"2019-12-01\"\n");
    const std::string e = refusal(t);
    CHECK(e.find("observations.seismicity") != std::string::npos);
    CHECK(e.find("after the first injection") != std::string::npos);
  }
}
