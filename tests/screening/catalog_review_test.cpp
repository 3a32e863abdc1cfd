// The catalog review inside a scenario run: the tiny scenario with a small projected catalog
// (invented events placed where the answer is known by construction).
#include "screening/catalog_review.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <iomanip>
#include <memory>
#include <sstream>

#include <gdal_priv.h>
#include <nlohmann/json.hpp>
#include <ogrsf_frmts.h>

#include "core/errors.hpp"
#include "formats/table/csv.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::formats;
using namespace slipscreen::scenario;
using namespace slipscreen::screening;
using namespace slipscreen::run;
using slipscreen::test::options_into;
using slipscreen::test::slurp;
using slipscreen::test::TinyScenario;

namespace {

// Events (invented, EPSG:32708 metres, depth in m):
//   E1 before any injection (the first injection is 2020-01-01): Δp = 0
//   E2 at the centre of output-grid cell (column 6, row 5) at the output time 2022-01-01
//   E3 on fault F1's trace, at 1/8 of its length from (501000, 6120000) to (503000, 6123000)
//   E4 outside the output grid's extent [494000, 506000] x [6116000, 6126000]
//   line 7: a malformed time (unusable, reported with its line)
const char* kCatalog =
    "# invented test events\n"
    "id,time,x,y,depth,magnitude,magnitude_type\n"
    "E1,2019-06-01T00:00:00Z,497000,6118000,3000,1.2,ML\n"
    "E2,2022-01-01T00:00:00Z,500500,6120500,3100,1.5,ML\n"
    "E3,2022-06-15T12:00:00Z,501250,6120375,2900,2.1,ML\n"
    "E4,2022-07-01T00:00:00Z,520000,6140000,3000,1.0,ML\n"
    "E5,2022-13-01T00:00:00Z,500000,6120000,3000,1.0,ML\n";

const char* kCatalogTable =
    "\n[catalog]\n"
    "file = \"catalog.csv\"\n"
    "columns = \"x=x;y=y;crs=EPSG:32708;depth_unit=m\"\n"
    "footprint_threshold = \"0.05 MPa\"\n"
    "rt_well = \"W1\"\n"
    "\n[catalog.rate_state]\n"
    "background_rate_per_km = \"0.01 1/yr\"\n"
    "a_sigma = \"1e6 MPa\"\n"
    "aftershock_duration = \"100 yr\"\n";

struct CatalogScenario : TinyScenario {
  CatalogScenario() {
    write("catalog.csv", kCatalog);
    append("scenario.toml", kCatalogTable);
  }
};

const std::string& field(const CsvTable& t, std::size_t row, const std::string& name) {
  const auto c = t.column(name);
  REQUIRE_MESSAGE(c.has_value(), "no column " << name);
  return t.rows[row].fields[*c];
}

}  // namespace

