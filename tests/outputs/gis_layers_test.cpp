// screen.gpkg of whole runs (outputs/gis_layers.cpp) read back with GDAL: the layers, their
// default styles in layer_styles, field types and aliases, the long-form layer, and the Δp
// footprint of one Theis well against π r² (docs/outputs.md, docs/gis.md).
#include "outputs/gis_layers.hpp"

#include <doctest/doctest.h>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <map>
#include <memory>
#include <set>

#include "core/units/units.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;

namespace {

struct Closer {
  void operator()(GDALDataset* d) const { GDALClose(GDALDataset::ToHandle(d)); }
};
using Dataset = std::unique_ptr<GDALDataset, Closer>;

Dataset open_vector(const std::filesystem::path& p) {
  return Dataset(GDALDataset::Open(p.string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, nullptr, nullptr, nullptr));
}

// One text cell of an SQL query on the GeoPackage ("" when there is no row).
std::string query(GDALDataset& ds, const std::string& sql) {
  OGRLayer* r = ds.ExecuteSQL(sql.c_str(), nullptr, nullptr);
  REQUIRE(r);
  std::unique_ptr<OGRFeature> f(r->GetNextFeature());
  const std::string v = f ? f->GetFieldAsString(0) : "";
  f.reset();
  ds.ReleaseResultSet(r);
  return v;
}

std::filesystem::path run_tiny(const test::TinyScenario& t) {
  const auto s = scenario::load_scenario(t.scenario());
  const auto out = t.dir() / "run";
  run::run_scenario(s, test::options_into(out));
  return out;
}

}  // namespace

TEST_CASE("screen.gpkg: every layer with its default style, typed fields with aliases, the long form") {
  const test::TinyScenario t;
  const auto out = run_tiny(t);
  auto ds = open_vector(out / "screen.gpkg");
  REQUIRE(ds);
  std::set<std::string> layers;
  for (auto* l : ds->GetLayers()) layers.insert(l->GetName());
  CHECK(layers == std::set<std::string>{"fault_segments", "segment_times", "wells", "dp_footprint", "layer_styles"});

  // One default style per layer; the deterministic run draws the faults by their margin.
  for (const char* l : {"fault_segments", "segment_times", "wells", "dp_footprint"}) {
    CAPTURE(l);
    CHECK(query(*ds, std::string("SELECT count(*) FROM layer_styles WHERE useAsDefault = 1 AND f_table_name = '") + l +
                         "'") == "1");
  }
  const std::string faults = query(*ds, "SELECT styleQML FROM layer_styles WHERE f_table_name = 'fault_segments'");
  CHECK(faults.find("type=\"graduatedSymbol\" attr=\"margin_MPa\"") != std::string::npos);
  const std::string wells = query(*ds, "SELECT styleQML FROM layer_styles WHERE f_table_name = 'wells'");
  CHECK(wells.find("type=\"categorizedSymbol\" attr=\"status\"") != std::string::npos);
  CHECK(wells.find("value=\"proposed\"") != std::string::npos);
  const std::string times = query(*ds, "SELECT styleQML FROM layer_styles WHERE f_table_name = 'segment_times'");
  CHECK(times.find("<temporal enabled=\"1\" mode=\"2\" startField=\"date\" endField=\"valid_until\"") !=
        std::string::npos);
  CHECK(times.find("attr=\"dp_MPa\"") != std::string::npos);  // no probabilistic screen: Δp

  // The long form: one line per segment and output time, DateTime and boolean fields.
  OGRLayer* seg = ds->GetLayerByName("fault_segments");
  OGRLayer* st = ds->GetLayerByName("segment_times");
  REQUIRE(seg);
  REQUIRE(st);
  const auto s = scenario::load_scenario(t.scenario());
  const auto n_times = static_cast<GIntBig>(s.output.times.size());
  CHECK(n_times == 3);
  CHECK(seg->GetFeatureCount() > 3);
  CHECK(st->GetFeatureCount() == seg->GetFeatureCount() * n_times);
  OGRFeatureDefn* d = st->GetLayerDefn();
  CHECK(d->GetFieldDefn(d->GetFieldIndex("date"))->GetType() == OFTDateTime);
  CHECK(d->GetFieldDefn(d->GetFieldIndex("valid_until"))->GetType() == OFTDateTime);
  CHECK(d->GetFieldDefn(d->GetFieldIndex("dp_reaches_dp_crit"))->GetSubType() == OFSTBoolean);
  CHECK(query(*ds, "SELECT name FROM gpkg_data_columns WHERE table_name = 'segment_times' AND column_name = 'dp_MPa'") ==
        "Δp (MPa)");
  CHECK(query(*ds, "SELECT name FROM gpkg_data_columns WHERE table_name = 'wells' AND column_name = 'volume_bbl'") ==
        "injected volume (bbl)");
  OGRFeatureDefn* wd = ds->GetLayerByName("wells")->GetLayerDefn();
  CHECK(wd->GetFieldDefn(wd->GetFieldIndex("proposed"))->GetSubType() == OFSTBoolean);

  // Its Δp equals the wide layer's column of the same date, segment by segment.
  std::map<std::string, std::map<std::string, double>> wide;  // segment -> date -> dp
  for (auto& f : *seg)
    for (const auto& date : s.output.dates) {
      std::string iso = util::format_iso_date(date), col = "dp_" + iso + "_MPa";
      for (char& c : col)
        if (c == '-') c = '_';
      wide[f->GetFieldAsString("segment_id")][iso] = f->GetFieldAsDouble(col.c_str());
    }
  std::size_t compared = 0;
  for (auto& f : *st) {
    int y = 0, m = 0, day = 0, h = 0, mi = 0, tz = 0;
    float sec = 0;
    REQUIRE(f->GetFieldAsDateTime(f->GetFieldIndex("date"), &y, &m, &day, &h, &mi, &sec, &tz));
    CHECK(tz == 100);
    const std::string iso = util::format_iso_date({y, m, day});
    CHECK(f->GetFieldAsDouble("dp_MPa") == wide.at(f->GetFieldAsString("segment_id")).at(iso));
    CHECK(f->IsFieldNull(f->GetFieldIndex("valid_until")) == (iso == util::format_iso_date(s.output.dates.back())));
    ++compared;
  }
  CHECK(compared == static_cast<std::size_t>(st->GetFeatureCount()));

  // The rasters' sidecar styles.
  const std::string qml = test::slurp(out / "pressure_change.qml");
  CHECK(qml.find("type=\"singlebandpseudocolor\" band=\"3\"") != std::string::npos);
}

