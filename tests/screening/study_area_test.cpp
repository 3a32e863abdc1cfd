#include "screening/study_area.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"
#include "scenario/plausibility.hpp"
#include "screening/prepare.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::screening;
using slipscreen::test::TinyScenario;

namespace {

// The tiny fault map (tests/data/scenario/tiny/faults.geojson, EPSG:32708): F1 from
// (501000, 6120000) to (503000, 6123000), F2 from (496000, 6118000) to (499500, 6118800).
std::vector<formats::FaultSegment> tiny_segments() {
  TinyScenario t;
  return prepare_run(scenario::load_scenario(t.scenario()), false).segments;
}

}  // namespace

TEST_CASE("the study area is the faults' extent plus the margin, or an explicit grid") {
  TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  scenario::OutputGrid automatic;
  const StudyArea a = study_area(p.segments, automatic, 50e3);
  // The extent of the two traces (vertices of the fixture, exact).
  CHECK(a.faults.xmin == 496000.0);
  CHECK(a.faults.xmax == 503000.0);
  CHECK(a.faults.ymin == 6118000.0);
  CHECK(a.faults.ymax == 6123000.0);
  CHECK_FALSE(a.grid.has_value());
  CHECK(a.contains(553000.0, 6120000.0));  // on the widened edge
  CHECK_FALSE(a.contains(553000.5, 6120000.0));
  CHECK(a.contains(446000.0, 6068000.0));
  CHECK_FALSE(a.contains(446000.0, 6067999.0));
  // An explicit grid extent also counts (the tiny scenario's own grid is small; a far one here).
  scenario::OutputGrid far;
  far.automatic_extent = false;
  far.xmin = 600000, far.ymin = 6000000, far.xmax = 700000, far.ymax = 6100000;
  const StudyArea g = study_area(p.segments, far, 50e3);
  CHECK(g.contains(650000.0, 6050000.0));
  CHECK_FALSE(a.contains(650000.0, 6050000.0));
}

TEST_CASE("distance to the nearest fault, planar") {
  const auto segs = tiny_segments();
  // Beyond F1's north-east end: the distance to that end point, hypot(1500, 2996000) m
  // (arithmetic: 2996000.375500644).
  const FaultDistance far = nearest_fault(segs, 501500.0, 9119000.0);
  CHECK(far.fault_id == "F1");
  CHECK(std::abs(far.distance - 2996000.375500644) < 1e-6);
  // 1000 m from the middle of F2 along its normal (constructed here, so exactly 1000 m).
  const double dx = 3500.0, dy = 800.0, len = std::hypot(dx, dy);
  const double x = 497750.0 - 1000.0 * dy / len, y = 6118400.0 + 1000.0 * dx / len;
  const FaultDistance near = nearest_fault(segs, x, y);
  CHECK(near.fault_id == "F2");
  CHECK(std::abs(near.distance - 1000.0) < 1e-6);
}

TEST_CASE("a well outside the study area is refused unless allow_outside") {
  TinyScenario t;
  t.replace("scenario.toml", "y = 6119000.0", "y = 9119000.0");  // a northing typo of 3,000 km
  const auto s = scenario::load_scenario(t.scenario());
  CHECK_THROWS_WITH_AS(prepare_run(s, false),
                       doctest::Contains("scenario.toml line 18, column 6 (well 'P1'): field 'location' = '501500, "
                                         "9119000 (EPSG:32708)': expected a place within the study area: the fault "
                                         "map's extent plus 50 km (x 446000 to 553000, y 6068000 to 6173000 m in "
                                         "EPSG:32708) or the output grid's extent (x 494000 to 506000, y 6116000 to "
                                         "6126000); the well lies at (501500, 9119000) m in EPSG:32708, 2996 km from "
                                         "the nearest fault (F1)"),
                       InputError);

  TinyScenario allowed;
  allowed.replace("scenario.toml", "y = 6119000.0", "y = 9119000.0");
  allowed.replace("scenario.toml", "file = \"wells.csv\"", "file = \"wells.csv\"\nallow_outside = true");
  const auto sa = scenario::load_scenario(allowed.scenario());
  CHECK(sa.allow_outside);
  CHECK_NOTHROW(prepare_run(sa, false));
}

TEST_CASE("one well in degrees among wells in metres is far from the faults and refused") {
  TinyScenario t;
  t.replace("wells.csv", "W1,500000,6120000", "W1,135.0182,-35.0871");
  const auto s = scenario::load_scenario(t.scenario());
  CHECK_THROWS_WITH_AS(prepare_run(s, false),
                       doctest::Contains("wells.csv line 4 (well 'W1'): field 'location' = '135.0182, -35.0871 "
                                         "(EPSG:32708)'"),
                       InputError);
}

TEST_CASE("a proposed well given in lon/lat far from the region is refused in the working CRS") {
  TinyScenario t;
  // 135°W 20°S, on the central meridian of UTM zone 8S but some 1,700 km north of the faults.
  t.replace("scenario.toml", "x = 501500.0\ny = 6119000.0", "lon = -135.0\nlat = -20.0");
  const auto s = scenario::load_scenario(t.scenario());
  CHECK_THROWS_WITH_AS(prepare_run(s, false), doctest::Contains("field 'location' = '-135, -20 (EPSG:4326)'"),
                       InputError);
}