TEST_CASE("a scenario naming a catalog runs the review into the run folder") {
  CatalogScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  REQUIRE(s.catalog.has_value());
  const fs::path out = t.dir() / "runs" / "tiny";
  const RunSummary r = run_scenario(s, options_into(out));
  for (const char* f : {"catalog_summary.json", "catalog_events.csv", "rt_events.csv", "rt_fronts.csv",
                        "seismicity_rate.csv", "seismicity_rate_faults.csv"})
    CHECK_MESSAGE(fs::exists(out / f), f);
  REQUIRE(r.catalog);
  const CatalogReview& v = *r.catalog;
  CHECK(v.read.records == 5);
  REQUIRE(v.read.rejected.size() == 1);
  CHECK(v.read.rejected[0].line == 7);  // the malformed time is reported with its line, not dropped
  REQUIRE(v.events.size() == 4);

  const CsvTable ev = read_csv(out / "catalog_events.csv", "catalog_events.csv");
  REQUIRE(ev.rows.size() == 4);
  // E1 predates every injection: no pressure change at all (causality of the Theis sum).
  CHECK(field(ev, 0, "dp_MPa") == "0.000000");
  CHECK(field(ev, 0, "footprint_area_fraction") == "0.000000");
  // E4 lies outside the grid's extent.
  CHECK(field(ev, 3, "in_study_area") == "no");
  CHECK(field(ev, 1, "in_study_area") == "yes");
  // E3 lies on F1's trace: its nearest segment is on F1 at zero distance (planar geometry).
  CHECK(field(ev, 2, "nearest_fault") == "F1");
  CHECK(std::stod(field(ev, 2, "distance_m")) < 0.05);

  // E2 sits at a cell centre at an output time: its Δp (exact Theis sum, PressureField) must
  // agree with the pressure-change raster (the separate grid engine, stated accuracy 1e-4
  // relative or 0.1 Pa) at that cell and band, read back with GDAL.
  GDALAllRegister();
  std::unique_ptr<GDALDataset> ds(GDALDataset::Open((out / "pressure_change.tif").c_str(), GDAL_OF_RASTER));
  REQUIRE(ds);
  float cell = 0.0f;
  REQUIRE(ds->GetRasterBand(2)->RasterIO(GF_Read, 6, 5, 1, 1, &cell, 1, 1, GDT_Float32, 0, 0) == CE_None);
  CHECK(std::string(ds->GetRasterBand(2)->GetDescription()) == "2022-01-01");
  const double dp_event = v.events[1].dp / 1e6;  // MPa
  CHECK(dp_event > 0.01);
  CHECK(std::abs(dp_event - cell) <= 1e-4 * dp_event + 1e-6);

  // Footprint: the count inside is the number of study-area events with dp >= threshold, and
  // the chance expectation is the sum of their area fractions (definition, catalog_review.hpp).
  std::size_t inside = 0, in_area = 0;
  double expected = 0.0;
  for (const auto& e : v.events) {
    if (!e.in_study_area) continue;
    ++in_area;
    inside += e.dp >= 0.05e6;
    expected += e.footprint_fraction;
  }
  CHECK(v.footprint.events == in_area);
  CHECK(v.footprint.inside == inside);
  CHECK(v.footprint_expected == doctest::Approx(expected).epsilon(1e-12));
  CHECK(v.footprint.p_value >= 0.0);
  CHECK(v.footprint.p_value <= 1.0);

  // r-t view around W1 (first injection 2020-01-01): E1 precedes it, the others follow.
  REQUIRE(v.rt.has_value());
  CHECK(v.rt->well == "W1");
  CHECK(v.rt->points.size() == 3);

  // Seismicity rate with Aσ = 1e12 Pa, far above any ΔCFF here (< 10 MPa): Dieterich's
  // response is then the background rate to within ΔCFF/Aσ < 1e-5 (rate_state.hpp closed form).
  const CsvTable rate = read_csv(out / "seismicity_rate.csv", "seismicity_rate.csv");
  CHECK(rate.rows.size() == r.segment_count * 3);
  for (std::size_t i = 0; i < rate.rows.size(); ++i)
    CHECK(std::abs(std::stod(field(rate, i, "rate_ratio")) - 1.0) < 1e-5);
  // Background expectation: r (per km × length) × time since the history's start, so from the
  // 2021-01-01 row to the 2022-01-01 row of a segment it grows by r × 365 d (definition).
  const double r_year = std::stod(field(rate, 0, "background_rate_per_year"));
  const CsvTable segs = read_csv(out / "segments.csv", "segments.csv");
  REQUIRE(field(segs, 0, "segment_id") == field(rate, 0, "segment_id"));
  // 0.01 events/yr per km (the scenario above) × the segment's trace length (length_m has 1
  // decimal, rates 6: rounding below 1e-6).
  CHECK(std::abs(r_year - 0.01 * std::stod(field(segs, 0, "length_m")) / 1000.0) <= 1e-6);
  const double grown = std::stod(field(rate, 1, "background_expected_events")) -
                       std::stod(field(rate, 0, "background_expected_events"));
  CHECK(std::abs(grown - r_year * 365.0 / 365.25) <= 2e-6);  // three values rounded to 1e-6
  const CsvTable faults = read_csv(out / "seismicity_rate_faults.csv", "seismicity_rate_faults.csv");
  CHECK(faults.rows.size() == 2 * 3);

  // The GeoPackage carries the events as a point layer with their attributes.
  std::unique_ptr<GDALDataset> gpkg(GDALDataset::Open((out / "screen.gpkg").c_str(), GDAL_OF_VECTOR));
  REQUIRE(gpkg);
  OGRLayer* layer = gpkg->GetLayerByName("earthquakes");
  REQUIRE(layer != nullptr);
  CHECK(layer->GetFeatureCount() == 4);
  CHECK(layer->GetLayerDefn()->GetFieldIndex("nearest_segment") >= 0);
  CHECK(layer->GetLayerDefn()->GetFieldIndex("dp_MPa") >= 0);

  // The summary JSON holds the statistics and the events-against-model block, never NaN.
  const auto j = nlohmann::json::parse(slurp(out / "catalog_summary.json"));
  CHECK(j["catalog"]["rejected_count"] == 1);
  CHECK(j["against_model"]["footprint"]["inside"] == inside);
  CHECK(j["against_model"]["rt_view"]["well"] == "W1");
  CHECK(slurp(out / "catalog_summary.json").find("NaN") == std::string::npos);
  // The manifest hashes the catalog and records the settings.
  const std::string manifest = slurp(out / "manifest.json");
  CHECK(manifest.find("\"catalog\"") != std::string::npos);
  CHECK(manifest.find("catalog.csv") != std::string::npos);
}

