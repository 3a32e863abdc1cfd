#include "core/hydro/pressure_field.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <omp.h>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/hantush.hpp"
#include "core/hydro/well_function.hpp"
#include "core/units/units.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

TheisParameters example_params() {
  Formation f;  // invented test formation: 50 mD, 20 m, 0.6 cP, 12 %, 2e-9 1/Pa
  f.permeability = 50 * units::kMilliDarcy;
  f.thickness = 20;
  f.viscosity = 0.6e-3;
  f.porosity = 0.12;
  f.total_compressibility = 2e-9;
  return theis_parameters(f);
}

WellSource well(const char* name, double x, double y, RateHistory h) {
  return WellSource{name, x, y, 0.1, std::move(h)};
}

double rel_err(double got, double want) { return std::abs(got / want - 1.0); }

constexpr double kDay = 86400.0;

}  // namespace

TEST_CASE("a constant rate split into two equal halves gives the same pressure") {
  // Linearity of the diffusion equation (superposition; Earlougher 1977, ch. 2).
  const TheisParameters p = example_params();
  const PressureField one({well("A", 0, 0, RateHistory({0.0}, {0.03}))});
  const PressureField halves({well("A1", 0, 0, RateHistory({0.0}, {0.015})),
                              well("A2", 0, 0, RateHistory({0.0}, {0.015}))});
  // a rate written as two consecutive steps of the same value
  const PressureField steps({well("A", 0, 0, RateHistory({0.0, 40 * kDay}, {0.03, 0.03}))});
  for (double r : {0.5, 150.0, 2000.0})
    for (double t : {1 * kDay, 40 * kDay, 400 * kDay}) {
      const double ref = one.pressure_at(p, {r, 0}, t);
      CHECK(rel_err(halves.pressure_at(p, {r, 0}, t), ref) <= 1e-15);
      CHECK(steps.pressure_at(p, {r, 0}, t) == ref);
      // and the single-well value is Theis (theis.hpp)
      CHECK(rel_err(ref, theis_pressure(p, 0.03, r, 0.1, t)) <= 1e-15);
    }
}

TEST_CASE("a shut-in follows the Theis recovery formula") {
  // Theis (1935) recovery: dp = q mu/(4 pi k h) [W(r^2/(4Dt)) - W(r^2/(4D(t - t_p)))], t > t_p.
  const TheisParameters p = example_params();
  const double q = 0.02, tp = 100 * kDay, r = 300;
  const PressureField f({well("A", 0, 0, RateHistory({0.0, tp}, {q, 0.0}))});
  for (double t : {101 * kDay, 150 * kDay, 1000 * kDay}) {
    const double want = q * p.pressure_per_rate *
                        (well_function(theis_argument(p, r, t)) - well_function(theis_argument(p, r, t - tp)));
    CHECK(rel_err(f.pressure_at(p, {0, r}, t), want) <= 1e-13);
  }
  // decays after shut-in
  CHECK(f.pressure_at(p, {0, r}, 200 * kDay) < f.pressure_at(p, {0, r}, 120 * kDay));
}

TEST_CASE("two wells add, and each well's contribution is reported") {
  const TheisParameters p = example_params();
  const auto ha = RateHistory({0.0, 50 * kDay}, {0.02, 0.01});
  const auto hb = RateHistory({30 * kDay}, {0.04});
  const PressureField a({well("A", 0, 0, ha)}), b({well("B", 1500, 700, hb)});
  const PressureField both({well("A", 0, 0, ha), well("B", 1500, 700, hb)});
  const std::vector<FieldPoint> pts = {{200, 100}, {1500, 700.05}, {-3000, 4000}};
  const std::vector<double> times = {10 * kDay, 60 * kDay, 365 * kDay};
  const auto ra = a.evaluate(a.prepare(pts), times, p);
  const auto rb = b.evaluate(b.prepare(pts), times, p);
  const auto prepared = both.prepare(pts);
  const auto r = both.evaluate(prepared, times, p, {}, true);
  CHECK(prepared.was_clamped(1, 1));  // 0.05 m from B, inside r_w = 0.1 m
  CHECK_FALSE(prepared.was_clamped(0, 0));
  CHECK(prepared.any_clamped());
  for (std::size_t i = 0; i < pts.size(); ++i)
    for (std::size_t t = 0; t < times.size(); ++t) {
      CHECK(rel_err(r.at(i, t), ra.at(i, t) + rb.at(i, t)) <= 1e-14);
      CHECK(r.contribution(i, t, 0) == ra.at(i, t));
      CHECK(r.contribution(i, t, 1) == rb.at(i, t));
    }
  CHECK(r.contribution(0, 0, 1) == 0.0);  // B starts at day 30: nothing at day 10
}

