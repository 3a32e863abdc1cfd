#include "core/screen/deterministic_screen.hpp"

#include <doctest/doctest.h>

#include <boost/math/special_functions/expint.hpp>
#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::screen;

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kYear = 365.25 * 86400.0;

// E1(u) = E_1 from Boost.Math (general-purpose reference library).
double e1(double u) { return boost::math::expint(1, u); }

ScreenInputs base_inputs() {
  ScreenInputs in;
  in.stress = {70e6, 90e6, 48e6, 75.0 * kPi / 180, 28e6};  // strike-slip, within the frictional limit (invented)
  in.friction = {0.6, 0.0};
  in.formation = {0.4, 2.0e5};  // D = 0.4 m²/s, μ/(4πkh) = 2e5 Pa per m³/s
  return in;
}

ScreenWell well_at(double x, double y, std::vector<double> starts, std::vector<double> rates) {
  return {"W", x, y, 0.1, hydro::RateHistory(std::move(starts), std::move(rates))};
}

}  // namespace

TEST_CASE("stress on a vertical fault matches the two-dimensional Mohr formulas") {
  // Jaeger, Cook & Zimmerman (2007) ch. 2: with the normal at angle a from SHmax (horizontal),
  // σn = SH cos²a + Sh sin²a, τ = (SH − Sh)|sin a cos a|.
  ScreenInputs in = base_inputs();
  const double strike = 40.0 * kPi / 180;
  in.segments.push_back({"F:0", strike, kPi / 2, {{0, 0}}, std::nullopt});
  in.output_times = {kYear};
  const ScreenResult r = deterministic_screen(in);
  const double a = strike + kPi / 2 - in.stress.shmax_azimuth;
  const double sn = 90e6 * std::cos(a) * std::cos(a) + 48e6 * std::sin(a) * std::sin(a);
  const double tau = (90e6 - 48e6) * std::abs(std::sin(a) * std::cos(a));
  const auto& s = r.segments[0];
  CHECK(std::abs(s.normal_stress - sn) < 1e-6);  // Pa
  CHECK(std::abs(s.shear_stress - tau) < 1e-6);
  CHECK(std::abs(s.effective_normal_stress - (sn - 28e6)) < 1e-6);
  CHECK(std::abs(s.slip_tendency - tau / (sn - 28e6)) < 1e-14);
  // Hubbert & Rubey (1959): Δp_crit = (σn − p0) − τ/μ.
  CHECK(std::abs(s.dp_crit - ((sn - 28e6) - tau / 0.6)) < 1e-6);
  CHECK(s.status == geomech::CriticalStatus::below_failure);
  CHECK(s.dp[0] == 0.0);  // no wells
}

TEST_CASE("one well at constant rate: Δp is the Theis solution, the first crossing is on the grid") {
  ScreenInputs in = base_inputs();
  const double q = 0.02;  // m³/s
  in.wells.push_back(well_at(0, 0, {0.0}, {q}));
  // A segment with three check points at 1, 2 and 3 km: the nearest one holds the maximum.
  in.segments.push_back({"F:0", 50.0 * kPi / 180, 85.0 * kPi / 180, {{3000, 0}, {1000, 0}, {2000, 0}}, std::nullopt});
  in.output_times = {0.5 * kYear, 2 * kYear};
  for (int m = 1; m <= 24; ++m) in.tracking_times.push_back(m * kYear / 12);
  const ScreenResult r = deterministic_screen(in);
  const auto& s = r.segments[0];
  for (std::size_t k = 0; k < 2; ++k) {
    const double t = in.output_times[k];
    const double expected = q * 2.0e5 * e1(1000.0 * 1000.0 / (4 * 0.4 * t));  // Theis (1935)
    CHECK(std::abs(s.dp[k] - expected) < 1e-9 * expected);
    CHECK(s.dp_point[k] == 1);
    CHECK(s.well_share[k] == 1.0);
  }
  // This fault's Δp_crit is large; move it down to a value reached between the output times.
  const double target = q * 2.0e5 * e1(1.0e6 / (4 * 0.4 * 1.05 * kYear));  // reached at t = 1.05 yr
  // Δp_crit = (σn − p0) − τ/μ falls one for one as p0 rises (σn and τ do not depend on p0).
  in.stress.pore_pressure += s.dp_crit - target;
  const ScreenResult r2 = deterministic_screen(in);
  REQUIRE(r2.segments[0].first_crossing.has_value());
  CHECK(std::abs(r2.segments[0].dp_crit - target) < 1e-6);
  CHECK(r2.segments[0].dp[0] < target);
  CHECK(r2.segments[0].dp[1] > target);
  // The first grid time at or after 1.05 yr is month 13 (1.0833 yr).
  CHECK(*r2.segments[0].first_crossing == doctest::Approx(13 * kYear / 12).epsilon(1e-15));
}

