#include "core/hydro/radial_solver.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/hydro/theis.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

constexpr double kPi = std::numbers::pi;
constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kDay = 86400.0;

// A fictional formation for the checks: k = 1e-13 m² (about 100 mD), h = 20 m, μ = 1 mPa·s,
// φ c_t = 0.1 × 1e-9 1/Pa, so D = k/(μ φ c_t) = 1 m²/s; q = 0.01 m³/s.
constexpr double kK = 1e-13, kH = 20.0, kMu = 1e-3, kS = 1e-10, kQ = 0.01, kRw = 0.1;

RadialModel homogeneous(OuterBoundary outer, double r_e) {
  RadialModel m;
  m.well_radius = kRw;
  m.thickness = kH;
  m.viscosity = kMu;
  m.zones = {{r_e, kK, kS}};
  m.outer = outer;
  m.history = RateHistory({0.0}, {kQ});
  return m;
}

// Theis (1935) line source, Δp = q μ/(4π k h) E1(r²/(4 D t)); E1 from Boost.Math expint(1, u).
double theis(double q, double k, double storage, double r, double t) {
  if (t <= 0.0) return 0.0;
  const double d = k / (kMu * storage);
  return q * kMu / (4.0 * kPi * k * kH) * boost::math::expint(1, r * r / (4.0 * d * t));
}

// Superposition in time of the Theis solution over piecewise-constant rates (Theis 1935;
// superposition of the linear diffusion equation, e.g. Earlougher 1977 §2.5).
double theis_history(const RateHistory& h, double k, double storage, double r, double t) {
  double sum = 0.0, prev = 0.0;
  for (std::size_t j = 0; j < h.start_times().size(); ++j) {
    if (h.start_times()[j] >= t) break;
    sum += theis(h.rates()[j] - prev, k, storage, r, t - h.start_times()[j]);
    prev = h.rates()[j];
  }
  return sum;
}

double rel(double a, double b) { return std::abs(a - b) / std::abs(b); }

// The project's Theis engine for the same formation (theis.hpp): D = k/(μ φ c_t) with φ c_t = kS.
TheisParameters project_theis(double k) {
  Formation f;
  f.permeability = k;
  f.thickness = kH;
  f.viscosity = kMu;
  f.porosity = 0.1;
  f.total_compressibility = kS / 0.1;
  return theis_parameters(f);
}

}  // namespace

TEST_CASE("homogeneous infinite-acting layer matches Theis (1935)") {
  const RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
  const std::vector<double> radii = {kRw, 1.0, 10.0, 100.0, 300.0, 1000.0, 3000.0};
  const std::vector<double> times = {3600.0, kDay, 10 * kDay, 100 * kDay, 365 * kDay};
  const RadialSolution s = solve_radial_flow(m, radii, times);
  double worst_u1 = 0.0, worst_u5 = 0.0;
  int checked = 0;
  for (std::size_t it = 0; it < times.size(); ++it)
    for (std::size_t ir = 0; ir < radii.size(); ++ir) {
      const double r = radii[ir], t = times[it];
      const double u = r * r / (4.0 * 1.0 * t);
      const double ref = theis(kQ, kK, kS, r, t);
      const double e = rel(s.at(it, ir), ref);
      // The project's Theis (theis_pressure) agrees with the Boost.Math form to rounding.
      CHECK(theis_pressure(project_theis(kK), kQ, r, kRw, t) == doctest::Approx(ref).epsilon(1e-12));
      if (u <= 1.0) worst_u1 = std::max(worst_u1, e);
      if (u <= 5.0) {
        worst_u5 = std::max(worst_u5, e);
        ++checked;
      }
    }
  MESSAGE("max relative error vs Theis: u<=1 ", worst_u1, ", u<=5 ", worst_u5);
  CHECK(checked >= 20);
  CHECK(worst_u1 <= 3e-4);  // stated accuracy (radial_solver.hpp)
  CHECK(worst_u5 <= 2e-3);  // stated accuracy; 1 % is asked where Δp is significant (docs/pressure.md)
}

TEST_CASE("grid and time-step refinement converge towards Theis") {
  const RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
  const std::vector<double> radii = {10.0, 100.0};
  const std::vector<double> times = {10 * kDay};
  auto error = [&](double cells, double growth) {
    RadialSolverOptions o;
    o.cells_per_decade = cells;
    o.time_step_growth = growth;
    const RadialSolution s = solve_radial_flow(m, radii, times, o);
    double e = 0.0;
    for (std::size_t ir = 0; ir < radii.size(); ++ir)
      e = std::max(e, rel(s.at(0, ir), theis(kQ, kK, kS, radii[ir], times[0])));
    return e;
  };
  const double coarse = error(20, 1.2), mid = error(40, 1.1), fine = error(80, 1.05);
  MESSAGE("errors coarse/mid/fine: ", coarse, " ", mid, " ", fine);
  CHECK(mid < coarse);
  CHECK(fine < mid);
  CHECK(fine < 0.4 * mid);  // second order: doubling the cells and halving (growth − 1) gains ~4
}

