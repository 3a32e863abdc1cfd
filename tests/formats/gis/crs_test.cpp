#include "formats/gis/crs.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "core/errors.hpp"

using namespace slipscreen;
using formats::Crs;

TEST_CASE("WGS 84 lon/lat to UTM 14N agrees with PROJ's command-line tools") {
  // Reference (PROJ 9.1.1 / GDAL 3.6.2 command-line tools, run 2026-12-01):
  //   echo "-97.5 36.0" | gdaltransform -s_srs EPSG:4326 -t_srs EPSG:32614
  //     -> 635196.249318616 3984988.80398431 0
  //   echo "36.0 -97.5" | cs2cs -f "%.4f" EPSG:4326 EPSG:32614   (EPSG:4326 is lat/lon there)
  //     -> 635196.2493 3984988.8040 0.0000
  const Crs wgs84 = Crs::from_user_string("EPSG:4326");
  const Crs utm = formats::working_crs("EPSG:32614");
  const formats::Transformer t(wgs84, utm);
  CHECK_FALSE(t.identity());
  // Traditional GIS order: x = longitude first, although EPSG defines 4326 as lat/lon.
  const auto p = t({-97.5, 36.0});
  CHECK(std::abs(p.x - 635196.249318616) < 1e-6);   // m
  CHECK(std::abs(p.y - 3984988.80398431) < 1e-6);   // m
  // ... and back (round trip through PROJ, well below a millimetre).
  const formats::Transformer back(utm, wgs84);
  const auto q = back(p);
  CHECK(std::abs(q.x - -97.5) < 1e-9);  // degrees
  CHECK(std::abs(q.y - 36.0) < 1e-9);
}

TEST_CASE("many points at once match one at a time") {
  const formats::Transformer t(Crs::from_user_string("EPSG:4326"), formats::working_crs("EPSG:32614"));
  std::vector<geometry::Point2> pts{{-97.5, 36.0}, {-98.0, 35.5}, {-99.0, 36.5}};
  const auto single = t(pts[1]);
  t.apply(pts);
  CHECK(std::abs(pts[0].x - 635196.249318616) < 1e-6);
  CHECK(pts[1] == single);
  // On the central meridian of zone 14 (-99°) the easting is the false easting 500 000 m
  // (definition of UTM, common practice).
  CHECK(std::abs(pts[2].x - 500000.0) < 1e-6);
}

TEST_CASE("PROJ strings and WKT are accepted; the same CRS is an identity transform") {
  const Crs a = Crs::from_user_string("EPSG:32614");
  const Crs b = Crs::from_user_string("+proj=utm +zone=14 +datum=WGS84 +units=m +no_defs +type=crs");
  CHECK(a.is_projected());
  CHECK(b.is_projected());
  CHECK(a.linear_unit_m() == 1.0);
  CHECK(a.authority() == "EPSG:32614");
  CHECK(a.name() == "WGS 84 / UTM zone 14N");
  const Crs c = Crs::from_user_string(a.wkt());
  CHECK(c.same_as(a));
  CHECK(formats::Transformer(a, c).identity());
  const auto p = formats::Transformer(Crs::from_user_string("EPSG:4326"), b)({-97.5, 36.0});
  CHECK(std::abs(p.x - 635196.249318616) < 1e-6);  // gdaltransform value above
}

TEST_CASE("unknown or unusable CRSs are clear input errors") {
  CHECK_THROWS_WITH_AS(Crs::from_user_string("EPSG:999999", "region.crs"),
                       doctest::Contains("field 'region.crs' = 'EPSG:999999': expected a coordinate reference system"),
                       InputError);
  CHECK_THROWS_AS(Crs::from_user_string("not a crs"), InputError);
  CHECK_THROWS_AS(Crs::from_user_string("   "), InputError);
  // A file name is not read (file look-ups are off).
  CHECK_THROWS_AS(Crs::from_user_string("/etc/hostname"), InputError);
  CHECK_THROWS_WITH_AS(formats::working_crs("EPSG:4326", "grid.crs"), doctest::Contains("not projected"), InputError);
  // NAD83 / Texas North Central (ftUS): projected but in US survey feet.
  CHECK_THROWS_WITH_AS(formats::working_crs("EPSG:2276", "grid.crs"), doctest::Contains("metre units"), InputError);
}

TEST_CASE("a point outside the projection's domain names the field") {
  const formats::Transformer t(Crs::from_user_string("EPSG:4326"), formats::working_crs("EPSG:32614"));
  CHECK_THROWS_WITH_AS(t({10.0, 95.0}, "wells.csv line 3"), doctest::Contains("wells.csv line 3"), InputError);
}

TEST_CASE("meridian convergence agrees with proj -V") {
  // Reference: echo "-97.5 36" | proj -V +proj=utm +zone=14 +datum=WGS84   (PROJ 9.1.1)
  //   -> Convergence : 0d52'54.521" [ 0.88181148 ]
  // PROJ reports grid north's angle clockwise from true north; this function returns true
  // north's grid azimuth, so the sign is opposite (east of the central meridian true north
  // leans west of grid north in the northern hemisphere).
  const Crs utm = formats::working_crs("EPSG:32614");
  const double gamma = formats::grid_convergence_rad(utm, {635196.249318616, 3984988.80398431});
  CHECK(std::abs(gamma - -0.88181148 * std::numbers::pi / 180.0) < 1e-7);  // rad
  CHECK_THROWS_AS(formats::grid_convergence_rad(Crs::from_user_string("EPSG:4326"), {0, 0}), InputError);
}
