#include "scenario/observations.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"
#include "formats/table/csv.hpp"

using namespace slipscreen;
using namespace slipscreen::scenario;

namespace {
constexpr double kPsi = 6894.757293168361;  // Pa per psi (NIST SP 811)
}

TEST_CASE("pressure observations: dp with its unit in the header, CRS from the header comment") {
  const auto t = formats::parse_csv(
      "# crs: EPSG:32708\nid,x,y,date,dp [psi],sd [psi]\nM1,501000,6120300,2020-06-01,100,5\nM1,501000,6120300,2020-12-01,150 psi,5\n",
      "obs.csv");
  const auto o = read_pressure_observations(t, "EPSG:4326", 10e3);
  REQUIRE(o.size() == 2);
  CHECK(o[0].crs == "EPSG:32708");
  CHECK(o[0].dp == doctest::Approx(100 * kPsi).epsilon(1e-14));
  CHECK(o[1].dp == doctest::Approx(150 * kPsi).epsilon(1e-14));
  CHECK(o[0].sd == doctest::Approx(5 * kPsi).epsilon(1e-14));
  CHECK(o[0].time == 1590969600.0);  // 2020-06-01T00:00Z (date -u -d 2020-06-01 +%s)
  CHECK(o[1].source == "obs.csv line 4");
}

TEST_CASE("pressure observations: an absolute pressure at a depth gives dp = p − gradient × depth") {
  const auto t = formats::parse_csv("id,x,y,date,p [MPa],depth [m],sd [MPa]\nS1,1000,2000,2021-01-01,31.5,3000,0.2\n",
                                    "obs.csv");
  const auto o = read_pressure_observations(t, "EPSG:32708", 10e3);  // p0 = 30 MPa at 3 km
  REQUIRE(o.size() == 1);
  CHECK(o[0].crs == "EPSG:32708");  // the default (the wells' CRS)
  CHECK(o[0].dp == doctest::Approx(1.5e6).epsilon(1e-12));
}

TEST_CASE("pressure observations: bad tables are refused naming the place") {
  const auto refuse = [](const char* text, const char* where) {
    CAPTURE(text);
    try {
      read_pressure_observations(formats::parse_csv(text, "obs.csv"), "EPSG:32708", 10e3);
      FAIL("not refused");
    } catch (const InputError& e) {
      CHECK(std::string(e.what()).find(where) != std::string::npos);
    }
  };
  refuse("id,x,y,date,dp [psi],sd [psi]\nM1,1,2,2020-13-01,10,1\n", "obs.csv line 2, column 4");
  refuse("id,x,y,date,dp [psi],sd [psi]\nM1,1,2,2020-01-01,10,0\n", "obs.csv line 2, column 6");
  refuse("id,x,y,date,dp [psi],p [psi],sd [psi]\nM1,1,2,2020-01-01,10,10,1\n", "either a 'dp' column");
  refuse("id,x,y,date,p [psi],sd [psi]\nM1,1,2,2020-01-01,10,1\n", "column 'depth'");
  refuse("id,x,y,date,dp [psi],sd [psi]\n", "at least one observation");
  refuse("id,x,y,date,dp,sd [psi]\nM1,1,2,2020-01-01,10,1\n", "obs.csv line 2, column 5");  // no unit
}
