#include "scenario/plausibility.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <string>
#include <utility>
#include <vector>

#include "core/errors.hpp"
#include "scenario/scenario.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::scenario;
using slipscreen::test::TinyScenario;

namespace {
// 1 bbl = 0.158987294928 m³ exactly (42 US gal; NIST SP 811), 1 d = 86400 s.
constexpr double kBblPerDay = 0.158987294928 / 86400.0;
}  // namespace

TEST_CASE("ranges: bounds, open ends, NaN and infinities") {
  // 1e6 bbl/d = 1.840130728333 m³/s (arithmetic from the exact barrel).
  CHECK(std::abs(plausible::kMaxRate - 1.840130728333333) < 1e-12);
  CHECK(plausible::kInjectionRate.contains(0.0));
  CHECK(plausible::kInjectionRate.contains(1e6 * kBblPerDay));
  CHECK_FALSE(plausible::kInjectionRate.contains(1.01e6 * kBblPerDay));
  CHECK_FALSE(plausible::kInjectionRate.contains(-1e-9));
  CHECK_FALSE(plausible::kInjectionRate.contains(std::numeric_limits<double>::quiet_NaN()));
  CHECK_FALSE(plausible::kInjectionRate.contains(std::numeric_limits<double>::infinity()));
  CHECK(plausible::kWellTop.contains(0.0));  // a well top at the surface
  CHECK_FALSE(plausible::kWellBottom.contains(0.0));  // open at 0
  CHECK_FALSE(plausible::kWellTop.contains(15000.1));
  // 1e-7 mD and 1e6 mD in m² (1 mD = 9.869233e-16 m², common practice) are the inclusive bounds.
  CHECK(plausible::kPermeability.contains(1e-7 * 9.869233e-16));
  CHECK(plausible::kPermeability.contains(1e6 * 9.869233e-16));
  CHECK_FALSE(plausible::kPermeability.contains(-100 * 9.869233e-16));
  CHECK_FALSE(plausible::kProjectedCoordinate.contains(1e308));
}

TEST_CASE("numbers as read, degrees, dates") {
  CHECK(plausible::number_as_read(501500.0) == "501500");
  CHECK(plausible::number_as_read(-35.1) == "-35.1");
  CHECK(plausible::number_as_read(6119000.25) == "6119000.25");
  CHECK(plausible::number_as_read(1e80) == "1e+80");
  CHECK(plausible::number_as_read(std::numeric_limits<double>::infinity()) == "inf");
  CHECK(plausible::looks_like_degrees(135.0, -35.0));
  CHECK(plausible::looks_like_degrees(-180.0, 90.0));
  CHECK_FALSE(plausible::looks_like_degrees(500000.0, 6120000.0));
  CHECK_FALSE(plausible::looks_like_degrees(135.0, 91.0));
  CHECK(plausible::plausible_date({1900, 1, 1}));
  CHECK(plausible::plausible_date({2200, 12, 31}));
  CHECK_FALSE(plausible::plausible_date({1899, 12, 31}));
  CHECK_FALSE(plausible::plausible_date({2201, 1, 1}));
}