TEST_CASE("hydrogeology and rate factors vary without re-preparing geometry") {
  const TheisParameters p = example_params();
  const PressureField f({well("A", 0, 0, RateHistory({0.0}, {0.02})), well("B", 900, 0, RateHistory({0.0}, {0.01}))});
  const std::vector<FieldPoint> pts = {{300, 200}};
  const std::vector<double> times = {100 * kDay};
  const auto prepared = f.prepare(pts);
  TheisParameters p2 = p;
  p2.diffusivity *= 3.0;
  p2.pressure_per_rate *= 0.5;
  const double direct = 0.5 * p.pressure_per_rate / p.pressure_per_rate *
                        (theis_pressure(p2, 0.02, std::hypot(300, 200), 0.1, 100 * kDay) +
                         theis_pressure(p2, 0.01, std::hypot(600, 200), 0.1, 100 * kDay)) / 0.5;
  CHECK(rel_err(f.evaluate(prepared, times, p2).at(0, 0), direct) <= 1e-14);
  const std::vector<double> factors = {2.0, 0.0};
  CHECK(rel_err(f.evaluate(prepared, times, p, factors).at(0, 0),
                2 * theis_pressure(p, 0.02, std::hypot(300, 200), 0.1, 100 * kDay)) <= 1e-14);
  const std::vector<double> wrong = {1.0};
  CHECK_THROWS_AS(f.evaluate(prepared, times, p, wrong), InputError);
}

TEST_CASE("times before the first injection give zero; bad times and wells are errors") {
  const TheisParameters p = example_params();
  const PressureField f({well("A", 0, 0, RateHistory({10 * kDay}, {0.02}))});
  CHECK(f.pressure_at(p, {100, 0}, 5 * kDay) == 0.0);   // documented value, not an error
  CHECK(f.pressure_at(p, {100, 0}, 10 * kDay) == 0.0);
  CHECK(f.pressure_at(p, {100, 0}, -1e9) == 0.0);
  CHECK(f.pressure_at(p, {100, 0}, 11 * kDay) > 0.0);
  CHECK_THROWS_WITH_AS(f.pressure_at(p, {100, 0}, std::nan("")), doctest::Contains("time"), InputError);
  TheisParameters bad = p;
  bad.diffusivity = -1;
  CHECK_THROWS_WITH_AS(f.pressure_at(bad, {100, 0}, 11 * kDay), doctest::Contains("diffusivity"), InputError);
  const WellSource w{"Z", 0, 0, 0.0, RateHistory({0.0}, {0.01})};
  CHECK_THROWS_WITH_AS(PressureField({w}), doctest::Contains("well 'Z'"), InputError);
}

