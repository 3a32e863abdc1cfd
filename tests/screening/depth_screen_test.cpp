// The screen in depth of a scenario (screening/depth_screen.hpp): a fault's own depth range
// (fault-file attributes top and bottom) overrides the region's [faults] top..bottom, with the
// in-situ stress of each point's own depth, and the run-cost estimate counts its points.
#include "screening/depth_screen.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <string>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "screening/prepare.hpp"
#include "screening/run_cost.hpp"
#include "support/scenario_fixture.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::screening;

namespace {

// The fictional Corran Ridge region (regions/corran) copied into `dir` with CR-01's properties
// extended by `props`, and a scenario with one well on it.
scenario::ResolvedScenario corran_with_fault(const fs::path& dir, const nlohmann::json& props) {
  const fs::path src = fs::path(SLIPSCREEN_SOURCE_DIR) / "regions/corran";
  fs::copy_file(src / "region.toml", dir / "region.toml", fs::copy_options::overwrite_existing);
  nlohmann::json faults = nlohmann::json::parse(test::slurp(src / "faults.geojson"));
  for (auto& f : faults["features"])
    if (f["properties"]["fault_id"] == "CR-01") f["properties"].update(props);
  std::ofstream(dir / "faults.geojson") << faults.dump();
  std::ofstream(dir / "scenario.toml")
      << "[region]\nfile = \"region.toml\"\n[[proposed_well]]\nid = \"W1\"\nx = 500000.0\ny = 6120000.0\n"
         "crs = \"EPSG:32708\"\ntop = \"1900 m\"\nbottom = \"2000 m\"\nradius = \"0.1 m\"\n"
         "schedule = [\"10000 bbl/d from 2027-01-01 to 2032-01-01\"]\n"
         "[output]\nfolder = \"out\"\ntables = true\nrasters = false\ngeopackage = false\nreport = false\n"
         "[output.times]\ndates = [\"2029-01-01\"]\n";
  return scenario::load_scenario(dir / "scenario.toml");
}

}  // namespace

TEST_CASE("a fault's own top and bottom override the region's depth range in the screen in depth") {
  const test::TempDir dir("depth-screen-attributes");
  const scenario::ResolvedScenario s = corran_with_fault(dir.path(), {{"top", "3 km"}, {"bottom", 5000}});
  const PreparedRun p = prepare_run(s, false);
  const std::optional<DepthScreen> d = depth_screen(s, p);
  REQUIRE(d.has_value());
  std::size_t points = 0;
  for (std::size_t g = 0; g < p.segments.size(); ++g) {
    CAPTURE(p.segments[g].segment_id);
    std::set<double> depths;
    for (const auto& x : d->points[g]) depths.insert(std::round(x.z() * 1e6) / 1e6);
    // CR-01: its own 3–5 km at the region's 3 levels; CR-02: the region's 2.1–4.1 km
    // (regions/corran/region.toml)
    const std::set<double> want = p.segments[g].fault_id == "CR-01" ? std::set<double>{3000.0, 4000.0, 5000.0}
                                                                    : std::set<double>{2100.0, 3100.0, 4100.0};
    CHECK(depths == want);
    // each point's in-situ stress is the region's gradients at its own depth (25 MPa/km vertical)
    const auto& seg = d->inputs.segments[g];
    REQUIRE(seg.points.size() == d->points[g].size());
    for (std::size_t i = 0; i < seg.points.size(); ++i)
      CHECK(std::fabs(seg.points[i].stress.sv - 25e3 * d->points[g][i].z()) <= 1e-6 * seg.points[i].stress.sv);
    points += d->points[g].size();
  }
  CHECK(run_sizes(s, p).depth_points == points);  // the cost estimate counts the same points
}

TEST_CASE("a fault's own depth range is checked: named file, feature and field") {
  const test::TempDir dir("depth-screen-attributes-bad");
  const scenario::ResolvedScenario s = corran_with_fault(dir.path(), {{"top", "5 km"}, {"bottom", "4 km"}});
  CHECK_THROWS_WITH_AS(prepare_run(s, false),
                       doctest::Contains("faults.geojson layer 'corran_basement_faults' feature FID 0: field 'bottom' = "
                                         "'4 km': expected a depth below the fault's top (5 km)"),
                       InputError);
}
