// End-to-end runs of the tiny scenario (tests/data/scenario/tiny): the run folder's contents,
// byte-identical reruns, refusal to overwrite, and bad inputs that leave no run folder behind.
#include "run/run_scenario.hpp"

#include <doctest/doctest.h>

#include <algorithm>

#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include <gdal_priv.h>
#include <omp.h>
#include <ogrsf_frmts.h>

#include "core/errors.hpp"
#include "formats/table/csv.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::formats;
using namespace slipscreen::scenario;
using namespace slipscreen::screening;
using namespace slipscreen::run;
using slipscreen::test::slurp;
using slipscreen::test::options_into;
using slipscreen::test::TinyScenario;

namespace {

// The parent of `out` holds nothing but what was there before (no run folder, no staging).
std::size_t entries(const fs::path& dir) {
  std::size_t n = 0;
  for ([[maybe_unused]] const auto& e : fs::directory_iterator(dir)) ++n;
  return n;
}

}  // namespace

TEST_CASE("the tiny scenario writes every output into its run folder") {
  TinyScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  const RunSummary r = run_scenario(s, options_into(out));
  CHECK(r.folder == out);
  // The report (docs/report.md) of a deterministic run: the map and the three pressure histories.
  std::vector<std::string> expected = {"README.txt", "manifest.json", "pressure_change.qml", "pressure_change.tif",
                                       "pressure_change.tif.aux.xml", "report.html", "report.pdf", "screen.gpkg",
                                       "segment_pressure_history.csv", "segment_times.csv", "segments.csv",
                                       "well_shares.csv"};
  for (const char* f : {"area_map", "pressure_history_1", "pressure_history_2", "pressure_history_3"})
    for (const char* ext : {".csv", ".png", ".svg"}) expected.push_back(std::string("figures/") + f + ext);
  // And a Mohr diagram per most-critical fault (at most one per fault of the map).
  std::size_t mohr = 0;
  for (const auto& f : r.files)
    if (f.rfind("figures/mohr_", 0) == 0) {
      expected.push_back(f);
      ++mohr;
    }
  CHECK(mohr >= 3);
  CHECK(mohr <= 3 * r.fault_count);
  std::sort(expected.begin(), expected.end());
  CHECK(r.files == expected);
  CHECK(r.fault_count == 2);
  CHECK(r.well_count == 3);
  // F1 is 3.6 km long, F2 3.59 km: 4 segments of at most 1 km each (ceil(L / 1 km)).
  CHECK(r.segment_count == 8);

  const CsvTable seg = read_csv(out / "segments.csv", "segments.csv");
  CHECK(seg.rows.size() == 8);
  CHECK(seg.column("dp_crit_MPa").has_value());
  CHECK(seg.column("first_crossing_date").has_value());
  const CsvTable times = read_csv(out / "segment_times.csv", "segment_times.csv");
  CHECK(times.rows.size() == 8 * 3);  // tidy: segment x output time
  CHECK(times.rows[0].fields[2] == "2021-01-01");
  const CsvTable shares = read_csv(out / "well_shares.csv", "well_shares.csv");
  CHECK(shares.rows.size() == 8 * 3 * 3);

  const std::string manifest = slurp(out / "manifest.json");
  CHECK(manifest.find("\"sha256\"") != std::string::npos);
  CHECK(manifest.find("Screening estimate") != std::string::npos);
  CHECK(manifest.find("created_utc") == std::string::npos);  // reproducible run

  // Read back with GDAL itself: bands, descriptions, nodata, CRS; layers of the GeoPackage.
  GDALAllRegister();
  {
    std::unique_ptr<GDALDataset> ds(GDALDataset::Open((out / "pressure_change.tif").c_str(), GDAL_OF_RASTER));
    REQUIRE(ds);
    CHECK(ds->GetRasterCount() == 3);
    CHECK(std::string(ds->GetRasterBand(1)->GetDescription()) == "2021-01-01");
    CHECK(std::string(ds->GetRasterBand(3)->GetDescription()) == "2023-01-01");
    CHECK(ds->GetRasterBand(1)->GetRasterDataType() == GDT_Float32);
    int has_nodata = 0;
    ds->GetRasterBand(1)->GetNoDataValue(&has_nodata);
    CHECK(has_nodata == 1);
    CHECK(ds->GetSpatialRef()->GetEPSGGeogCS() == 4326);
    CHECK(std::string(ds->GetSpatialRef()->GetAuthorityCode(nullptr)) == "32708");
    double gt[6];
    ds->GetGeoTransform(gt);
    CHECK(gt[0] == 494000.0);  // extent [494000, 6116000, 506000, 6126000], 1 km cells
    CHECK(gt[3] == 6126000.0);
    CHECK(gt[1] == 1000.0);
    CHECK(ds->GetRasterXSize() == 12);
    CHECK(ds->GetRasterYSize() == 10);
  }
  {
    std::unique_ptr<GDALDataset> ds(GDALDataset::Open((out / "screen.gpkg").c_str(), GDAL_OF_VECTOR));
    REQUIRE(ds);
    OGRLayer* segs = ds->GetLayerByName("fault_segments");
    OGRLayer* wells = ds->GetLayerByName("wells");
    REQUIRE(segs);
    REQUIRE(wells);
    CHECK(segs->GetFeatureCount() == 8);
    CHECK(wells->GetFeatureCount() == 3);
    CHECK(segs->GetLayerDefn()->GetFieldIndex("dp_2023_01_01_MPa") >= 0);
    CHECK(wells->GetLayerDefn()->GetFieldIndex("volume_bbl") >= 0);
  }
}