TEST_CASE("rate steps and shut-in recovery match Theis superposition") {
  RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
  m.history = RateHistory({0.0, 30 * kDay, 90 * kDay, 200 * kDay}, {kQ, 2 * kQ, 0.0, 0.5 * kQ});
  const std::vector<double> radii = {kRw, 10.0, 100.0, 1000.0};
  const std::vector<double> times = {20 * kDay, 60 * kDay, 90 * kDay, 91 * kDay, 120 * kDay,
                                     199 * kDay, 250 * kDay};
  const RadialSolution s = solve_radial_flow(m, radii, times);
  WellSource well;
  well.well_radius = kRw;
  well.history = m.history;
  const PressureField field({well});
  double worst = 0.0;
  for (std::size_t it = 0; it < times.size(); ++it)
    for (std::size_t ir = 0; ir < radii.size(); ++ir) {
      const double ref = theis_history(m.history, kK, kS, radii[ir], times[it]);
      CAPTURE(times[it]);
      CAPTURE(radii[ir]);
      worst = std::max(worst, rel(s.at(it, ir), ref));
      CHECK(rel(s.at(it, ir), ref) <= 1e-3);
      // Same check against the project's superposition engine (pressure_field.hpp).
      CHECK(rel(s.at(it, ir), field.pressure_at(project_theis(kK), FieldPoint{radii[ir], 0.0}, times[it])) <= 1e-3);
    }
  MESSAGE("max relative error vs Theis superposition: ", worst);
}

TEST_CASE("closed outer boundary: material balance and pseudo-steady state") {
  const double r_e = 500.0;
  const RadialModel m = homogeneous(OuterBoundary::closed, r_e);
  const std::vector<double> radii = {kRw, 1.0, 10.0, 100.0, 300.0, r_e};
  // D t / r_e² = 1, 2: the transient towards pseudo-steady state has decayed by
  // exp(−β₁² D t/r_e²) with β₁ = 3.83 (first zero of J1), below 5e-7 (from memory).
  const std::vector<double> times = {1e4, 2.5e5, 5e5};
  const RadialSolution s = solve_radial_flow(m, radii, times);
  const double pore = kPi * (r_e * r_e - kRw * kRw) * kH * kS;  // φ c_t V, m³/Pa
  for (std::size_t it = 0; it < times.size(); ++it) {
    // Material balance (exact): mean Δp = q t / (π (r_e² − r_w²) h φ c_t).
    CHECK(s.mean_change[it] == doctest::Approx(kQ * times[it] / pore).epsilon(1e-10));
  }
  // Pseudo-steady state: every radius rises at the material-balance rate.
  const double rate = kQ / pore;
  for (std::size_t ir = 0; ir < radii.size(); ++ir) {
    const double slope = (s.at(2, ir) - s.at(1, ir)) / (times[2] - times[1]);
    CAPTURE(radii[ir]);
    CHECK(slope == doctest::Approx(rate).epsilon(1e-4));
  }
  // Pseudo-steady profile (closed annulus, Dake 1978 "Fundamentals of Reservoir Engineering"
  // §6.4, derived here for finite r_w): Δp(r) − Δp(r_w) =
  //   q μ / (2π k h (r_e² − r_w²)) · [ (r² − r_w²)/2 − r_e² ln(r/r_w) ].
  const double c = kQ * kMu / (2 * kPi * kK * kH * (r_e * r_e - kRw * kRw));
  const double drawup = -c * ((r_e * r_e - kRw * kRw) / 2 - r_e * r_e * std::log(r_e / kRw));
  for (std::size_t ir = 1; ir < radii.size(); ++ir) {
    const double r = radii[ir];
    const double ref = c * ((r * r - kRw * kRw) / 2 - r_e * r_e * std::log(r / kRw));
    CAPTURE(r);
    CHECK(std::abs((s.at(2, ir) - s.at(2, 0)) - ref) <= 1e-4 * drawup);
  }
}

