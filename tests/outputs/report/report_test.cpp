// The report of a run (outputs/report/report.cpp, run/report_job.cpp) on the tiny scenario, a
// deterministic run: which figures it has, what it refuses, and that a failed rebuild loses
// nothing. The PDF, SVG, HTML and the figures' numbers are checked against poppler, Chromium and
// the run's tables by check_report.py.
#include "outputs/report/report.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <fstream>
#include <set>

#include "core/errors.hpp"
#include "outputs/report/area_map.hpp"
#include "run/report_job.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;
using outputs::report::renumber_svg_ids;

namespace {
std::size_t segment_paths(const std::string& svg);
}

TEST_CASE("SVG ids are renumbered in order of appearance, references with them") {
  const std::string svg = R"x(<svg><symbol id="glyph7-3"/><use xlink:href="#glyph7-3"/><g clip-path="url(#clip42)">)x"
                          R"x(<clipPath id="clip42"/><use xlink:href="#glyph7-10"/></g></svg>)x";
  const std::string out = renumber_svg_ids(svg, "map-");
  CHECK(out == R"x(<svg><symbol id="map-1"/><use xlink:href="#map-1"/><g clip-path="url(#map-2)">)x"
               R"x(<clipPath id="map-2"/><use xlink:href="#map-3"/></g></svg>)x");
  // Another drawing of the same figure with other counters gives the same text.
  std::string shifted = svg;
  for (auto [from, to] : {std::pair{"glyph7-3", "glyph9-1"}, {"clip42", "clip3"}, {"glyph7-10", "glyph9-2"}})
    for (std::size_t at; (at = shifted.find(from)) != std::string::npos;) shifted.replace(at, std::string(from).size(), to);
  CHECK(renumber_svg_ids(shifted, "map-") == out);
}

TEST_CASE("a deterministic run's report: the map by margin and the pressure histories, no probability curves") {
  test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  CHECK(fs::exists(out / "report.html"));
  CHECK_FALSE(fs::exists(out / "figures" / "slip_probability.svg"));
  const std::string map_csv = test::slurp(out / "figures" / "area_map.csv");
  CHECK(map_csv.rfind("segment_id,date,margin_MPa\n", 0) == 0);
  const std::string pdf = test::slurp(out / "report.pdf");
  CHECK(pdf.rfind("%PDF-", 0) == 0);
  const std::string html = test::slurp(out / "report.html");
  CHECK(html.find("Screening estimate from simplified physics") != std::string::npos);
  CHECK(html.find("tiny test scenario") != std::string::npos);
  // The map draws one path of the segment width per segment (8 in the tiny scenario).
  CHECK(segment_paths(test::slurp(out / "figures" / "area_map.svg")) == 8);

  SUBCASE("a failed rebuild leaves the earlier report and no staging folder") {
    const std::string before = test::slurp(out / "report.html");
    fs::remove(out / "segments.csv");
    CHECK_THROWS_AS(run::rebuild_report(out, {.reproducible = true}), IoError);  // the missing table
    CHECK(test::slurp(out / "report.html") == before);
    for (const auto& e : fs::directory_iterator(out)) CHECK(e.path().filename().string().rfind(".report-staging", 0) != 0);
  }
  SUBCASE("an unknown page size is refused before anything is written") {
    CHECK_THROWS_AS(run::rebuild_report(out, {.page = "A5", .reproducible = true}), InputError);
  }
}

namespace {
// The segment paths of the map (one path of the segment width per segment) in an SVG.
std::size_t segment_paths(const std::string& svg) {
  std::size_t paths = 0;
  for (std::size_t at = 0; (at = svg.find("stroke-width:2.25;", at)) != std::string::npos; ++at) ++paths;
  return paths;
}
}  // namespace

TEST_CASE("one area map per output time when asked: report --maps each, [output] report_maps") {
  test::TinyScenario t;
  t.replace("scenario.toml", "cog = false", "cog = false\nreport_maps = \"each\"");
  const auto s = scenario::load_scenario(t.scenario());
  CHECK(s.output.report_maps == "each");
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  // The output dates, as the run's table holds them.
  std::set<std::string> dates;
  {
    std::ifstream in(out / "segment_times.csv");
    std::string line;
    std::getline(in, line);
    const auto header = line;
    std::size_t col = 0;
    for (std::size_t at = 0, next; (next = header.find(',', at)) != std::string::npos && header.substr(at, next - at) != "date"; at = next + 1)
      ++col;
    while (std::getline(in, line)) {
      std::size_t at = 0;
      for (std::size_t k = 0; k < col; ++k) at = line.find(',', at) + 1;
      dates.insert(line.substr(at, 10));
    }
  }
  REQUIRE(dates.size() >= 2);
  const auto maps = [&] {
    std::vector<std::string> names;
    for (const auto& e : fs::directory_iterator(out / "figures"))
      if (e.path().extension() == ".svg" && e.path().stem().string().rfind("area_map", 0) == 0)
        names.push_back(e.path().stem().string());
    std::sort(names.begin(), names.end());
    return names;
  };
  std::vector<std::string> expected;
  for (const auto& d : dates) expected.push_back("area_map_" + d);
  CHECK(maps() == expected);
  for (const auto& name : expected) {
    CHECK(segment_paths(test::slurp(out / "figures" / (name + ".svg"))) == 8);
    const std::string csv = test::slurp(out / "figures" / (name + ".csv"));
    const std::string own_date = std::string(",").append(name, 9);  // (append: GCC 12 -Wrestrict false positive on "," + string)
    CHECK(csv.find(own_date) != std::string::npos);  // its rows are of its own date
  }
  // `slipscreen report --maps last` goes back to the one map at the last time, and removes the others.
  run::rebuild_report(out, {.reproducible = true, .maps = "last"});
  CHECK(maps() == std::vector<std::string>{"area_map"});
  CHECK(segment_paths(test::slurp(out / "figures" / "area_map.svg")) == 8);
  run::rebuild_report(out, {.reproducible = true, .maps = "each"});
  CHECK(maps() == expected);

  test::TinyScenario bad;
  bad.replace("scenario.toml", "cog = false", "cog = false\nreport_maps = \"all\"");
  CHECK_THROWS_AS(scenario::load_scenario(bad.scenario()), InputError);
}

TEST_CASE("a folder that is not a run is refused") {
  test::TinyScenario t;
  const fs::path other = t.dir() / "other";
  fs::create_directories(other);
  std::ofstream(other / "notes.txt") << "mine\n";
  CHECK_THROWS_AS(run::rebuild_report(other, {}), RefusedError);
  CHECK_THROWS_AS(run::rebuild_report(t.dir() / "missing", {}), RefusedError);
  CHECK(fs::exists(other / "notes.txt"));
}

TEST_CASE("[output] report = false writes no report, and the page must be A4 or Letter") {
  test::TinyScenario t;
  t.replace("scenario.toml", "cog = false", "cog = false\nreport = false");
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  CHECK_FALSE(fs::exists(out / "report.html"));
  CHECK_FALSE(fs::exists(out / "figures"));
  CHECK(fs::exists(out / "segment_pressure_history.csv"));

  test::TinyScenario bad;
  bad.replace("scenario.toml", "cog = false", "cog = false\npage = \"A5\"");
  CHECK_THROWS_AS(scenario::load_scenario(bad.scenario()), InputError);
}
