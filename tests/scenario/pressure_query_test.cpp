#include "scenario/pressure_query.hpp"

#include <doctest/doctest.h>

#include <fstream>
#include <string>
#include <vector>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
using namespace slipscreen::scenario;
using slipscreen::test::TempDir;

namespace {

const std::filesystem::path kData = std::filesystem::path(SLIPSCREEN_SOURCE_DIR) / "tests/data/pressure";

struct Failure {
  bool thrown = false;
  ErrorCategory category = ErrorCategory::io;
  std::string message;
};

// Reads `text` as the file bad.toml in a fresh folder and returns the error it raises.
Failure failure_of(const std::string& text) {
  TempDir dir("pressure-query");
  std::ofstream(dir / "bad.toml") << text;
  try {
    read_pressure_query(dir / "bad.toml");
  } catch (const Error& e) {
    return {true, e.category(), e.what()};
  }
  return {};
}

// One well with one rate step: the smallest file the command can run with a few options.
const std::string kWell = "[[well]]\nname = \"A\"\nschedule = [{ rate = \"2e4 bbl/d\" }]\n";

}  // namespace

TEST_CASE("a complete pressure file is read with every value as written") {
  const PressureQuery q = read_pressure_query(kData / "complete.toml");
  CHECK(q.permeability == "10 mD");
  CHECK(q.thickness == "30 m");
  CHECK(q.viscosity == "0.5 cP");
  // a bare number is accepted for the dimensionless porosity and keeps its value
  CHECK(units::parse(q.porosity, units::Dimension::dimensionless, "porosity") == 0.15);
  CHECK(q.total_compressibility == "1e-9 1/Pa");
  CHECK(q.transmissivity.empty());
  CHECK(q.storativity.empty());
  CHECK(q.fluid_density.empty());

  REQUIRE(q.wells.size() == 2);
  CHECK(q.wells[0].name == "A");
  CHECK(q.wells[0].x == "0 m");
  CHECK(q.wells[0].y == "0 m");
  CHECK(q.wells[0].radius == "0.15 m");
  REQUIRE(q.wells[0].schedule.size() == 2);
  CHECK(q.wells[0].schedule[0].rate == "2e4 bbl/d");
  CHECK(q.wells[0].schedule[0].from == "0 d");
  CHECK(q.wells[0].schedule[1].rate == "0 bbl/d");
  CHECK(q.wells[0].schedule[1].from == "2 yr");
  // defaults for what a well or a step leaves out
  CHECK(q.wells[1].name == "B");
  CHECK(q.wells[1].x == "2 km");
  CHECK(q.wells[1].y == "0 m");
  CHECK(q.wells[1].radius.empty());
  REQUIRE(q.wells[1].schedule.size() == 1);
  CHECK(q.wells[1].schedule[0].rate == "1000 m3/d");
  CHECK(q.wells[1].schedule[0].from == "0 s");

  REQUIRE(q.boundaries.size() == 1);
  CHECK(q.boundaries[0].kind == "no-flow");
  CHECK(q.boundaries[0].x == "5 km");
  CHECK(q.boundaries[0].y == "0 m");
  CHECK(q.boundaries[0].azimuth == "0 deg");

  CHECK(q.distances == std::vector<std::string>{"500 m", "1 km"});
  CHECK(q.points == std::vector<std::string>{"1 km, -200 m"});
  CHECK(q.times == std::vector<std::string>{"30 d", "1 yr"});
  CHECK(q.unit == "kPa");
  CHECK(q.length_unit == "km");
}

TEST_CASE("the hydrogeologists' set and a single time are read; an empty file sets nothing") {
  TempDir dir("pressure-query");
  std::ofstream(dir / "t.toml") << "[formation]\ntransmissivity = \"1e-4 m2/s\"\nstorativity = 1e-4\n"
                                   "fluid_density = \"1000 kg/m3\"\n[output]\ntimes = \"1 yr\"\n";
  const PressureQuery q = read_pressure_query(dir / "t.toml");
  CHECK(q.transmissivity == "1e-4 m2/s");
  CHECK(units::parse(q.storativity, units::Dimension::dimensionless, "storativity") == 1e-4);
  CHECK(q.fluid_density == "1000 kg/m3");
  CHECK(q.permeability.empty());
  CHECK(q.times == std::vector<std::string>{"1 yr"});

  std::ofstream(dir / "empty.toml") << "# nothing\n";
  const PressureQuery e = read_pressure_query(dir / "empty.toml");
  CHECK(e.wells.empty());
  CHECK(e.times.empty());
  CHECK(e.unit.empty());
}

TEST_CASE("a misspelt key under [output] is refused with the key it resembles") {
  try {
    read_pressure_query(kData / "misspelt_unit.toml");
    FAIL("units = \"psi\" was accepted");
  } catch (const Error& e) {
    CHECK(e.category() == ErrorCategory::input);
    const std::string m = e.what();
    CHECK_MESSAGE(m.find("misspelt_unit.toml line 18, column 1") != std::string::npos, m);
    CHECK_MESSAGE(m.find("key 'output.units': unknown key (did you mean 'unit'?)") != std::string::npos, m);
  }
}