TEST_CASE("constant-pressure outer boundary reaches the Thiem (1906) steady state") {
  const double r_e = 500.0;
  const RadialModel m = homogeneous(OuterBoundary::constant_pressure, r_e);
  const std::vector<double> radii = {kRw, 1.0, 10.0, 100.0, 400.0, r_e};
  // D t / r_e² = 4: the slowest mode exp(−2.405² D t/r_e²) has decayed below 1e-10 (from memory:
  // 2.405 is the first zero of J0).
  const RadialSolution s = solve_radial_flow(m, radii, std::vector<double>{1e6});
  for (std::size_t ir = 0; ir < radii.size(); ++ir) {
    // Thiem (1906): Δp = q μ / (2π k h) ln(r_e / r).
    const double ref = kQ * kMu / (2 * kPi * kK * kH) * std::log(r_e / radii[ir]);
    CAPTURE(radii[ir]);
    CHECK(std::abs(s.at(0, ir) - ref) <= 1e-6 * (kQ * kMu / (2 * kPi * kK * kH)));
  }
}

TEST_CASE("composite zones: equal permeabilities reproduce the homogeneous layer") {
  RadialModel one = homogeneous(OuterBoundary::infinite, kInf);
  RadialModel three = one;
  three.zones = {{7.0, kK, kS}, {150.0, kK, kS}, {kInf, kK, kS}};
  const std::vector<double> radii = {kRw, 5.0, 7.0, 50.0, 150.0, 500.0};
  const std::vector<double> times = {kDay, 30 * kDay};
  const RadialSolution a = solve_radial_flow(one, radii, times);
  const RadialSolution b = solve_radial_flow(three, radii, times);
  for (std::size_t i = 0; i < a.values.size(); ++i) CHECK(rel(b.values[i], a.values[i]) <= 1e-3);
}

TEST_CASE("composite zones tend to Theis with the outer permeability at late time") {
  // Inner zone of radius R = 20 m with k1, outer zone k2 = kK (same storage). Late in time
  // (t ≫ R²/D1) the outer zone sees the line source with k2, and the well face adds the
  // Hawkins (1956) skin: Δp_w = Δp_Theis(k2, r_w) + q μ/(2π h) (1/k1 − 1/k2) ln(R/r_w).
  const double big_r = 20.0;
  for (const double k1 : {0.1 * kK, 5.0 * kK}) {
    CAPTURE(k1);
    RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
    m.zones = {{big_r, k1, kS}, {kInf, kK, kS}};
    const std::vector<double> radii = {kRw, 50.0, 200.0, 1000.0};
    const std::vector<double> times = {60 * kDay, 365 * kDay};
    const RadialSolution s = solve_radial_flow(m, radii, times);
    const double skin = kQ * kMu / (2 * kPi * kH) * (1 / k1 - 1 / kK) * std::log(big_r / kRw);
    for (std::size_t it = 0; it < times.size(); ++it) {
      CHECK(rel(s.at(it, 0), theis(kQ, kK, kS, kRw, times[it]) + skin) <= 1e-2);
      for (std::size_t ir = 1; ir < radii.size(); ++ir) {
        CAPTURE(radii[ir]);
        CHECK(rel(s.at(it, ir), theis(kQ, kK, kS, radii[ir], times[it])) <= 1e-2);
      }
    }
  }
}

TEST_CASE("composite zones with a constant-pressure outer radius reach the series steady state") {
  // Steady radial flow through concentric zones in series (Thiem 1906 zone by zone; the same
  // form gives the Hawkins 1956 skin): for r < R, Δp = q μ/(2π h) [ln(R/r)/k1 + ln(r_e/R)/k2];
  // for r ≥ R, Δp = q μ/(2π h k2) ln(r_e/r). Storage differs per zone: it must not matter.
  const double big_r = 30.0, r_e = 600.0, k1 = 0.2 * kK;
  RadialModel m = homogeneous(OuterBoundary::constant_pressure, r_e);
  m.zones = {{big_r, k1, 3 * kS}, {r_e, kK, kS}};
  const std::vector<double> radii = {kRw, 3.0, big_r, 100.0, 550.0};
  const RadialSolution s = solve_radial_flow(m, radii, std::vector<double>{3e6});
  const double c = kQ * kMu / (2 * kPi * kH);
  for (std::size_t ir = 0; ir < radii.size(); ++ir) {
    const double r = radii[ir];
    const double ref = r < big_r ? c * (std::log(big_r / r) / k1 + std::log(r_e / big_r) / kK)
                                 : c / kK * std::log(r_e / r);
    CAPTURE(r);
    CHECK(std::abs(s.at(0, ir) - ref) <= 1e-6 * c / k1);
  }
}

