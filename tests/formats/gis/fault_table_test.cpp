#include "formats/gis/fault_table.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <fstream>

#include "core/errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
using namespace slipscreen::formats;

TEST_CASE("a CSV fault table becomes straight traces split into segments") {
  const test::TempDir dir("fault-table");
  std::ofstream(dir / "faults.csv") << "# crs: EPSG:32708\n"
                                       "id,x,y,strike [deg],dip,length,friction\n"
                                       "F1,500000,6120000,45,80 deg,3 km,\n"
                                       "F2,500000,6110000,90,60 deg,1500 m,0.7\n";
  const Crs working = working_crs("EPSG:32708");
  const auto segs = read_fault_table(dir / "faults.csv", "faults.csv", working, "", 1000.0, 3);
  REQUIRE(segs.size() == 5);  // ceil(3 km / 1 km) + ceil(1.5 km / 1 km)
  // x = 500000 is UTM zone 8S's central meridian: grid north is true north there (meridian
  // convergence 0; common practice for Transverse Mercator), so the trace runs exactly N45E.
  const double h = 1500.0 / std::sqrt(2.0);
  CHECK(std::abs(segs[0].trace.start.x - (500000 - h)) < 1e-6);
  CHECK(std::abs(segs[0].trace.start.y - (6120000 - h)) < 1e-6);
  CHECK(std::abs(segs[2].trace.end.x - (500000 + h)) < 1e-6);
  CHECK(std::abs(segs[0].strike_rad - 3.14159265358979323846 / 4) < 1e-9);
  CHECK(std::abs(segs[0].dip_rad - 80 * 3.14159265358979323846 / 180) < 1e-15);
  CHECK(segs[0].segment_id == "F1:0");
  CHECK(!segs[0].friction.has_value());
  CHECK(segs[4].fault_id == "F2");
  CHECK(segs[4].friction == 0.7);
  CHECK(std::abs(segs[3].trace.length_m - 750.0) < 1e-9);
}

TEST_CASE("bad rows of a fault table name file, line and column") {
  const test::TempDir dir("fault-table-bad");
  std::ofstream(dir / "faults.csv") << "# crs: EPSG:32708\nid,x,y,strike,dip,length\nF1,500000,6120000,45 deg,95 deg,3 km\n";
  const Crs working = working_crs("EPSG:32708");
  CHECK_THROWS_WITH_AS(read_fault_table(dir / "faults.csv", "faults.csv", working, "", 1000.0, 3),
                       doctest::Contains("faults.csv line 3, column 5 ('dip'): field 'dip' = '95 deg': expected a dip in (0, 90]"),
                       InputError);
  std::ofstream(dir / "g.csv") << "id,x,y,strike,dip,length\nF1,500000,6120000,45 deg,60 deg,3\n";
  CHECK_THROWS_WITH_AS(read_fault_table(dir / "g.csv", "g.csv", working, "EPSG:32708", 1000.0, 3),
                       doctest::Contains("g.csv line 2, column 6 ('length'): field 'length' = '3'"), InputError);
  CHECK(is_fault_table("a/B.CSV"));
  CHECK_FALSE(is_fault_table("a/b.gpkg"));
}