TEST_CASE("bad [catalog] tables are refused with the key, value and place") {
  TinyScenario t;
  t.write("catalog.csv", kCatalog);
  SUBCASE("unknown key") {
    t.append("scenario.toml", "\n[catalog]\nfile = \"catalog.csv\"\nfootprint_treshold = \"0.1 MPa\"\n");
    CHECK_THROWS_WITH(load_scenario(t.scenario()), doctest::Contains("did you mean 'footprint_threshold'"));
  }
  SUBCASE("unknown r-t well") {
    t.append("scenario.toml", "\n[catalog]\nfile = \"catalog.csv\"\nrt_well = \"W3\"\n");
    CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains("'W3'"), InputError);
  }
  SUBCASE("missing file") {
    t.append("scenario.toml", "\n[catalog]\nfile = \"nowhere.csv\"\n");
    CHECK_THROWS(load_scenario(t.scenario()));
  }
  SUBCASE("malformed time window") {
    t.append("scenario.toml", "\n[catalog]\nfile = \"catalog.csv\"\nfrom = \"2020-02-30\"\n");
    CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains("catalog.from"), InputError);
  }
  SUBCASE("non-positive A sigma") {
    t.append("scenario.toml",
             "\n[catalog]\nfile = \"catalog.csv\"\n[catalog.rate_state]\nbackground_rate_per_km = \"0.01 1/yr\"\n"
             "a_sigma = \"0 MPa\"\naftershock_duration = \"100 yr\"\n");
    CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains("a_sigma"), InputError);
  }
  SUBCASE("strict catalog with an unusable row stops the run before any folder exists") {
    t.append("scenario.toml", "\n[catalog]\nfile = \"catalog.csv\"\ncolumns = \"x=x;y=y;crs=EPSG:32708\"\nstrict = true\n");
    const ResolvedScenario s = load_scenario(t.scenario());
    const fs::path out = t.dir() / "runs" / "strict";
    CHECK_THROWS_WITH_AS(run_scenario(s, options_into(out)), doctest::Contains("line 7"), InputError);
    CHECK_FALSE(fs::exists(out));
  }
}