TEST_CASE("results do not depend on the thread count") {
  const TheisParameters p = example_params();
  std::vector<WellSource> wells;
  for (int i = 0; i < 5; ++i)
    wells.push_back(well("W", 400.0 * i, -250.0 * i, RateHistory({0.0, 30.0 * kDay * (i + 1)}, {0.01 * (i + 1), 0.002})));
  const PressureField f(wells);
  std::vector<FieldPoint> pts;
  for (int i = 0; i < 100; ++i) pts.push_back({37.0 * i - 1000, 11.0 * i});
  const std::vector<double> times = {20 * kDay, 90 * kDay, 700 * kDay};
  const auto prepared = f.prepare(pts);
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  const auto r1 = f.evaluate(prepared, times, p, {}, true);
  omp_set_num_threads(2);
  const auto r2 = f.evaluate(prepared, times, p, {}, true);
  omp_set_num_threads(before);
  CHECK(r1.total == r2.total);
  CHECK(r1.by_well == r2.by_well);
}

TEST_CASE("evaluate_each gives each point's own time, as evaluate does") {
  // Reference: the full point x time evaluation of the same field (same sums, so equal to
  // rounding); one time per point is required.
  const hydro::RateHistory h({0.0, 86400.0 * 30}, {0.01, 0.02});
  const hydro::PressureField field({{"A", 0.0, 0.0, 0.1, h}, {"B", 800.0, 300.0, 0.1, h}});
  const hydro::TheisParameters params{0.5, 2.0e8};
  const std::vector<hydro::FieldPoint> pts{{100.0, 50.0}, {-400.0, 900.0}, {1500.0, -200.0}};
  const std::vector<double> times{86400.0 * 10, 86400.0 * 45, 86400.0 * 400};
  const auto prepared = field.prepare(pts);
  const auto each = field.evaluate_each(prepared, times, params);
  const auto all = field.evaluate(prepared, times, params);
  REQUIRE(each.size() == 3);
  for (std::size_t i = 0; i < 3; ++i) CHECK(each[i] == doctest::Approx(all.at(i, i)).epsilon(1e-14));
  CHECK(each[0] > 0.0);
  const std::vector<double> two{1.0, 2.0};
  CHECK_THROWS_AS(field.evaluate_each(prepared, two, params), InputError);
}

TEST_CASE("a leaky formation: W(u, r/B) per term, and Theis when the aquitard is nearly impervious") {
  // Hantush & Jacob (1955): Δp = P q W(r²/(4Dt), r/B); c_L = D/B².
  TheisParameters p = example_params();
  const double b = 2500.0;  // m, leakage factor (invented)
  TheisParameters leaky = p;
  leaky.leakage_rate = p.diffusivity / (b * b);
  const PressureField one({well("A", 0, 0, RateHistory({0.0, 300 * kDay}, {0.03, 0.01}))});
  for (double r : {0.5, 800.0, 4000.0})
    for (double t : {30 * kDay, 500 * kDay}) {
      CAPTURE(r);
      CAPTURE(t);
      double ref = 0.03 * leaky_well_function(r * r / (4 * p.diffusivity * t), r / b);
      if (t > 300 * kDay) ref += (0.01 - 0.03) * leaky_well_function(r * r / (4 * p.diffusivity * (t - 300 * kDay)), r / b);
      ref *= p.pressure_per_rate;
      CHECK(rel_err(one.pressure_at(leaky, {r, 0}, t), ref) <= 1e-14);
      CHECK(rel_err(theis_pressure(leaky, 0.03, r, 0.1, std::min(t, 300 * kDay)),
                    p.pressure_per_rate * 0.03 * leaky_well_function(r * r / (4 * p.diffusivity * std::min(t, 300 * kDay)), r / b)) <= 1e-15);
      CHECK(one.pressure_at(leaky, {r, 0}, t) < one.pressure_at(p, {r, 0}, t));  // leakage lowers Δp
      // B = 1e12 m (a huge aquitard resistance): Theis to 1e-10.
      TheisParameters tight = p;
      tight.leakage_rate = p.diffusivity / 1e24;
      CHECK(rel_err(one.pressure_at(tight, {r, 0}, t), one.pressure_at(p, {r, 0}, t)) <= 1e-10);
    }
  TheisParameters bad = p;
  bad.leakage_rate = -1.0;
  CHECK_THROWS_AS(one.pressure_at(bad, {100, 0}, kDay), InputError);
}