// Each edit of the tiny scenario and the start of the message it must give: the place, the
// field, the value as written and the range.
TEST_CASE("every scenario quantity is refused outside its range, with the value as written") {
  struct Edit {
    std::string file, from, to, message;
  };
  const std::vector<Edit> edits = {
      // injection
      {"scenario.toml", "\"5000 bbl/d from", "\"1e300 bbl/d from",
       "field 'proposed_well[0].schedule[0]' = '1e300 bbl/d from 2021-01-01 to 2022-01-01': expected an injection rate from 0 to 1e6 bbl/d"},
      {"scenario.toml", "\"5000 bbl/d from", "\"1.1e6 bbl/d from", "expected an injection rate from 0 to 1e6 bbl/d"},
      {"histories.csv", "W1,2020-01,300000", "W1,2020-01,1e308",
       "histories.csv line 2, column 3 ('volume [bbl]'): field 'volume' = '1e308': expected a volume from 0 to 3.1e+07 bbl for this 31-day period"},
      {"histories.csv", "W1,2020-01,300000", "W1,2020-01,3.2e7", "field 'volume' = '3.2e7': expected a volume from 0 to 3.1e+07 bbl"},
      // depths
      {"wells.csv", "W1,500000,6120000,2900,3000", "W1,500000,6120000,-100,3000",
       "wells.csv line 4, column 4 ('top [m]'): field 'top' = '-100': expected a depth below the surface from 0 to 15 km"},
      {"wells.csv", "W1,500000,6120000,2900,3000", "W1,500000,6120000,2900,16 km", "field 'bottom' = '16 km': expected a depth"},
      {"scenario.toml", "top = \"2900 m\"", "top = \"-50 m\"", "field 'proposed_well[0].top' = '-50 m': expected a depth below the surface"},
      {"wells.csv", "0.1 m,active", "2 m,active", "field 'radius' = '2 m': expected a well radius in (0, 1 m]"},
      {"region.toml", "reference_depth = \"3000 m\"", "reference_depth = \"30 km\"", "field 'reference_depth' = '30 km'"},
      // formation
      {"scenario.toml", "permeability = \"200 mD\"", "permeability = \"-100 mD\"",
       "field 'region.override.formation.permeability' = '-100 mD': expected a permeability from 1e-7 mD to 1e6 mD"},
      {"region.toml", "thickness = \"100 m\"", "thickness = \"100 km\"", "field 'formation.thickness' = '100 km': expected a formation thickness"},
      {"region.toml", "porosity = 0.1", "porosity = 1.5", "field 'formation.porosity' = '1.5': expected a porosity from 0.0001 to 0.6"},
      {"region.toml", "total_compressibility = \"1e-9 1/Pa\"", "total_compressibility = \"1e-3 1/Pa\"",
       "field 'formation.total_compressibility' = '1e-3 1/Pa': expected a total compressibility"},
      {"region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"-1 cP\"", "field 'formation.viscosity' = '-1 cP': expected a viscosity"},
      // stress
      {"region.toml", "vertical_gradient = \"1.1 psi/ft\"", "vertical_gradient = \"1.1 MPa/m\"",
       "field 'stress.vertical_gradient' = '1.1 MPa/m': expected a vertical stress gradient"},
      {"region.toml", "pore_pressure_gradient = \"0.433 psi/ft\"", "pore_pressure_gradient = \"-0.433 psi/ft\"",
       "field 'pore_pressure_gradient' = '-0.433 psi/ft': expected a pore-pressure gradient"},
      {"region.toml", "shmax_azimuth = \"60 deg\"", "shmax_azimuth = \"6000 deg\"", "field 'stress.shmax_azimuth' = '6000 deg'"},
      {"region.toml", "cohesion = \"0 MPa\"", "cohesion = \"-1 MPa\"", "field 'faults.cohesion' = '-1 MPa': expected a cohesion"},
      {"region.toml", "segment_length = \"1 km\"", "segment_length = \"0.001 m\"", "field 'faults.segment_length' = '0.001 m': expected a segment length"},
      // dates and durations
      {"histories.csv", "W1,2020-01", "W1,1850-01", "field 'month' = '1850-01': expected a month from 1900-01 to 2200-12"},
      {"scenario.toml", "to 2024-01-01", "to 2424-01-01", "expected dates from 1900-01-01 to 2200-12-31"},
      {"scenario.toml", "end = \"2023-01-01\"", "end = \"2323-01-01\"",
       "field 'output.times.end' = '2323-01-01': expected a date from 1900-01-01 to 2200-12-31"},
      {"scenario.toml", "step = \"1 year\"", "step = \"5000 years\"", "field 'output.times.step' = '5000 years': expected a step of at most 300 years"},
      // grid
      {"scenario.toml", "cell_size = \"1 km\"", "cell_size = \"0.1 m\"", "field 'output.grid.cell_size' = '0.1 m': expected a cell size"},
      {"scenario.toml", "extent = [494000.0, 6116000.0, 506000.0, 6126000.0]", "extent = [494000.0, 6116000.0, inf, 6126000.0]",
       "field 'output.grid.extent'"},
      // coordinates
      {"scenario.toml", "x = 501500.0", "x = nan", "field 'proposed_well[0].x' = 'nan': expected a finite number"},
      {"scenario.toml", "y = 6119000.0", "y = 1e308", "field 'proposed_well[0].y' = '1e+308': expected a projected coordinate"},
      {"scenario.toml", "x = 501500.0\ny = 6119000.0", "x = 135.0182\ny = -35.0871",
       "field 'proposed_well[0].x' = '135.0182, -35.0871': expected x and y in EPSG:32708 (a projected CRS): |x| <= 180 and |y| <= 90 look like longitude and latitude"},
      {"scenario.toml", "x = 501500.0\ny = 6119000.0", "lon = 135.0\nlat = -35.0\ncrs = \"EPSG:32708\"",
       "field 'proposed_well[0].crs' = 'EPSG:32708': expected a geographic CRS (such as EPSG:4326) with 'lon' and 'lat'"},
      {"scenario.toml", "x = 501500.0\ny = 6119000.0", "lon = 235.0\nlat = -35.0", "field 'proposed_well[0].lon' = '235.0': expected a longitude"},
      {"wells.csv", "W1,500000,6120000", "W1,500000,1e9", "field 'y' = '1e9': expected a projected coordinate"},
      {"wells.csv", "id,x,y", "id,lon,lat", "field 'crs' = 'EPSG:32708': expected a geographic CRS such as EPSG:4326 for 'lon' and 'lat' columns"},
      // the run's memory limit
      {"scenario.toml", "seed = 42", "seed = 42\nmemory_limit = \"8 parsecs\"", "field 'memory_limit' = '8 parsecs': expected a memory size"},
  };
  for (const auto& e : edits) {
    CAPTURE(e.to);
    TinyScenario t;
    t.replace(e.file, e.from, e.to);
    CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains(e.message.c_str()), InputError);
  }
}