TEST_CASE("the dp footprint of one Theis well: area = pi r^2 where dp(r) = the threshold") {
  // One proposed well injecting at a constant rate from 2021-01-01, no other well, output 14 days
  // later on a 50 m grid; footprint threshold 0.1 MPa under [output].
  const test::TinyScenario t;
  t.replace("scenario.toml", "[wells]\nfile = \"wells.csv\"\n\n[histories]\nfile = \"histories.csv\"\n", "");
  t.replace("scenario.toml",
            "schedule = [\"5000 bbl/d from 2021-01-01 to 2022-01-01\", \"8000 bbl/d from 2022-01-01 to 2024-01-01\"]",
            "schedule = [\"50000 bbl/d from 2021-01-01 to 2024-01-01\"]");
  t.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"0.1 MPa\"\n");
  t.replace("scenario.toml", "start = \"2021-01-01\"\nend = \"2023-01-01\"\nstep = \"1 year\"",
            "dates = [\"2021-01-15\"]");
  t.replace("scenario.toml", "extent = [494000.0, 6116000.0, 506000.0, 6126000.0]\ncell_size = \"1 km\"",
            "extent = [495500.0, 6113000.0, 507500.0, 6125000.0]\ncell_size = \"50 m\"");
  const auto s = scenario::load_scenario(t.scenario());
  REQUIRE(s.wells.size() == 1);
  CHECK(s.output.footprint == 0.1e6);
  const auto p = screening::prepare_run(s, false);
  const auto out = t.dir() / "run";
  run::run_scenario(s, test::options_into(out));

  // Theis (1935): dp(r, t) = Q μ/(4π k h) W(r²/(4 D t)), W = E1 (Boost.Math, the reference).
  const double q = 50000.0 * units::kBarrel / units::kDay;
  const double a = q * p.inputs.formation.pressure_per_rate;
  const double four_dt = 4.0 * p.inputs.formation.diffusivity * 14.0 * units::kDay;
  const double w_star = 0.1e6 / a;
  double lo = 1e-12, hi = 50;  // bisection on the decreasing E1 for W(u*) = w_star
  for (int i = 0; i < 200; ++i) {
    const double mid = std::sqrt(lo * hi);
    (boost::math::expint(1, mid) > w_star ? lo : hi) = mid;
  }
  const double r_star = std::sqrt(four_dt * std::sqrt(lo * hi));
  REQUIRE(r_star > 1000.0);   // many cells across the disc ...
  REQUIRE(r_star < 5500.0);   // ... and inside the grid (6 km from the well to its edges)
  const double expected = M_PI * r_star * r_star;

  auto ds = open_vector(out / "screen.gpkg");
  REQUIRE(ds);
  OGRLayer* fp = ds->GetLayerByName("dp_footprint");
  REQUIRE(fp);
  REQUIRE(fp->GetFeatureCount() == 1);
  std::unique_ptr<OGRFeature> f(fp->GetFeature(1));
  REQUIRE(f);
  const OGRGeometry* g = f->GetGeometryRef();
  REQUIRE(g);
  REQUIRE(wkbFlatten(g->getGeometryType()) == wkbMultiPolygon);
  CHECK(g->toMultiPolygon()->getNumGeometries() == 1);
  const double area = g->toMultiPolygon()->get_Area();  // GDAL's own area
  // Tolerance 0.1 % of the area: the contour through cell centres 50 m apart on a circle of
  // r* ~ 3 km cuts ~1e-4 of the area (chords and linear interpolation; formats/gis/contour_test
  // has the estimate), and the grid engine's Δp (1e-4 relative, core/hydro/pressure_grid.hpp)
  // moves the contour by ~0.2 m (1e-4 of the area). A contour one cell off is 3 % off.
  INFO("footprint " << area << " m2 against pi r*^2 = " << expected << " m2 (r* = " << r_star << " m)");
  CHECK(std::abs(area - expected) / expected < 1e-3);  // 1.3e-5 seen
  CHECK(std::abs(f->GetFieldAsDouble("area_km2") * 1e6 - area) < 1e-6 * area);  // the field is the geometry's area
  CHECK(f->GetFieldAsDouble("threshold_MPa") == 0.1);
  int y = 0, m = 0, day = 0, h = 0, mi = 0, tz = 0;
  float sec = 0;
  REQUIRE(f->GetFieldAsDateTime(f->GetFieldIndex("date"), &y, &m, &day, &h, &mi, &sec, &tz));
  CHECK(util::format_iso_date({y, m, day}) == "2021-01-15");
}