TEST_CASE("reruns give byte-identical outputs; an existing run folder is refused without force") {
  TinyScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path a = t.dir() / "run-a", b = t.dir() / "run-b";
  run_scenario(s, options_into(a));
  run_scenario(s, options_into(b));
  for (const char* f : {"segment_times.csv", "segments.csv", "well_shares.csv", "pressure_change.tif", "screen.gpkg",
                        "manifest.json"}) {
    CAPTURE(f);
    CHECK(slurp(a / f) == slurp(b / f));
  }
  const std::size_t before = entries(t.dir());
  CHECK_THROWS_WITH_AS(run_scenario(s, options_into(a)), doctest::Contains("give --force"), RefusedError);
  CHECK(entries(t.dir()) == before);
  RunOptions force = options_into(a);
  force.force = true;
  run_scenario(s, force);
  CHECK(slurp(a / "segments.csv") == slurp(b / "segments.csv"));
}

TEST_CASE("the tables do not depend on the number of threads") {
  TinyScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  run_scenario(s, options_into(t.dir() / "one"));
  omp_set_num_threads(2);
  run_scenario(s, options_into(t.dir() / "two"));
  omp_set_num_threads(before);
  for (const char* f : {"segment_times.csv", "segments.csv", "well_shares.csv"}) {
    CAPTURE(f);
    CHECK(slurp(t.dir() / "one" / f) == slurp(t.dir() / "two" / f));
  }
}

TEST_CASE("bad inputs found at run time leave no run folder behind") {
  const fs::path bad = fs::path(SLIPSCREEN_TEST_DATA) / "scenario/bad";
  const slipscreen::test::TempDir temp("run-bad");
  const fs::path tmp = temp.path();
  SUBCASE("unknown CRS") {
    const auto s = load_scenario(bad / "unknown_crs.toml");
    CHECK_THROWS_WITH_AS(run_scenario(s, options_into(tmp / "out")),
                         doctest::Contains("wells_unknown_crs.csv line 4 (well 'W1'): field 'crs' = 'EPSG:999999'"),
                         InputError);
  }
  SUBCASE("fault file with no line geometry") {
    const auto s = load_scenario(bad / "no_lines.toml");
    CHECK_THROWS_WITH_AS(run_scenario(s, options_into(tmp / "out")), doctest::Contains("points.geojson"), InputError);
  }
  CHECK(entries(tmp) == 0);
}