TEST_CASE("a crossing after shut-in between two output times is caught on the tracking grid") {
  ScreenInputs in = base_inputs();
  const double q = 0.05;
  in.wells.push_back(well_at(0, 0, {0.0, 0.25 * kYear}, {q, 0.0}));  // three months, then shut in
  in.segments.push_back({"F:0", 50.0 * kPi / 180, 85.0 * kPi / 180, {{4000, 0}}, std::nullopt});
  in.output_times = {0.1 * kYear, 5 * kYear};
  for (int m = 1; m <= 60; ++m) in.tracking_times.push_back(m * kYear / 12);
  // Theis recovery: Δp(t) = qC[E1(r²/4Dt) − E1(r²/4D(t − t_s))] for t > t_s (Theis 1935).
  const auto dp = [&](double t) {
    const double u = 16e6 / (4 * 0.4);
    return q * 2e5 * (e1(u / t) - (t > 0.25 * kYear ? e1(u / (t - 0.25 * kYear)) : 0.0));
  };
  ScreenResult r = deterministic_screen(in);
  const SegmentScreen s = r.segments[0];  // a copy: r is reassigned below
  CHECK(s.peak_time > 0.25 * kYear);  // the peak at 4 km comes after the shut-in
  CHECK(std::abs(s.peak_dp - dp(s.peak_time)) < 1e-9 * s.peak_dp);
  CHECK(s.dp[0] < 0.5 * s.peak_dp);
  CHECK(s.dp[1] < 0.5 * s.peak_dp);
  // Put Δp_crit just below the peak: neither output time reaches it, the grid does.
  in.stress.pore_pressure += s.dp_crit - 0.99 * s.peak_dp;
  r = deterministic_screen(in);
  REQUIRE(r.segments[0].first_crossing.has_value());
  CHECK(r.segments[0].dp[0] < r.segments[0].dp_crit);
  CHECK(r.segments[0].dp[1] < r.segments[0].dp_crit);
  CHECK(*r.segments[0].first_crossing <= s.peak_time);
}

TEST_CASE("well shares: two equal wells at equal distance share the pressure equally") {
  ScreenInputs in = base_inputs();
  in.wells.push_back(well_at(-2000, 0, {0.0}, {0.01}));
  in.wells.push_back(well_at(2000, 0, {0.0}, {0.01}));
  in.wells.push_back(well_at(0, 50000, {0.0}, {0.03}));  // far: a small share
  in.wells[1].id = "W2";
  in.segments.push_back({"F:0", 0.0, kPi / 2, {{0, 0}}, std::nullopt});
  in.output_times = {3 * kYear};
  const auto r = deterministic_screen(in);
  const auto& sh = r.segments[0].well_share;
  CHECK(std::abs(sh[0] - sh[1]) < 1e-12);
  CHECK(std::abs(sh[0] + sh[1] + sh[2] - 1.0) < 1e-12);
  CHECK(sh[2] < 0.1);
  CHECK(sh[2] > 0.0);
}

TEST_CASE("an already critical fault is reported, with no crossing time") {
  ScreenInputs in = base_inputs();
  in.friction.mu = 0.3;  // weak fault: optimally oriented planes fail at p0
  in.wells.push_back(well_at(0, 0, {0.0}, {0.01}));
  in.segments.push_back({"F:0", 45.0 * kPi / 180, kPi / 2, {{500, 0}}, std::nullopt});
  in.output_times = {kYear};
  const auto r = deterministic_screen(in);
  CHECK(r.segments[0].status == geomech::CriticalStatus::already_critical);
  CHECK(r.segments[0].dp_crit <= 0.0);
  CHECK_FALSE(r.segments[0].first_crossing.has_value());
}

TEST_CASE("bad inputs are refused") {
  ScreenInputs in = base_inputs();
  in.segments.push_back({"F:0", 0.0, kPi / 2, {}, std::nullopt});
  in.output_times = {kYear};
  CHECK_THROWS_AS(deterministic_screen(in), InputError);
  in.segments[0].check_points = {{0, 0}};
  in.output_times = {2 * kYear, kYear};
  CHECK_THROWS_AS(deterministic_screen(in), InputError);
}
