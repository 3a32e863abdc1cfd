// The catalog command's output folder (written through a temporary folder, refused when it
// exists unless --force) and its r-t tables.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "cli/app.hpp"
#include "cli/context.hpp"

namespace fs = std::filesystem;

namespace {
std::string slurp(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}
}  // namespace

TEST_CASE("catalog --out writes the summary, events and r-t tables") {
  const fs::path dir = fs::temp_directory_path() / "slipscreen_catalog_out_test";
  fs::remove_all(dir);
  const std::string fixture = std::string(SLIPSCREEN_SOURCE_DIR) + "/tests/data/catalog/fixture_catalog.xml";
  std::ostringstream out, err;
  const std::vector<std::string> args = {"catalog", fixture, "--well", "-98.2031,35.5012", "--start",
                                         "2024-01-01T00:00:00Z", "--diffusivity", "0.1 m2/s,1 m2/s", "--out", dir.string()};
  REQUIRE(slipscreen::cli::run(args, out, err) == 0);
  CAPTURE(err.str());
  for (const char* f : {"catalog_summary.json", "catalog_events.csv", "rt_events.csv", "rt_fronts.csv", "README.txt",
                        "manifest.json"})
    CHECK(fs::exists(dir / f));
  const auto j = nlohmann::json::parse(slurp(dir / "catalog_summary.json"));
  CHECK(j["events"] == 12);
  CHECK(j["rt_view"]["events_after_start"] == 12);
  const std::string rt = slurp(dir / "rt_events.csv");
  // ev01 is at the well itself: distance 0 m, 2 days 4 h 12 min 9.25 s = 2.1751 days after the start.
  CHECK(rt.find("smi:slipscreen.test/ev01,2024-01-03T04:12:09.250Z,2.1751,0.0,1.2,0") != std::string::npos);
  // Plain tables: one header line, no comment line; the caution is in README.txt and the manifest.
  const std::string fronts = slurp(dir / "rt_fronts.csv");
  CHECK(fronts.rfind("diffusivity_m2_per_s,time_since_start_days,front_radius_m\n", 0) == 0);
  // r = sqrt(4 pi D t) at t = 0: 0 m (Shapiro et al. 1997); one row per diffusivity and time.
  CHECK(fronts.find("\n0.1,0.0000,0.0\n") != std::string::npos);
  CHECK(fronts.find("\n1,0.0000,0.0\n") != std::string::npos);
  CHECK(rt.rfind("event_id,time,time_since_start_days,distance_m,magnitude,diffusivity_through_point_m2_per_s\n", 0) == 0);
  const std::string events = slurp(dir / "catalog_events.csv");
  CHECK(events.rfind("event_id,time,longitude_deg,latitude_deg,depth_m,magnitude,magnitude_type\n", 0) == 0);
  for (const auto& text : {fronts, rt, events}) CHECK(text.find("Screening estimate") == std::string::npos);
  const std::string readme = slurp(dir / "README.txt");
  CHECK(readme.find("Screening estimate") != std::string::npos);
  CHECK(readme.find("\nrt_fronts.csv ") != std::string::npos);
  const auto manifest = nlohmann::json::parse(slurp(dir / "manifest.json"));
  CHECK(manifest["tool"]["name"] == "slipscreen");
  CHECK(manifest["screens"]["catalog_review"] == true);
  CHECK(manifest["screens"]["rt_view"] == true);
  CHECK(manifest["screens"]["deterministic"] == false);
  CHECK(manifest["inputs"][0]["role"] == "catalog");
  // A second run into the same folder is refused, then allowed with --force; no temporary
  // folders are left behind.
  std::ostringstream out2, err2;
  CHECK(slipscreen::cli::run(args, out2, err2) == 5);
  auto forced = args;
  forced.push_back("--force");
  CHECK(slipscreen::cli::run(forced, out2, err2) == 0);
  for (const auto& e : fs::directory_iterator(dir.parent_path())) {
    const std::string name = e.path().filename().string();
    CHECK(name.find("slipscreen_catalog_out_test.partial-") == std::string::npos);
    CHECK(name.find("slipscreen_catalog_out_test.replaced-") == std::string::npos);
  }
  // --force with a catalog that cannot be read keeps the earlier folder as it was (the folder is
  // replaced only once the new one is complete: formats/files/run_folder.hpp).
  const std::string summary = slurp(dir / "catalog_summary.json");
  auto bad = forced;
  bad[1] = std::string(SLIPSCREEN_SOURCE_DIR) + "/tests/data/catalog/no-such-catalog.csv";
  std::ostringstream out3, err3;
  CHECK(slipscreen::cli::run(bad, out3, err3) == 4);
  CHECK(slurp(dir / "catalog_summary.json") == summary);
  // A file the user added makes it no longer a run of slipscreen: --force refuses it.
  std::ofstream(dir / "notes.txt") << "kept";
  std::ostringstream out4, err4;
  CHECK(slipscreen::cli::run(forced, out4, err4) == 5);
  CHECK(err4.str().find("'notes.txt'") != std::string::npos);
  CHECK(slurp(dir / "notes.txt") == "kept");
  CHECK(slurp(dir / "catalog_summary.json") == summary);
  fs::remove_all(dir);
}
