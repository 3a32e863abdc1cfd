// The bundled demo region (regions/marrowick, FICTIONAL) meets what docs/regions.md describes and is
// exactly what tools/make-demo-region.py generates.
#include <doctest/doctest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include "scenario/scenario.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::scenario;
using slipscreen::test::slurp;

TEST_CASE("demo scenario: at least 12 wells with 8-15 years of monthly volumes, several shut in, one proposed") {
  const fs::path dir = fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick";
  const ResolvedScenario s = load_scenario(dir / "scenario.toml");
  int existing = 0, shut = 0, proposed = 0;
  for (const auto& w : s.wells) {
    if (w.proposed) {
      ++proposed;
      REQUIRE(!w.periods.empty());
      const double years = (w.periods.back().end - w.periods.front().start) / (365.25 * 86400);
      CHECK(years == doctest::Approx(10.0).epsilon(0.001));
      continue;
    }
    ++existing;
    shut += w.status == WellStatus::shut_in;
    CHECK(w.periods.size() >= 96);
    CHECK(w.periods.size() <= 180);
  }
  CHECK(existing >= 12);
  CHECK(shut >= 3);
  CHECK(proposed == 1);
  CHECK(s.region.stress.model == StressModel::a_phi);
  CHECK(s.region.crs == "EPSG:32708");
  CHECK(s.output.dates.size() == 18);
}

TEST_CASE("demo region files are labelled fictional") {
  const fs::path dir = fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick";
  for (const char* f : {"README.md", "region.toml", "scenario.toml", "wells.csv", "histories.csv", "faults.geojson",
                        "pressures.csv"}) {
    CAPTURE(f);
    CHECK(slurp(dir / f).find("FICTIONAL") != std::string::npos);
  }
}

TEST_CASE("tools/make-demo-region.py regenerates the committed files byte for byte") {
  const fs::path out = fs::temp_directory_path() / "slipscreen-demo-region-check";
  fs::remove_all(out);
  const std::string cmd = "/usr/bin/python3 '" + (fs::path(SLIPSCREEN_SOURCE_DIR) / "tools/make-demo-region.py").string() +
                          "' '" + out.string() + "'";
  REQUIRE(std::system(cmd.c_str()) == 0);
  const fs::path dir = fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick";
  std::set<std::string> names;
  for (const auto& e : fs::directory_iterator(out)) names.insert(e.path().filename().string());
  CHECK(names.size() == 6);
  for (const auto& n : names) {
    CAPTURE(n);
    CHECK(slurp(out / n) == slurp(dir / n));
  }
  fs::remove_all(out);
}

TEST_CASE("tools/make-demo-observations.py regenerates the committed observations byte for byte") {
  const fs::path out = fs::temp_directory_path() / "slipscreen-demo-observations-check";
  fs::remove_all(out);
  fs::create_directories(out);
  const fs::path dir = fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick";
  for (const char* f : {"wells.csv", "histories.csv"}) fs::copy_file(dir / f, out / f);
  const std::string cmd = "/usr/bin/python3 '" +
                          (fs::path(SLIPSCREEN_SOURCE_DIR) / "tools/make-demo-observations.py").string() + "' '" +
                          out.string() + "'";
  REQUIRE(std::system(cmd.c_str()) == 0);
  CHECK(slurp(out / "pressures.csv") == slurp(dir / "pressures.csv"));
  const ResolvedScenario s = load_scenario(dir / "scenario.toml");
  REQUIRE(s.observations);
  CHECK(s.observations->pressure.size() >= 20);  // two monitoring wells and a few shut-in surveys
  fs::remove_all(out);
}
