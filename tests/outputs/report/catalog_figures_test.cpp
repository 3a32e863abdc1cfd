// The catalog figures against the catalog review's files of the demo run (every screen), and
// none for a run without a catalog.
#include "outputs/report/catalog_figures.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <map>

#include "formats/gis/run_layers.hpp"
#include "outputs/report/figure_checks.hpp"
#include "outputs/report/report_tables.hpp"
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

TEST_CASE("a run without a catalog review has no catalog figures") {
  test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  CHECK(catalog_figures(test::source_of(out)).empty());
}

TEST_CASE("catalog figures of the demo run match the review's files") {
  const fs::path run = test::demo_run_folder();
  const auto figures = catalog_figures(test::source_of(run));
  test::write_for_viewing(figures);
  std::map<std::string, const Figure*> by_name;
  for (const auto& f : figures) by_name[f.name] = &f;
  for (const char* name : {"catalog_magnitude_time", "catalog_frequency_magnitude", "catalog_volume", "catalog_rt",
                           "catalog_event_map"})
    REQUIRE_MESSAGE(by_name.count(name), name);
  const auto summary = test::read_json_file(run / "catalog_summary.json");
  const Rows ev = read_rows(run, "catalog_events.csv");
  REQUIRE(ev.size() > 10);

  SUBCASE("magnitude-time: one row and one dot per event") {
    const Figure& f = *by_name["catalog_magnitude_time"];
    const FigureRows d{f.data};
    REQUIRE(d.data.rows.size() == ev.size() + 1);  // the events, then Mc
    std::size_t inside = 0;
    for (std::size_t i = 0; i < ev.size(); ++i) {
      CHECK(d.at(i, "event_id") == ev.at(i, "event_id"));
      CHECK(d.number(i, "magnitude") == doctest::Approx(ev.number(i, "magnitude")).epsilon(1e-12));
      CHECK(d.at(i, "in_footprint") == ev.at(i, "in_footprint"));
      inside += ev.at(i, "in_footprint") == "yes";
    }
    CHECK(d.number(ev.size(), "magnitude") == doctest::Approx(summary["completeness"]["mc"].get<double>()).epsilon(1e-12));
    pugi::xml_document doc;
    test::parse_svg(f, doc);
    // Each event is one filled circle with a white outline: blue inside the footprint, orange
    // outside (the legend's two dots have a dark outline).
    const std::string white = "stroke:rgb(100%,100%,100%)";
    int dots = 0;
    for (auto p : doc.select_nodes("//path")) {
      const std::string st = p.node().attribute("style").value();
      if (st.find(white) != std::string::npos && st.find("fill:rgb(") != std::string::npos) ++dots;
    }
    CHECK(dots == static_cast<int>(ev.size()));
    CHECK(inside > 0);
  }

  SUBCASE("frequency-magnitude: the bins of catalog_summary.json and its fitted a and b") {
    const FigureRows d{by_name["catalog_frequency_magnitude"]->data};
    const auto& fmd = summary["frequency_magnitude"];
    REQUIRE(d.data.rows.size() == fmd.size());
    const double a = summary["b_value"]["a"].get<double>(), b = summary["b_value"]["b"].get<double>(),
                 mc = summary["completeness"]["mc"].get<double>();
    double total = 0;
    for (const auto& bin : fmd) total += bin["count"].get<double>();
    CHECK(total == static_cast<double>(ev.size()));
    double above = total;
    std::size_t fitted = 0;
    for (std::size_t i = 0; i < fmd.size(); ++i) {
      CHECK(d.number(i, "magnitude") == doctest::Approx(fmd[i]["magnitude"].get<double>()).epsilon(1e-12));
      CHECK(d.number(i, "count") == fmd[i]["count"].get<double>());
      CHECK(d.number(i, "cumulative_count") == above);
      above -= fmd[i]["count"].get<double>();
      if (d.at(i, "fit_log10_cumulative").empty()) {
        CHECK(d.number(i, "magnitude") < mc - 1e-9);
        continue;
      }
      ++fitted;
      // log10 N(>=M) = a - bM (Gutenberg-Richter with the summary's a and b).
      CHECK(d.number(i, "fit_log10_cumulative") == doctest::Approx(a - b * d.number(i, "magnitude")).epsilon(1e-9));
    }
    CHECK(fitted > 0);
    // a is log10 N(>=Mc) + b Mc (core/seismo/b_value.hpp): at Mc the line meets the count.
    for (std::size_t i = 0; i < fmd.size(); ++i)
      if (std::abs(d.number(i, "magnitude") - mc) < 1e-9)
        CHECK(std::pow(10.0, d.number(i, "fit_log10_cumulative")) ==
              doctest::Approx(d.number(i, "cumulative_count")).epsilon(1e-9));
  }

  SUBCASE("events against volume: the seismogenic index's events and volume") {
    const FigureRows d{by_name["catalog_volume"]->data};
    const auto& si = summary["seismogenic_index"];
    const auto events = d.where("what", "event");
    CHECK(events.size() == si["events"].get<std::size_t>());
    const Rows vol = read_rows(run, "injected_volume.csv");
    REQUIRE(vol.size() >= 2);
    // Σ's volume is the history's last cumulative volume minus its first (docs/catalogs.md).
    CHECK(vol.number(vol.size() - 1, "volume_m3") - vol.number(0, "volume_m3") ==
          doctest::Approx(si["volume_m3"].get<double>()).epsilon(1e-9));
    for (std::size_t k = 1; k < events.size(); ++k)
      CHECK(d.number(events[k], "volume_since_start_m3") >= d.number(events[k - 1], "volume_since_start_m3"));
    // With Σ = log10(n/V) + b Mc (Shapiro et al. 2010), the fit gives back the n events at the
    // volume V injected in the window.
    const auto fit = d.where("what", "fit");
    REQUIRE(fit.size() == 2);
    CHECK(d.number(fit[1], "volume_since_start_m3") == doctest::Approx(si["volume_m3"].get<double>()).epsilon(1e-9));
    CHECK(d.number(fit[1], "events") == doctest::Approx(si["events"].get<double>()).epsilon(1e-9));
  }

  SUBCASE("r-t view: rt_events.csv and rt_fronts.csv row by row") {
    const FigureRows d{by_name["catalog_rt"]->data};
    const Rows re = read_rows(run, "rt_events.csv"), rf = read_rows(run, "rt_fronts.csv");
    const auto events = d.where("what", "event"), fronts = d.where("what", "front");
    REQUIRE(events.size() == re.size());
    REQUIRE(fronts.size() == rf.size());
    for (std::size_t i = 0; i < re.size(); ++i) {
      CHECK(d.at(events[i], "event_id") == re.at(i, "event_id"));
      CHECK(d.number(events[i], "distance_m") == doctest::Approx(re.number(i, "distance_m")).epsilon(1e-12));
      CHECK(d.number(events[i], "time_since_start_days") ==
            doctest::Approx(re.number(i, "time_since_start_days")).epsilon(1e-12));
    }
    for (std::size_t i = 0; i < rf.size(); ++i) {
      const double D = rf.number(i, "diffusivity_m2_per_s"), t = rf.number(i, "time_since_start_days");
      CHECK(d.number(fronts[i], "diffusivity_m2_per_s") == doctest::Approx(D).epsilon(1e-12));
      CHECK(d.number(fronts[i], "distance_m") == doctest::Approx(rf.number(i, "front_radius_m")).epsilon(1e-12));
      // r = sqrt(4 pi D t) (Shapiro et al. 1997), to the table's rounding.
      CHECK(d.number(fronts[i], "distance_m") ==
            doctest::Approx(std::sqrt(4 * M_PI * D * t * 86400.0)).epsilon(1e-3));
    }
  }

  SUBCASE("event map: every raster cell at the last time and every event") {
    const Figure& f = *by_name["catalog_event_map"];
    const FigureRows d{f.data};
    const auto band = formats::read_raster_band(run / "pressure_change.tif", 0);
    const auto cells = d.where("what", "cell");
    REQUIRE(cells.size() == band.values.size());
    const double threshold = summary["against_model"]["footprint"]["threshold_MPa"].get<double>();
    std::size_t in_print = 0, k = 0;
    for (int r = 0; r < band.height; ++r)
      for (int c = 0; c < band.width; ++c, ++k) {
        const double v = band.values[k];
        CHECK(d.number(cells[k], "dp_MPa") == doctest::Approx(v).epsilon(1e-9));
        // The cell centre from the GeoTIFF's geotransform (GDAL's convention: x0 + (col + ½)·dx).
        CHECK(d.number(cells[k], "x_m") == doctest::Approx(band.x0 + (c + 0.5) * band.dx).epsilon(1e-12));
        CHECK(d.number(cells[k], "y_m") == doctest::Approx(band.y0 + (r + 0.5) * band.dy).epsilon(1e-12));
        CHECK((d.at(cells[k], "in_footprint") == "yes") == (v >= threshold));
        in_print += v >= threshold;
      }
    CHECK(in_print > 0);
    CHECK(d.where("what", "event").size() == ev.size());
    pugi::xml_document doc;
    test::parse_svg(f, doc);
  }

  SUBCASE("event map in an oilfield run: the colour bar in psi, the data as the raster holds them") {
    // The demo run's manifest marked oilfield: the event map takes its unit from [output] units
    // (the raster it draws holds MPa in either system), so the rest of the folder may stay SI.
    const ReportSource si = test::source_of(run);
    ReportSource oil = test::source_of(run);
    oil.manifest["parameters"]["scenario"]["output"]["units"] = "oilfield";
    CHECK(pressure_unit(si).suffix == "MPa");
    CHECK(pressure_unit(oil).suffix == "psi");
    // 1 psi = 6894.757293168361 Pa (1 lbf/in², from the pound-force and the inch; NIST SP 811).
    CHECK(pressure_unit(oil).factor == doctest::Approx(6894.757293168361).epsilon(1e-15));
    const auto event_map = [](const std::vector<Figure>& all) {
      const auto it = std::find_if(all.begin(), all.end(), [](const Figure& f) { return f.name == "catalog_event_map"; });
      REQUIRE(it != all.end());
      return *it;
    };
    const Figure a = event_map(catalog_figures(si)), b = event_map(catalog_figures(oil));
    CHECK(b.reading.find("in psi (pressure_change.tif holds MPa)") != std::string::npos);
    CHECK(a.reading.find("psi") == std::string::npos);
    // The data stay the raster's values in MPa (as tests/outputs/oilfield_units_with_pandas.py
    // requires); the drawing changes: the colour bar's and the subtitle's numbers and unit.
    CHECK(figure_csv(a) == figure_csv(b));
    CHECK(figure_svg(a) != figure_svg(b));
    Figure view = b;
    view.name = "catalog_event_map_psi";
    test::write_for_viewing({view});
  }
}