TEST_CASE("unknown tables and keys are refused at every level") {
  struct Case {
    std::string text;
    std::string expected;
  };
  const std::vector<Case> cases = {
      {kWell + "[wells]\nx = \"1 m\"\n", "bad.toml line 4, column 2: key 'wells': unknown key (did you mean 'well'?)"},
      {kWell + "[formation]\npermeabilty = \"10 mD\"\n",
       "key 'formation.permeabilty': unknown key (did you mean 'permeability'?)"},
      {"[[well]]\nname = \"A\"\nradus = \"0.1 m\"\n", "bad.toml line 3, column 1: key 'well[0].radus': unknown key (did you mean 'radius'?)"},
      {kWell + "[[well]]\nname = \"B\"\nschedule = [{ from = \"0 d\", rates = \"1 m3/d\" }]\n",
       "key 'well[1].schedule[0].rates': unknown key (did you mean 'rate'?)"},
      {kWell + "[[boundary]]\nkind = \"no-flow\"\nazimut = \"0 deg\"\n",
       "key 'boundary[0].azimut': unknown key (did you mean 'azimuth'?)"},
      {kWell + "[output]\ntime = [\"1 yr\"]\n", "key 'output.time': unknown key (did you mean 'times'?)"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.text);
    const Failure f = failure_of(c.text);
    REQUIRE(f.thrown);
    CHECK(f.category == ErrorCategory::input);
    CHECK_MESSAGE(f.message.find(c.expected) != std::string::npos, f.message);
  }
}

TEST_CASE("a value of the wrong type or unit names the file, line, key path, value and what was expected") {
  struct Case {
    std::string text;
    std::vector<std::string> expected;
  };
  const std::vector<Case> cases = {
      // a number without a unit where a length is needed
      {"[[well]]\nname = \"A\"\nx = 0\n",
       {"bad.toml line 3, column 5: ", "field 'well[0].x' = '0'", "length unit", "(the unit is missing)"}},
      // a table where an array of wells is expected
      {"[well]\nname = \"A\"\n", {"bad.toml line 1, column 1: ", "field 'well' = '[well]'", "expected a well table [[well]]"}},
      // a text where a rate step is expected
      {"[[well]]\nname = \"A\"\nschedule = [\"2e4 bbl/d\"]\n",
       {"bad.toml line 3, column 13: ", "field 'well[0].schedule[0]' = '2e4 bbl/d'", "expected a list of rate steps"}},
      {"[[well]]\nname = \"A\"\nschedule = [{ from = \"1 yr\" }]\n",
       {"bad.toml line 3, column 13: ", "key 'well[0].schedule[0].rate': missing (expected a volume rate"}},
      {"[[well]]\nname = 7\n", {"bad.toml line 2, column 8: ", "field 'well[0].name' = '7'", "expected a string"}},
      {kWell + "[[well]]\nname = \"A\"\n", {"bad.toml line 5, column 8: ", "field 'well[1].name' = 'A'", "a well name used once"}},
      {"[formation]\npermeability = \"10 cP\"\n",
       {"bad.toml line 2, column 16: ", "field 'formation.permeability' = 'cP'", "not a viscosity unit"}},
      {"[formation]\nthickness = { value = 30 }\n",
       {"bad.toml line 2, column 13: ", "field 'formation.thickness'", "expected a length with its unit, in quotes"}},
      {"[[boundary]]\nkind = \"no_flow\"\n",
       {"bad.toml line 2, column 8: ", "field 'boundary[0].kind' = 'no_flow'", "'no-flow' or 'constant-pressure'"}},
      {"[output]\ntimes = [\"1 yr\", 10]\n",
       {"bad.toml line 2, column 18: ", "field 'output.times[1]' = '10'", "time unit"}},
      {"[output]\npoints = [\"1 km\"]\n",
       {"bad.toml line 2, column 11: ", "field 'output.points[0]' = '1 km'", "expected a point \"x, y\""}},
      {"[output]\npoints = [\"1 km, 2 s\"]\n",
       {"bad.toml line 2, column 11: ", "field 'output.points[0] y' = 's'", "not a time unit"}},
      {"[output]\nunit = \"psy\"\n", {"bad.toml line 2, column 8: ", "field 'output.unit' = 'psy'", "did you mean 'psi'"}},
      {"[output]\nlength_unit = 1000\n", {"bad.toml line 2, column 15: ", "field 'output.length_unit' = '1000'", "a string"}},
      {"output = 3\n", {"bad.toml line 1, column 10: ", "key 'output': expected a table ([output])"}},
  };
  for (const auto& c : cases) {
    CAPTURE(c.text);
    const Failure f = failure_of(c.text);
    REQUIRE(f.thrown);
    CHECK(f.category == ErrorCategory::input);
    for (const auto& e : c.expected) CHECK_MESSAGE(f.message.find(e) != std::string::npos, e << " not in: " << f.message);
  }
}

TEST_CASE("a missing file is an I/O error and a syntax error names its line") {
  TempDir dir("pressure-query");
  try {
    read_pressure_query(dir / "none.toml");
    FAIL("a missing file was read");
  } catch (const Error& e) {
    CHECK(e.category() == ErrorCategory::io);
    CHECK(std::string(e.what()).find("none.toml") != std::string::npos);
  }
  const Failure f = failure_of("[output]\nunit = \"psi\n");
  REQUIRE(f.thrown);
  CHECK(f.category == ErrorCategory::input);
  CHECK_MESSAGE(f.message.find("bad.toml line 2") != std::string::npos, f.message);
}
