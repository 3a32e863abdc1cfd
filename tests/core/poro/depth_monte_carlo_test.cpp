#include "core/poro/depth_monte_carlo.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "support/poro_medium_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::poro;

namespace {

constexpr double kDeg = std::numbers::pi / 180.0, kDay = 86400.0;

PoroelasticMedium rock() { return test::sandstone_medium(); }

// One well, one vertical strike-slip segment 5 km east at 3.1 and 3.6 km (the fault-screen
// test's case; invented numbers), output times of 100 to 1000 days.
DepthScreenInputs base_case() {
  DepthScreenInputs in;
  in.medium = rudnicki_constants(rock());
  in.friction = {0.6, 0.0};
  InjectionSource w;
  w.points = open_interval_points(0.0, 0.0, 2000.0, 2100.0, 4);
  w.changes = {{0.0, 0.02}};
  in.wells = {w};
  DepthSegment seg;
  seg.segment_id = "s";
  seg.strike = 90.0 * kDeg;
  seg.dip = 90.0 * kDeg;
  for (double z : {3100.0, 3600.0})
    seg.points.push_back({Eigen::Vector3d(0.0, 5000.0, z), {23e3 * z, 30e3 * z, 17e3 * z, 60.0 * kDeg, 10e3 * z}});
  in.segments = {seg};
  in.output_times = {100 * kDay, 300 * kDay, 1000 * kDay};
  for (int m = 1; m <= 34; ++m) in.tracking_times.push_back(m * 30 * kDay);
  return in;
}

// The friction at which the segment's deeper point first fails at about `days` (bisection on the
// deterministic screen: failure comes earlier as the friction falls).
double friction_failing_near(const DepthScreenInputs& in, double days) {
  double lo = 0.3, hi = 0.9;  // failing early at lo, never at hi (tested below)
  for (int it = 0; it < 40; ++it) {
    DepthScreenInputs c = in;
    const double mid = 0.5 * (lo + hi);
    c.segments[0].friction = mid;
    const DepthSegmentScreen g = depth_screen(c).segments[0];
    const bool early = g.already_critical || (g.first_crossing && *g.first_crossing <= days * kDay);
    (early ? lo : hi) = mid;
  }
  return hi;
}

}  // namespace

TEST_CASE("depth Monte Carlo: identical draws give the deterministic screen's answer, 0 or N") {
  DepthScreenInputs in = base_case();
  const double mu = friction_failing_near(in, 300.0);
  in.segments[0].friction = mu;
  const DepthSegmentScreen det = depth_screen(in).segments[0];
  REQUIRE(det.first_crossing.has_value());  // the case crosses (not vacuous)
  const std::vector<DepthRealization> draws(7, DepthRealization{rock(), std::nullopt});
  const DepthSlipCounts c = depth_slip_counts(in, draws);
  REQUIRE(c.slipped.size() == 1);
  for (std::size_t k = 0; k < in.output_times.size(); ++k) {
    CAPTURE(k);
    CHECK(c.slipped[0][k] == (*det.first_crossing <= in.output_times[k] ? 7u : 0u));
  }
  CHECK(c.slipped[0].front() == 0u);  // at 100 days not yet
  CHECK(c.slipped[0].back() == 7u);
}

TEST_CASE("depth Monte Carlo: uncertain friction and permeability; counts rise with time and with lower friction") {
  DepthScreenInputs in = base_case();
  const double mu = friction_failing_near(in, 300.0);
  std::vector<DepthRealization> draws;
  for (int i = 0; i < 12; ++i) {
    PoroelasticMedium m = rock();
    m.permeability *= std::pow(2.0, (i % 4 - 1.5) / 1.5);
    draws.push_back({m, mu * (0.97 + 0.01 * (i % 6))});
  }
  const DepthSlipCounts c = depth_slip_counts(in, draws);
  for (std::size_t k = 1; k < in.output_times.size(); ++k) CHECK(c.slipped[0][k] >= c.slipped[0][k - 1]);
  CHECK(c.slipped[0].back() > 0u);
  CHECK(c.slipped[0].back() < 12u);  // some draws hold: the answer is a probability, not 0 or 1
  // each count equals the number of draws whose own deterministic screen fails by then
  for (std::size_t k = 0; k < in.output_times.size(); ++k) {
    std::uint32_t n = 0;
    for (const DepthRealization& d : draws) {
      DepthScreenInputs one = in;
      one.medium = rudnicki_constants(d.medium);
      one.segments[0].friction = d.friction;
      const DepthSegmentScreen g = depth_screen(one).segments[0];
      n += g.already_critical || (g.first_crossing && *g.first_crossing <= in.output_times[k]);
    }
    CHECK(c.slipped[0][k] == n);
  }
}

TEST_CASE("depth Monte Carlo: an invalid draw is reported") {
  const DepthScreenInputs in = base_case();
  std::vector<DepthRealization> draws(3, DepthRealization{rock(), std::nullopt});
  draws[1].medium.poisson_undrained = 0.1;
  CHECK_THROWS_AS(depth_slip_counts(in, draws), InputError);
}