TEST_CASE("inputs found bad from the fault map or the catalog stop the run before any computing") {
  // Each is refused while the run reads its inputs: the progress never reaches the pressure
  // computation, and no run folder is created.
  const fs::path bad = fs::path(SLIPSCREEN_TEST_DATA) / "scenario/bad";
  const slipscreen::test::TempDir temp("run-bad-early");
  const fs::path tmp = temp.path();
  for (const char* name : {"catalog_columns.toml", "uncertainty_unknown_fault.toml"}) {
    CAPTURE(name);
    const auto s = load_scenario(bad / name);
    RunOptions o = options_into(tmp / "out");
    std::vector<std::string> stages;
    o.progress = [&](const std::string& stage, double) {
      if (stages.empty() || stages.back() != stage) stages.push_back(stage);
    };
    CHECK_THROWS_AS(run_scenario(s, o), InputError);
    CHECK(stages == std::vector<std::string>{"reading faults and wells"});
    CHECK(entries(tmp) == 0);
  }
  // The scenario itself refuses the rest while it is loaded (tests/cli/cases/validate.case).
  CHECK_THROWS_WITH_AS(load_scenario(bad / "uncertainty_unknown_well.toml"), doctest::Contains("'W9'"), InputError);
  CHECK_THROWS_WITH_AS(load_scenario(bad / "uncertainty_misspelt.toml"), doctest::Contains("did you mean 'permeability'"),
                       Error);
  CHECK_THROWS_WITH_AS(load_scenario(bad / "catalog_mapping_key.toml"), doctest::Contains("did you mean 'time'"),
                       InputError);
}

namespace {

// Every path under `dir` with its bytes (folders as ""), to show that nothing changed.
std::map<std::string, std::string> snapshot(const fs::path& dir) {
  std::map<std::string, std::string> files;
  for (const auto& e : fs::recursive_directory_iterator(dir))
    files[e.path().lexically_relative(dir).generic_string()] = e.is_regular_file() ? slurp(e.path()) : "";
  return files;
}

}  // namespace

TEST_CASE("run scenario.toml --out . --force in the scenario's own folder is refused and deletes nothing") {
  TinyScenario t;
  t.write("notes.txt", "the user's notes");
  const ResolvedScenario s = load_scenario(t.scenario());
  const auto before = snapshot(t.dir());
  const fs::path previous = fs::current_path();
  fs::current_path(t.dir());
  RunOptions here = options_into(".");
  here.force = true;
  CHECK_THROWS_WITH_AS(run_scenario(s, here), doctest::Contains("run folder '.' is the working directory"),
                       RefusedError);
  fs::current_path(previous);
  CHECK(snapshot(t.dir()) == before);

  // Named from elsewhere, the scenario's folder is still refused: it holds the run's inputs.
  RunOptions there = options_into(t.dir());
  there.force = true;
  CHECK_THROWS_WITH_AS(run_scenario(s, there), doctest::Contains("holds the input file"), RefusedError);
  CHECK(snapshot(t.dir()) == before);
}

TEST_CASE("a run cleans the stale staging folder of a killed run beside its folder, saying so") {
  TinyScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  // A staging folder of a run that no longer exists (above the largest pid: no such process).
  fs::create_directories(out.parent_path() / "tiny.partial-999999999");
  std::ofstream(out.parent_path() / "tiny.partial-999999999" / "segments.csv") << "half";
  RunOptions o = options_into(out);
  std::vector<std::string> notes;
  o.notice = [&](const std::string& line) { notes.push_back(line); };
  run_scenario(s, o);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("removed") == 0);
  CHECK(notes[0].find("tiny.partial-999999999") != std::string::npos);
  CHECK(entries(out.parent_path()) == 1);
  CHECK(fs::exists(out / "manifest.json"));
}