TEST_CASE("composite closed annulus conserves mass with per-zone storage") {
  const double big_r = 40.0, r_e = 800.0;
  RadialModel m = homogeneous(OuterBoundary::closed, r_e);
  m.zones = {{big_r, 3 * kK, 2 * kS}, {r_e, kK, kS}};
  m.history = RateHistory({100.0, 1e5}, {kQ, 0.0});
  const std::vector<double> times = {5e4, 1e5, 3e5};
  const RadialSolution s = solve_radial_flow(m, std::vector<double>{kRw}, times);
  const double pore = kPi * kH * (2 * kS * (big_r * big_r - kRw * kRw) + kS * (r_e * r_e - big_r * big_r));
  // Material balance (exact): storage-weighted mean Δp = injected volume / Σ φ c_t V.
  CHECK(s.mean_change[0] == doctest::Approx(kQ * (5e4 - 100.0) / pore).epsilon(1e-10));
  CHECK(s.mean_change[1] == doctest::Approx(kQ * (1e5 - 100.0) / pore).epsilon(1e-10));
  CHECK(s.mean_change[2] == doctest::Approx(kQ * (1e5 - 100.0) / pore).epsilon(1e-10));
}

TEST_CASE("times before injection give zero; order of times and radii is kept; r < r_w clamps") {
  RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
  m.history = RateHistory({kDay}, {kQ});
  const std::vector<double> radii = {10.0, 0.0, kRw};
  const std::vector<double> times = {5 * kDay, -kDay, kDay, 2 * kDay};
  const RadialSolution s = solve_radial_flow(m, radii, times);
  for (std::size_t ir = 0; ir < radii.size(); ++ir) {
    CHECK(s.at(1, ir) == 0.0);
    CHECK(s.at(2, ir) == 0.0);
  }
  CHECK(s.at(0, 1) == s.at(0, 2));  // r = 0 is clamped to the well face
  CHECK(s.at(0, 0) > s.at(3, 0));   // later time, larger Δp (injection)
  CHECK(rel(s.at(0, 0), theis(kQ, kK, kS, 10.0, 4 * kDay)) <= 1e-3);
  const RadialSolution none = solve_radial_flow(homogeneous(OuterBoundary::infinite, kInf), radii,
                                                std::vector<double>{0.0});
  CHECK(none.at(0, 0) == 0.0);
}

TEST_CASE("bad input is a clear InputError") {
  const std::vector<double> r = {1.0}, t = {kDay};
  auto bad = [&](auto edit, const char* needle) {
    RadialModel m = homogeneous(OuterBoundary::infinite, kInf);
    RadialSolverOptions o;
    std::vector<double> rr = r, tt = t;
    edit(m, o, rr, tt);
    CHECK_THROWS_WITH_AS(solve_radial_flow(m, rr, tt, o), doctest::Contains(needle), InputError);
  };
  using V = std::vector<double>;
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones[0].permeability = 0; }, "zones[0].permeability");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones[0].permeability = -1e-13; }, "permeability > 0");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones[0].storage = std::nan(""); }, "zones[0].storage");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.thickness = 0; }, "thickness");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.viscosity = -1; }, "viscosity");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.well_radius = 0; }, "well_radius");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones.clear(); }, "at least one radial zone");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones = {{50, kK, kS}, {20, kK, kS}, {kInf, kK, kS}}; },
      "zones[1].outer_radius");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones = {{0.05, kK, kS}, {kInf, kK, kS}}; },
      "beyond the well radius");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.zones[0].outer_radius = 1000; }, "+infinity");
  bad([](RadialModel& m, RadialSolverOptions&, V&, V&) { m.outer = OuterBoundary::closed; }, "finite outer radius");
  bad([](RadialModel&, RadialSolverOptions&, V& rr, V&) { rr = {-1}; }, "radii[0]");
  bad([](RadialModel& m, RadialSolverOptions&, V& rr, V&) {
        m.outer = OuterBoundary::closed;
        m.zones[0].outer_radius = 100;
        rr = {150};
      },
      "within the outer radius");
  bad([](RadialModel&, RadialSolverOptions&, V&, V& tt) { tt = {std::nan("")}; }, "times[0]");
  bad([](RadialModel&, RadialSolverOptions& o, V&, V&) { o.time_step_growth = 1.0; }, "time_step_growth");
  bad([](RadialModel&, RadialSolverOptions& o, V&, V&) { o.cells_per_decade = 2; }, "cells_per_decade");
  bad([](RadialModel&, RadialSolverOptions& o, V&, V&) { o.first_step = -1; }, "first_step");
}
