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

TEST_CASE("implausible fault tables are refused with file, line and field") {
  const test::TempDir dir("fault-table-plausible");
  const Crs working = working_crs("EPSG:32708");
  const auto read = [&](const std::string& rows) {
    std::ofstream(dir / "t.csv") << "# crs: EPSG:32708\nid,x,y,strike [deg],dip [deg],length [km]\n" << rows;
    return read_fault_table(dir / "t.csv", "t.csv", working, "", 1000.0, 3);
  };
  CHECK_THROWS_WITH_AS(read("F1,501000,6120000,45,80,6\nF2,502000,6120000,45,80,6\nF1,503000,6120000,45,80,6\n"),
                       doctest::Contains("t.csv line 5, column 1 ('id'): field 'id' = 'F1': expected a fault id not used "
                                         "before in the table (line 3 has it)"),
                       InputError);
  CHECK_THROWS_WITH_AS(read("F1,1e308,6120000,45,80,6\n"),
                       doctest::Contains("t.csv line 3: field 'fault centre' = '(1e+308, 6120000) in the working CRS': "
                                         "expected projected coordinates within 1e8 m"),
                       InputError);
  CHECK_THROWS_WITH_AS(read("F1,nan,6120000,45,80,6\n"), doctest::Contains("t.csv line 3, column 2 ('x'): field 'x' = 'nan'"),
                       InputError);
  CHECK_THROWS_WITH_AS(read("F1,501000,6120000,45,80,1e7\n"),
                       doctest::Contains("t.csv line 3, column 6 ('length [km]'): field 'length' = '1e7': expected a fault "
                                         "length > 0 and at most 1000 km"),
                       InputError);
}

TEST_CASE("a fault table's own depth ranges: top and bottom with length units, both or neither, checked") {
  const test::TempDir dir("fault-table-depth");
  const Crs working = working_crs("EPSG:32708");
  const auto read = [&](const std::string& rows) {
    std::ofstream(dir / "t.csv") << "# crs: EPSG:32708\nid,x,y,strike [deg],dip [deg],length [km],top,bottom [km]\n"
                                 << rows;
    return read_fault_table(dir / "t.csv", "t.csv", working, "", 1000.0, 3, 15000.0);
  };
  const auto segs = read("F1,501000,6120000,45,80,2,2500 m,4\nF2,502000,6120000,45,80,1,,\n");
  REQUIRE(segs.size() == 3);
  CHECK(segs[0].top_m == 2500.0);
  CHECK(segs[0].bottom_m == 4000.0);  // the header's km (1 km = 1000 m)
  CHECK(segs[1].bottom_m == 4000.0);
  CHECK_FALSE(segs[2].top_m.has_value());  // empty cells: the region's range
  CHECK_THROWS_WITH_AS(read("F1,501000,6120000,45,80,2,5 km,4\n"),
                       doctest::Contains("t.csv line 3: field 'bottom' = '4': expected a depth below the fault's top (5 km)"),
                       InputError);
  CHECK_THROWS_WITH_AS(read("F1,501000,6120000,45,80,2,5 km,\n"),
                       doctest::Contains("t.csv line 3: field 'bottom' = '(empty)'"), InputError);
  CHECK_THROWS_WITH_AS(read("F1,501000,6120000,45,80,2,0 m,20\n"),
                       doctest::Contains("t.csv line 3: field 'bottom' = '20': expected a depth from 0 to 15 km"),
                       InputError);
}
