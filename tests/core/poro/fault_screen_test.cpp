#include "core/poro/fault_screen.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "support/poro_medium_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::poro;

namespace {

constexpr double kDeg = std::numbers::pi / 180.0;

// A strike-slip state at 3 km (gradients 23, 30 and 17 kPa/m, hydrostatic 10 kPa/m; invented
// for the test, of the order of mid-continent gradients, common practice).
geomech::AndersonianStress state_at(double z) {
  return {23e3 * z, 30e3 * z, 17e3 * z, 60.0 * kDeg, 10e3 * z};
}

RudnickiConstants medium() { return rudnicki_constants(test::sandstone_medium()); }

}  // namespace

TEST_CASE("fault screen: Δτ and Δσn are the derivatives of the resolved τ and σn (finite differences)") {
  const Eigen::Matrix3d S = geomech::stress_tensor_ned(state_at(3000.0));
  const double p0 = state_at(3000.0).pore_pressure;
  const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(20.0 * kDeg, 70.0 * kDeg);
  const geomech::ResolvedStress r0 = geomech::resolve(S, p0, plane);
  Eigen::Matrix3d dS;
  dS << 0.3, -0.2, 0.1, -0.2, -0.5, 0.4, 0.1, 0.4, 0.7;  // an arbitrary symmetric change, Pa
  const CoulombChange c = coulomb_change(dS, 0.0, plane.normal(), r0.slip_direction, 0.6);
  const double eps = 1e3;  // ΔS × 1e3 Pa ≪ |S| ≈ 1e8 Pa: second-order terms ~1e-5 relative
  const geomech::ResolvedStress r1 = geomech::resolve(S + eps * dS, p0, plane);
  CHECK(std::fabs((r1.shear_stress - r0.shear_stress) / eps - c.dtau) <= 1e-4 * dS.norm());
  CHECK(std::fabs((r1.normal_stress - r0.normal_stress) / eps - c.dsigma_n) <= 1e-6 * dS.norm());
  CHECK(std::fabs(c.dtau) >= 0.05);  // the change has a shear part here: the check can fail
  // a pressure change alone: μΔp exactly (Hubbert & Rubey 1959)
  const CoulombChange p = coulomb_change(Eigen::Matrix3d::Zero(), 2e5, plane.normal(), r0.slip_direction, 0.6);
  CHECK(p.dcff == 0.6 * 2e5);
}

TEST_CASE("fault screen: the horizontal stress path on dip-slip planes equals geomech's path ΔCFF") {
  // ΔS = κΔp on the horizontal axes: geomech::coulomb_path_change is linear in Δp there and
  // equals Δτ − μ(Δσn − Δp) (docs/geomechanics.md), computed by its own route
  const geomech::AndersonianStress st{70e6, 52e6, 40e6, 0.0, 30e6};  // normal regime, SHmax north
  const Eigen::Matrix3d S = geomech::stress_tensor_ned(st);
  const double kappa = 0.6, dp = 3e6, mu = 0.6;
  for (double dip : {45.0, 60.0, 75.0}) {
    CAPTURE(dip);
    const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(0.0, dip * kDeg);  // strikes ∥ SHmax
    const geomech::ResolvedStress r = geomech::resolve(S, st.pore_pressure, plane);
    Eigen::Matrix3d dS = Eigen::Matrix3d::Zero();
    dS(0, 0) = dS(1, 1) = kappa * dp;
    const CoulombChange c = coulomb_change(dS, dp, plane.normal(), r.slip_direction, mu);
    const double want = geomech::coulomb_path_change(S, plane.normal(), mu, kappa).at(dp);
    CHECK(std::fabs(c.dcff - want) <= 1e-9 * std::fabs(want));
  }
}

TEST_CASE("fault screen: check points in depth lie on the fault plane") {
  const std::vector<Eigen::Vector2d> trace{{1000.0, 2000.0}, {1500.0, 2300.0}};
  const double strike = 31.0 * kDeg, dip = 55.0 * kDeg, zref = 2000.0;
  const auto pts = depth_check_points(trace, strike, dip, zref, 2500.0, 4500.0, 3);
  REQUIRE(pts.size() == 6);
  const Eigen::Vector3d n = geomech::FaultPlane::from_strike_dip(strike, dip).normal();  // NED
  for (std::size_t i = 0; i < pts.size(); ++i) {
    const Eigen::Vector3d on_trace(trace[i / 3].x(), trace[i / 3].y(), zref);
    CHECK(std::fabs((pts[i] - on_trace).dot(n)) <= 1e-9);
  }
  CHECK(pts[0].z() == 2500.0);
  CHECK(pts[1].z() == 3500.0);
  CHECK(pts[2].z() == 4500.0);
  // deeper points move away from the trace, down dip: (4500 − 2000)/tan 55°
  CHECK(std::fabs((pts[2] - Eigen::Vector3d(1000.0, 2000.0, 4500.0)).head<2>().norm() - 2500.0 / std::tan(dip)) <=
        1e-9);
  CHECK(depth_check_points(trace, strike, dip, zref, 3000.0, 3000.0, 1)[0].z() == 3000.0);
  CHECK_THROWS_AS(depth_check_points(trace, strike, 0.0, zref, 2500.0, 4500.0, 3), InputError);
  CHECK_THROWS_AS(depth_check_points(trace, strike, dip, zref, 4500.0, 2500.0, 3), InputError);
}

