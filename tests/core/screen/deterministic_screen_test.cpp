#include "core/screen/deterministic_screen.hpp"

#include <doctest/doctest.h>

#include <boost/math/special_functions/expint.hpp>
#include <cmath>

#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/hydro/similarity_table.hpp"

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
  // Off the output times the peak comes from the similarity table: its stated accuracy is 1e-6 of
  // max_x |H(x, t)| (similarity_table.hpp). After the shut-in H(x, t) = q[E1(x/t) − E1(x/(t − t_s))]
  // decreases in x, so max_x H ≤ q ln(t/(t − t_s)), its limit at x → 0.
  const double table_scale = q * 2e5 * std::log(s.peak_time / (s.peak_time - 0.25 * kYear));
  CHECK(std::abs(s.peak_dp - dp(s.peak_time)) < 1e-6 * table_scale);
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

TEST_CASE("tracking from similarity tables agrees with the exact pressure field within the stated bound") {
  // Fictional case: three wells with monthly-varying rates (whole days, so the tables use the
  // lattice build), a shut-in and an end of injection; a no-flow boundary and a perpendicular
  // constant-pressure boundary (image wells of both signs); five segments near and far.
  ScreenInputs in = base_inputs();
  const double day = 86400.0, t0 = 14610 * day;  // 2010-01-01
  const double wx[3] = {0, 3000, -2000}, wy[3] = {0, 2000, 1500};
  for (int w = 0; w < 3; ++w) {
    std::vector<double> starts, rates;
    for (int m = 0; m < 60; ++m) {
      starts.push_back(t0 + m * 30 * day);
      double q = 0.01 + 0.008 * std::sin(0.5 * m + w);
      if (w == 1 && m >= 20 && m < 27) q = 0.0;  // a shut-in
      if (w == 2 && m >= 40) q = 0.0;            // injection ends
      rates.push_back(q);
    }
    in.wells.push_back(well_at(wx[w], wy[w], starts, rates));
    in.wells.back().id = std::string("W").append(std::to_string(w));
  }
  in.boundaries = {{hydro::BoundaryKind::no_flow, 10000, 0, 0, 1},
                   {hydro::BoundaryKind::constant_pressure, 0, -8000, 1, 0}};
  const double sx[5] = {1200, 5000, -6000, 8000, 0}, sy[5] = {-900, 5000, -3000, 20000, -7000};
  for (int i = 0; i < 5; ++i)
    in.segments.push_back({std::string("F:").append(std::to_string(i)), 50.0 * kPi / 180, 85.0 * kPi / 180,
                           {{sx[i] - 600, sy[i]}, {sx[i], sy[i] + 100}, {sx[i] + 600, sy[i]}}, std::nullopt});
  for (int m = 1; m <= 84; ++m) in.tracking_times.push_back(t0 + m * 30 * day + 3 * day);
  for (int y = 1; y <= 7; ++y) in.output_times.push_back(t0 + y * 365 * day);
  const ScreenResult r = deterministic_screen(in);
  const auto& tt = r.tracked_times;

  // Reference: the exact PressureField sum at every check point and tracked time.
  std::vector<hydro::WellSource> src;
  for (const auto& w : in.wells) src.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(src, in.boundaries);
  // The stated bound per tracked time: 1e-6 · μ/(4πkh) · Σ_sources max_x |H_w(x, t)|, with the
  // maximum over x ≥ r_w²/(4D) found by direct summation (no table).
  std::vector<double> bound(tt.size(), 0.0);
  for (std::size_t w = 0; w < 3; ++w) {
    hydro::RateSteps st;
    for (const auto& c : in.wells[w].history.changes()) {
      st.time.push_back(c.time);
      st.delta_rate.push_back(c.delta);
    }
    for (std::size_t g = 0; g < tt.size(); ++g) {
      double m = 0.0;
      for (double x = 0.01 / (4 * 0.4); x < 1e12; x *= 1.02)
        m = std::max(m, std::abs(hydro::SimilarityTable::direct(st, x, tt[g])));
      bound[g] += 1e-6 * 2e5 * static_cast<double>(field.sources(w).size()) * m;
    }
  }
  double worst_ratio = 0.0;
  std::size_t crossings_checked = 0;
  for (std::size_t i = 0; i < in.segments.size(); ++i) {
    std::vector<hydro::FieldPoint> pts;
    for (const auto& p : in.segments[i].check_points) pts.push_back({p.x, p.y});
    const auto prepared = field.prepare(pts);
    const auto exact = field.evaluate(prepared, tt, in.formation);
    const auto at_out = field.evaluate(prepared, in.output_times, in.formation, {}, true);
    const auto& s = r.segments[i];
    // At the output times: exactly the PressureField values (same sums, bit for bit).
    for (std::size_t k = 0; k < in.output_times.size(); ++k) {
      std::size_t best = 0;
      for (std::size_t p = 1; p < pts.size(); ++p)
        if (at_out.at(p, k) > at_out.at(best, k)) best = p;
      CHECK(s.dp[k] == at_out.at(best, k));
      CHECK(s.dp_point[k] == best);
      for (std::size_t w = 0; w < 3; ++w) CHECK(s.well_share[k * 3 + w] == at_out.contribution(best, k, w) / s.dp[k]);
    }
    // Peak over the tracked times: within the bound of the exact peak.
    std::vector<double> m(tt.size(), 0.0);
    double peak = 0.0, peak_bound = 0.0;
    for (std::size_t g = 0; g < tt.size(); ++g) {
      for (std::size_t p = 0; p < pts.size(); ++p) m[g] = std::max(m[g], exact.at(p, g));
      if (m[g] > peak) {
        peak = m[g];
        peak_bound = bound[g];
      }
    }
    REQUIRE(peak > 0.0);
    const double err = std::abs(s.peak_dp - peak);
    CHECK(err <= std::max(peak_bound, bound[static_cast<std::size_t>(
                                          std::find(tt.begin(), tt.end(), s.peak_time) - tt.begin())]));
    worst_ratio = std::max(worst_ratio, err / peak_bound);
    // First crossings at several Δp_crit levels: the exact first grid time reaching the level,
    // wherever no tracked Δp lies within the bound of it (otherwise either neighbour is right).
    for (double level : {0.3, 0.6, 0.9, 0.99}) {
      const double target = level * peak;
      bool clear = true;
      std::optional<double> first;
      for (std::size_t g = 0; g < tt.size(); ++g) {
        clear = clear && std::abs(m[g] - target) > bound[g];
        if (!first && m[g] >= target) first = tt[g];
      }
      if (!clear) continue;
      ScreenInputs shifted = in;
      shifted.segments = {in.segments[i]};
      shifted.stress.pore_pressure += s.dp_crit - target;  // Δp_crit falls one for one with p0
      const ScreenResult rs = deterministic_screen(shifted);
      REQUIRE(first.has_value());
      REQUIRE(rs.segments[0].first_crossing.has_value());
      CHECK(*rs.segments[0].first_crossing == *first);
      ++crossings_checked;
    }
  }
  MESSAGE("table peak error / stated bound, worst segment: " << worst_ratio << "; crossings checked: "
                                                              << crossings_checked);
  CHECK(crossings_checked >= 12);
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

TEST_CASE("well shares at the first crossing: a well starting later is not part of an earlier crossing") {
  ScreenInputs in = base_inputs();
  const double q = 0.02;
  in.wells.push_back(well_at(0, 0, {0.0}, {q}));                     // 1 km from the check point
  in.wells.push_back(well_at(1500, 0, {3 * kYear}, {0.2}));         // 500 m, from year 3, ten times the rate
  in.wells.push_back(well_at(1000, 1500, {0.0}, {q}));              // 1.5 km, from the start
  in.wells[1].id = "P1";
  in.wells[2].id = "W3";
  in.segments.push_back({"F:0", 50.0 * kPi / 180, 85.0 * kPi / 180, {{1000, 0}}, std::nullopt});
  in.output_times = {0.5 * kYear, 5 * kYear};
  for (int m = 1; m <= 60; ++m) in.tracking_times.push_back(m * kYear / 12);
  const auto theis = [](double r, double t) { return 0.02 * 2.0e5 * e1(r * r / (4 * 0.4 * t)); };  // Theis (1935)
  // Δp_crit moved to the value reached at 1.05 yr by W and W3 (P1 not yet injecting).
  const ScreenResult r0 = deterministic_screen(in);
  const double target = theis(1000, 1.05 * kYear) + theis(1500, 1.05 * kYear);
  in.stress.pore_pressure += r0.segments[0].dp_crit - target;
  const ScreenResult r = deterministic_screen(in);
  const auto& s = r.segments[0];
  REQUIRE(s.first_crossing.has_value());
  const double tc = 13 * kYear / 12;  // the first monthly grid time after 1.05 yr
  CHECK(*s.first_crossing == doctest::Approx(tc).epsilon(1e-15));
  REQUIRE(s.crossing_share.size() == 3);
  CHECK(s.crossing_share[1] == 0.0);  // P1 starts at year 3
  const double w1 = theis(1000, tc), w3 = theis(1500, tc);
  CHECK(std::abs(s.crossing_share[0] - w1 / (w1 + w3)) < 1e-9);
  CHECK(std::abs(s.crossing_share[2] - w3 / (w1 + w3)) < 1e-9);
  // At the last output time P1 holds the largest share: the rule at the peak or the last time
  // would name it for a crossing that happened before it started.
  CHECK(s.well_share[1 * 3 + 1] > s.well_share[1 * 3 + 0]);
  CHECK(s.well_share[1 * 3 + 1] > s.well_share[1 * 3 + 2]);
  CHECK(r0.segments[0].crossing_share.empty() == !r0.segments[0].first_crossing.has_value());
  // The leading wells: W at the crossing (nearer than W3, P1 not yet injecting), P1 at the last
  // output time; the same with only the leading well kept (how a run without its tables screens).
  CHECK(s.crossing_well == 0);
  CHECK(s.crossing_well_share == s.crossing_share[0]);
  CHECK(s.leading_well[1] == 1);
  CHECK(s.leading_share[1] == s.well_share[1 * 3 + 1]);
  in.all_well_shares = false;
  const ScreenResult lean = deterministic_screen(in);
  const auto& l = lean.segments[0];
  CHECK(l.well_share.empty());
  CHECK(l.crossing_share.empty());
  CHECK(l.dp == s.dp);
  CHECK(l.first_crossing == s.first_crossing);
  CHECK(l.leading_well == s.leading_well);
  CHECK(l.leading_share == s.leading_share);
  CHECK(l.crossing_well == s.crossing_well);
  CHECK(l.crossing_well_share == s.crossing_well_share);
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
  CHECK(r.segments[0].crossing_share.empty());
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

TEST_CASE("extreme rates: exact where representable, a NumericalError (not a crash) beyond") {
  // 1 bbl = 0.158987294928 m³ (common practice).
  const double bbl_per_day = 0.158987294928 / 86400.0;
  ScreenInputs in = base_inputs();
  in.segments.push_back({"F:0", 50.0 * kPi / 180, 85.0 * kPi / 180, {{1000, 0}}, std::nullopt});
  in.output_times = {kYear};
  for (int m = 1; m <= 12; ++m) in.tracking_times.push_back(m * kYear / 12);
  // 1e25 bbl/d: Δp is absurd but finite, and still the Theis solution (linear in q).
  const double q = 1e25 * bbl_per_day;
  in.wells.push_back(well_at(0, 0, {0.0}, {q}));
  const ScreenResult r = deterministic_screen(in);
  const double expected = q * 2.0e5 * e1(1.0e6 / (4 * 0.4 * kYear));  // Theis (1935), Boost.Math E1
  CHECK(std::abs(r.segments[0].dp[0] - expected) < 1e-9 * expected);
  // 1e70 bbl/d: the similarity tables (single precision) cannot hold it; the error is typed and
  // leaves the OpenMP region that builds the tables on the calling thread.
  in.wells[0] = well_at(0, 0, {0.0}, {1e70 * bbl_per_day});
  CHECK_THROWS_WITH_AS(deterministic_screen(in), doctest::Contains("single-precision range"), NumericalError);
}