TEST_CASE("an empty catalog gives a documented result: notes, no NaN, no events layer rows") {
  TinyScenario t;
  t.write("catalog.csv", "id,time,x,y,depth,magnitude,magnitude_type\n");
  t.append("scenario.toml", kCatalogTable);
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "empty";
  const RunSummary r = run_scenario(s, options_into(out));
  REQUIRE(r.catalog);
  CHECK(r.catalog->events.empty());
  CHECK(r.catalog->footprint.events == 0);
  CHECK(r.catalog->footprint.p_value == 1.0);
  CHECK_FALSE(r.catalog->summary.b.has_value());
  CHECK_FALSE(r.catalog->summary.b_note.empty());  // why there is no b-value
  const std::string json = slurp(out / "catalog_summary.json");
  CHECK(json.find("NaN") == std::string::npos);
  CHECK(nlohmann::json::parse(json)["b_value"]["b"].is_null());
  const CsvTable ev = read_csv(out / "catalog_events.csv", "catalog_events.csv");
  CHECK(ev.rows.empty());
}

TEST_CASE("[catalog] from: the seismogenic index takes the volume injected from that date, not since injection began") {
  // Invented events: 20 at or above Mc = 1 between 2021-08 and 2022-06, and one before `from`.
  TinyScenario t;
  std::string csv = "id,time,x,y,depth,magnitude,magnitude_type\n"
                    "E0,2021-03-01T00:00:00Z,500500,6120500,3000,2.0,ML\n";
  for (int i = 0; i < 20; ++i) {
    std::ostringstream row;  // day i % 10 + 1 of August or December 2021
    row << "E" << i + 1 << ",2021-" << (i < 10 ? "08" : "12") << "-" << std::setw(2) << std::setfill('0') << i % 10 + 1
        << "T00:00:00Z,500500,6120500,3000," << 1.0 + 0.1 * (i % 7) << ",ML\n";
    csv += row.str();
  }
  t.write("catalog.csv", csv);
  t.append("scenario.toml",
           "\n[catalog]\nfile = \"catalog.csv\"\ncolumns = \"x=x;y=y;crs=EPSG:32708;depth_unit=m\"\n"
           "from = \"2021-07-01\"\nto = \"2022-07-01\"\nmc = 1.0\n");
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "from";
  const RunSummary r = run_scenario(s, options_into(out));
  REQUIRE(r.catalog);
  const auto& sum = r.catalog->summary;
  REQUIRE(sum.b.has_value());
  REQUIRE(sum.seismogenic_index.has_value());
  const auto& f = *sum.seismogenic_index;
  CHECK(f.events == 20);
  // From 2021-07-01 to 2022-07-01 only the proposed well P1 injects (the fixture's scenario):
  // 5000 bbl/d for 184 days, then 8000 bbl/d for 181 days = 2,368,000 bbl, with
  // 1 bbl = 0.158987294928 m3 (common practice). The wells W1 and W2 injected in 2020 only.
  const double v = (5000.0 * 184 + 8000.0 * 181) * 0.158987294928;
  CHECK(std::abs(f.volume - v) <= 1e-9 * v);
  // Shapiro et al. (2010): Σ = log10 N − log10 V + b Mc, evaluated here by hand.
  CHECK(std::abs(f.sigma - (std::log10(20.0) - std::log10(v) + sum.b->b * 1.0)) < 1e-9);
}

TEST_CASE("the run's footprint follows the catalog review's threshold; a different [output] footprint is refused") {
  CatalogScenario same;
  CHECK(load_scenario(same.scenario()).output.footprint == 0.05e6);  // from [catalog] footprint_threshold
  same.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"50 kPa\"\n");
  CHECK(load_scenario(same.scenario()).output.footprint == 0.05e6);  // the same value, written twice
  CatalogScenario other;
  other.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"0.2 MPa\"\n");
  CHECK_THROWS_WITH_AS(load_scenario(other.scenario()),
                       doctest::Contains("field 'output.footprint' = '0.2 MPa': expected the catalog review's "
                                         "footprint_threshold (0.05 MPa)"),
                       InputError);
}