TEST_CASE("fault screen: a basement fault is loaded by stress before the pressure arrives; crossings") {
  const RudnickiConstants k = medium();
  InjectionSource w;
  w.points = open_interval_points(0.0, 0.0, 2000.0, 2100.0, 4);  // (north, east) at the origin
  w.changes = {{0.0, 0.02}};                                      // 0.02 m³/s ≈ 10 900 bbl/d
  w.radius = 0.1;
  DepthSegment seg;
  seg.segment_id = "basement";
  seg.strike = 60.0 * kDeg + 30.0 * kDeg;  // 30° from SHmax, vertical: well oriented for strike-slip
  seg.dip = 90.0 * kDeg;
  // 5 km east, 1 km below the interval's bottom
  for (double z : {3100.0, 3600.0}) seg.points.push_back({Eigen::Vector3d(0.0, 5000.0, z), state_at(z)});
  DepthScreenInputs in;
  in.medium = k;
  in.friction = {0.6, 0.0};
  in.wells = {w};
  in.segments = {seg};
  const double day = 86400.0;
  in.output_times = {10 * day, 1000 * day};
  for (int m = 1; m <= 40; ++m) in.tracking_times.push_back(m * 30 * day);
  const DepthScreenResult r = depth_screen(in);
  REQUIRE(r.segments.size() == 1);
  const DepthSegmentScreen& s = r.segments[0];
  REQUIRE(s.change.size() == 2);
  // at 10 days √(ct) ≈ 380 m ≪ 5 km: ξ ≈ 13, Δp ~ erfc(6.5) ≈ 4e-20 of its steady value, while
  // the stress change (a centre of dilatation, ∝ t/r³) is not
  CHECK(std::fabs(s.change[0].dp) <= 1e-15);
  CHECK(std::fabs(s.change[0].dcff) >= 1e-3);
  // the reported change is the point's own sum, recomputed here
  const std::size_t i = s.point[1];
  const PointResponse direct = superposed_response(k, in.wells, seg.points[i].position, 1000 * day);
  const geomech::ResolvedStress res = geomech::resolve(geomech::stress_tensor_ned(seg.points[i].stress),
                                                       seg.points[i].stress.pore_pressure,
                                                       geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip));
  const CoulombChange want = coulomb_change(direct.dstress, direct.dp,
                                            geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip).normal(),
                                            res.slip_direction, 0.6);
  CHECK(std::fabs(s.change[1].dcff - want.dcff) <= 1e-12 * std::fabs(want.dcff));
  CHECK(s.change[1].dp > 0.0);
  CHECK(!s.already_critical);
  CHECK(!s.first_crossing);  // Δp_crit is tens of MPa here; ΔCFF a fraction of one
  CHECK(s.dp_crit[0] > 1e6);

  // Make the fault nearly critical: the friction μ = τ/(σn − p0 − X) at the deeper point gives
  // it Δp_crit = X there, with X = 40 % of ΔCFF/0.6 at 1000 days. The first crossing must be the
  // first tracked time at which some point has ΔCFF ≥ μΔp_crit, found here by brute force.
  const std::size_t deep = 1;
  const geomech::ResolvedStress rd = geomech::resolve(geomech::stress_tensor_ned(seg.points[deep].stress),
                                                      seg.points[deep].stress.pore_pressure,
                                                      geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip));
  const double x = 0.4 * s.change[1].dcff / 0.6;
  DepthScreenInputs near = in;
  const double mu = rd.shear_stress / (rd.effective_normal_stress - x);
  near.segments[0].friction = mu;
  const DepthScreenResult near_result = depth_screen(near);
  const DepthSegmentScreen& c = near_result.segments[0];
  CHECK(std::fabs(c.dp_crit[deep] - x) <= 1e-6 * x);
  std::optional<double> brute;
  for (double t : r.tracked_times) {
    for (std::size_t p = 0; p < seg.points.size() && !brute; ++p) {
      const PointResponse pr = superposed_response(k, in.wells, seg.points[p].position, t);
      const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip);
      const geomech::ResolvedStress rp = geomech::resolve(geomech::stress_tensor_ned(seg.points[p].stress),
                                                          seg.points[p].stress.pore_pressure, plane);
      const double dcff = coulomb_change(pr.dstress, pr.dp, plane.normal(), rp.slip_direction, mu).dcff;
      if (dcff >= mu * c.dp_crit[p]) brute = t;
    }
    if (brute) break;
  }
  REQUIRE(brute.has_value());
  REQUIRE(c.first_crossing.has_value());
  CHECK(*c.first_crossing == *brute);
  CHECK(*c.first_crossing > r.tracked_times.front());  // not vacuous: later than the first time
  CHECK(*c.first_crossing < 1000 * day);
  // the change kept at the crossing: that of the crossing point at the crossing time, recomputed
  // here (the same sums, so to rounding), and at or beyond μΔp_crit there
  REQUIRE(c.crossing_point.has_value());
  REQUIRE(c.crossing_change.has_value());
  {
    const std::size_t p = *c.crossing_point;
    const PointResponse pr = superposed_response(k, in.wells, seg.points[p].position, *c.first_crossing);
    const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip);
    const geomech::ResolvedStress rp = geomech::resolve(geomech::stress_tensor_ned(seg.points[p].stress),
                                                        seg.points[p].stress.pore_pressure, plane);
    const double dcff = coulomb_change(pr.dstress, pr.dp, plane.normal(), rp.slip_direction, mu).dcff;
    CHECK(std::fabs(c.crossing_change->dcff - dcff) <= 1e-12 * std::fabs(dcff));
    CHECK(c.crossing_change->dcff >= mu * c.dp_crit[p]);
  }
  CHECK(c.peak_dcff > 0.0);
  CHECK(c.peak_time == r.tracked_times.back());  // still rising at the last time
}
