// The probabilistic screen of faults in depth (screening/depth_probability.hpp): the scenario's
// [uncertainty] reaches the engine of core/poro/depth_monte_carlo.hpp (that engine's own counts
// are checked against per-draw deterministic screens in tests/core/poro/depth_monte_carlo_test.cpp).
#include "screening/depth_probability.hpp"

#include <doctest/doctest.h>

#include <omp.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "core/errors.hpp"
#include "run/run_scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::screening;

namespace {

const fs::path kData = fs::path(SLIPSCREEN_TEST_DATA) / "scenario";

// The fictional Corran Ridge scenario (regions/corran) with two output dates and `uncertainty`.
scenario::ResolvedScenario corran_with(const fs::path& dir, const std::string& uncertainty) {
  const fs::path file = dir / "scenario.toml";
  std::ofstream f(file);
  f << "[region]\nfile = \"" << (fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/corran/region.toml").generic_string()
    << "\"\n[[proposed_well]]\nid = \"W1\"\nx = 500000.0\ny = 6120000.0\ncrs = \"EPSG:32708\"\ntop = \"1900 m\"\n"
       "bottom = \"2000 m\"\nradius = \"0.1 m\"\nschedule = [\"10000 bbl/d from 2027-01-01 to 2032-01-01\"]\n"
       "[output]\nfolder = \"out\"\ntables = true\nrasters = false\ngeopackage = false\nreport = false\n"
       "[output.times]\ndates = [\"2029-01-01\", \"2035-01-01\"]\n"
    << uncertainty;
  f.close();
  return scenario::load_scenario(file);
}

// 1 when the deterministic screen `g` has the segment failed by `t`, else 0.
std::uint32_t failed_by(const poro::DepthSegmentScreen& g, double t) {
  return g.already_critical || (g.first_crossing && *g.first_crossing <= t);
}

}  // namespace

TEST_CASE("point-mass inputs: every realization is the deterministic screen in depth, P is 0 or 1") {
  // Two sets of point masses: none (every input the region's own; no segment fails on the Corran
  // example) and a lower permeability and friction (every segment fails): the counts must be 0
  // or N as the deterministic screen with those values, built here independently of the draws.
  struct Variant {
    const char* keys;
    double permeability_md;  // 0: the region's
    double friction;         // 0: each segment's own
  };
  int failed = 0, intact = 0;
  for (const Variant v : {Variant{"", 0.0, 0.0},
                          Variant{"[uncertainty.formation]\npermeability = \"20 mD\"\n[uncertainty.faults]\nfriction = \"0.45\"\n",
                                  20.0, 0.45}}) {
    CAPTURE(v.keys);
    const test::TempDir dir("depth-probability-point");
    const scenario::ResolvedScenario s =
        corran_with(dir.path(), std::string("[uncertainty]\nrealizations = 4\n") + v.keys);
    const PreparedRun p = prepare_run(s, false);
    const std::optional<DepthScreen> d = depth_screen(s, p);
    REQUIRE(d.has_value());
    const std::optional<DepthDraws> draws = depth_draws(s, p);
    REQUIRE(draws.has_value());
    REQUIRE(draws->draws.size() == 4);
    const DepthProbability prob = depth_probability(s, *d, *draws);
    poro::DepthScreenInputs in = d->inputs;
    poro::PoroelasticMedium m = scenario::poroelastic_medium_of(s.region.formation);
    // 1 mD = 9.869233e-16 m² (common practice, the darcy's definition)
    if (v.permeability_md > 0) m.permeability = v.permeability_md * 9.869233e-16;
    in.medium = poro::rudnicki_constants(m);
    if (v.friction > 0)
      for (auto& seg : in.segments) seg.friction = v.friction;
    const poro::DepthScreenResult det = poro::depth_screen(in);
    REQUIRE(prob.slipped.size() == det.segments.size());
    CHECK(prob.realizations == 4);
    for (std::size_t g = 0; g < det.segments.size(); ++g)
      for (std::size_t k = 0; k < in.output_times.size(); ++k) {
        const std::uint32_t expect = failed_by(det.segments[g], in.output_times[k]) ? 4u : 0u;
        CHECK(prob.slipped[g][k] == expect);
        (expect ? failed : intact) += 1;
      }
  }
  // both outcomes occur, so the comparison could fail either way
  CHECK(failed > 0);
  CHECK(intact > 0);
}

TEST_CASE("the 3-D Monte Carlo run: fault_depth_probability.csv, README and manifest, same for 1 and 2 threads") {
  const test::TempDir dir("depth-probability-threads");
  const scenario::ResolvedScenario s = scenario::load_scenario(kData / "poro3d/poro3d_mc.toml");
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  run::run_scenario(s, test::options_into(dir.path() / "one"));
  omp_set_num_threads(2);
  run::run_scenario(s, test::options_into(dir.path() / "two"));
  omp_set_num_threads(before);
  for (const char* f : {"fault_depth_probability.csv", "fault_depth.csv", "manifest.json", "README.txt"}) {
    CAPTURE(f);
    CHECK(test::slurp(dir.path() / "one" / f) == test::slurp(dir.path() / "two" / f));
  }
  const std::string csv = test::slurp(dir.path() / "one" / "fault_depth_probability.csv");
  CHECK(csv.rfind("segment_id,fault_id,date,realizations,realizations_slipped,p_slip,p_slip_ci_low,p_slip_ci_high,"
                  "thresholds_reached",
                  0) == 0);
  CHECK(csv.find(",8,") != std::string::npos);  // 8 realizations on every row
  CHECK(test::slurp(dir.path() / "one" / "README.txt").find("fault_depth_probability.csv") != std::string::npos);
  CHECK(test::slurp(dir.path() / "one" / "manifest.json").find("\"depth_probability\"") != std::string::npos);
  // no Theis probabilistic tables: [uncertainty] drives the screen in depth only
  CHECK_FALSE(fs::exists(dir.path() / "one" / "segment_probability.csv"));
}

TEST_CASE("overlapping drained and undrained Poisson's ratios are refused before any computing") {
  const test::TempDir dir("depth-probability-bad");
  const scenario::ResolvedScenario s = scenario::load_scenario(kData / "bad/poro3d_mc_poisson_overlap.toml");
  run::RunOptions o = test::options_into(dir.path() / "out");
  std::vector<std::string> stages;
  o.progress = [&](const std::string& stage, double) {
    if (stages.empty() || stages.back() != stage) stages.push_back(stage);
  };
  CHECK_THROWS_WITH_AS(run::run_scenario(s, o), doctest::Contains("0 <= nu < nu_u < 0.5"), InputError);
  CHECK(stages == std::vector<std::string>{"reading faults and wells"});
  CHECK_FALSE(fs::exists(dir.path() / "out"));
}