TEST_CASE("a wells file whose every well looks like degrees under a projected crs is refused; one such well is not") {
  TinyScenario t;
  t.replace("wells.csv", "W1,500000,6120000", "W1,135.0182,-35.0871");
  t.replace("wells.csv", "W2,498000,6121500", "W2,134.9963,-35.0738");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()),
                       doctest::Contains("wells.csv line 4, column 2 ('x'): field 'x, y' = '135.0182, -35.0871': expected "
                                         "coordinates in EPSG:32708 (a projected CRS): every well has |x| <= 180"),
                       InputError);
  // One well in degrees among wells in metres loads here; the study-area check refuses it later
  // (tests/screening/study_area_test.cpp).
  TinyScenario one;
  one.replace("wells.csv", "W1,500000,6120000", "W1,135.0182,-35.0871");
  CHECK_NOTHROW(load_scenario(one.scenario()));
}

TEST_CASE("values at the edge of their ranges are accepted") {
  TinyScenario t;
  t.replace("scenario.toml", "\"5000 bbl/d from", "\"1e6 bbl/d from");
  t.replace("wells.csv", "W1,500000,6120000,2900,3000", "W1,500000,6120000,0,15 km");
  t.replace("histories.csv", "W1,2020-01,300000", "W1,2020-01,3.1e7");  // 1e6 bbl/d for 31 days
  t.replace("scenario.toml", "seed = 42", "seed = 42\nmemory_limit = \"512 MiB\"");
  const ResolvedScenario s = load_scenario(t.scenario());
  CHECK(s.wells[0].top == 0.0);
  CHECK(s.wells[0].bottom == 15000.0);
  CHECK(s.memory_limit == 512.0 * 1024 * 1024);
  CHECK_FALSE(s.allow_outside);
}

TEST_CASE("distributions of the probabilistic screen keep to the same ranges") {
  const std::vector<std::pair<std::string, std::string>> blocks = {
      {"[uncertainty.formation]\npermeability = \"uniform(1 mD, 1e7 mD)\"\n",
       "field 'uncertainty.formation.permeability' = 'uniform(1 mD, 1e7 mD)': expected a distribution of permeabilities "
       "from 1e-7 mD to 1e6 mD"},
      {"[uncertainty.formation]\nviscosity = \"1e4 cP\"\n", "expected a value among viscosities from 0.01 cP to 1000 cP"},
      {"[uncertainty]\nrate_factor = \"uniform(0.5, 20)\"\n", "expected a distribution of rate factors from 0 to 10"},
  };
  for (const auto& [block, message] : blocks) {
    CAPTURE(block);
    TinyScenario t;
    t.append("scenario.toml", "\n" + block);
    CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains(message.c_str()), InputError);
  }
}

TEST_CASE("rates in a rate column and the continuation date are checked too") {
  TinyScenario t;
  t.write("histories.csv", "well,start,end,rate\nW1,2020-01-01,2020-02-01,2e6 bbl/d\n");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()),
                       doctest::Contains("histories.csv line 2, column 4 ('rate'): field 'rate' = '2e6 bbl/d': expected an "
                                         "injection rate from 0 to 1e6 bbl/d"),
                       InputError);
  TinyScenario c;
  c.replace("scenario.toml", "file = \"histories.csv\"", "file = \"histories.csv\"\ncontinue_active_until = \"2999-01-01\"");
  CHECK_THROWS_WITH_AS(load_scenario(c.scenario()),
                       doctest::Contains("field 'histories.continue_active_until' = '2999-01-01': expected a date from "
                                         "1900-01-01 to 2200-12-31"),
                       InputError);
}
