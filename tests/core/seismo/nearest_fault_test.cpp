#include "core/seismo/nearest_fault.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("nearest fault trace and distance (planar geometry)") {
  Catalog c;
  c.kind = CoordinateKind::projected;
  c.crs = "EPSG:32614";
  c.events.push_back({"a", 0.0, 500.0, 300.0, 1000.0, 1.0, "ML", ""});   // 300 m above trace 0 (y = 0)
  c.events.push_back({"b", 0.0, 5000.0, 1000.0, 1000.0, 1.0, "ML", ""}); // nearest to trace 1's interior
  const std::vector<FaultTrace> traces = {{{0.0, 0.0}, {1000.0, 0.0}}, {{2000.0, 2000.0}, {4000.0, 4000.0}}};
  const auto n = nearest_faults(c, traces);
  REQUIRE(n.size() == 2);
  CHECK(n[0].segment == 0);
  CHECK(n[0].distance == doctest::Approx(300.0).epsilon(1e-12));
  // b to trace 1: the foot of the perpendicular is (3000, 3000), distance 2000·sqrt(2) =
  // 2828.4271 m; to trace 0: the end vertex (1000, 0), sqrt(4000² + 1000²) = 4123.1 m (arithmetic).
  CHECK(n[1].segment == 1);
  CHECK(n[1].distance == doctest::Approx(2828.4271247461903).epsilon(1e-12));
  Catalog geo;
  CHECK_THROWS_AS(nearest_faults(geo, traces), InputError);
  CHECK_THROWS_AS(nearest_faults(c, {}), InputError);
  CHECK_THROWS_AS(nearest_faults(c, {{{0.0, 0.0}}}), InputError);
}
