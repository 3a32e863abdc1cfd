#include "core/poro/injection_interval.hpp"

#include <doctest/doctest.h>

#include <boost/math/quadrature/gauss.hpp>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/theis.hpp"
#include "support/poro_medium_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::poro;

namespace {

RudnickiConstants constants() { return rudnicki_constants(test::sandstone_medium()); }

InjectionSource well(double top, double bottom, int n, std::vector<hydro::RateChange> changes) {
  InjectionSource w;
  w.points = open_interval_points(0.0, 0.0, top, bottom, n);
  w.changes = std::move(changes);
  w.radius = 0.1;
  return w;
}

double max_abs(const Eigen::Matrix3d& m) { return m.cwiseAbs().maxCoeff(); }

}  // namespace

TEST_CASE("injection interval: Gauss-Legendre nodes and weights against Boost.Math") {
  std::vector<double> x, w;
  gauss_legendre(7, x, w);
  using G = boost::math::quadrature::gauss<double, 7>;  // Boost.Math tabulated rule
  const auto& ax = G::abscissa();
  const auto& wt = G::weights();
  // Boost stores the non-negative half: node 0 first, then ascending
  for (std::size_t i = 0; i < ax.size(); ++i) {
    CHECK(std::fabs(x[3 + i] - ax[i]) <= 1e-15);
    CHECK(std::fabs(x[3 - i] + ax[i]) <= 1e-15);
    CHECK(std::fabs(w[3 + i] - wt[i]) <= 1e-15);
  }
  gauss_legendre(40, x, w);
  double sum = 0.0, m2 = 0.0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    sum += w[i];
    m2 += w[i] * x[i] * x[i];
  }
  CHECK(std::fabs(sum - 2.0) <= 1e-14);
  CHECK(std::fabs(m2 - 2.0 / 3.0) <= 1e-14);  // ∫ x² dx over (−1, 1)
  gauss_legendre(1, x, w);
  CHECK(x[0] == 0.0);
  CHECK(w[0] == 2.0);
  CHECK_THROWS_AS(gauss_legendre(0, x, w), InputError);
  CHECK_THROWS_AS(open_interval_points(0, 0, 2000.0, 1000.0, 4), InputError);
}

TEST_CASE("injection interval: a long interval near its middle is the Theis line source") {
  // Far from the ends of a long open interval the 3-D solution is that of an infinite line
  // source: Δp = q μ/(4π k L) E1(r²/(4ct)) per unit length L (Theis 1935 with D = c, h = L).
  const RudnickiConstants k = constants();
  const double L = 2000.0, r = 100.0, t = 1.0e5;  // √(ct) ≈ 127 m ≪ L/2
  const InjectionSource w = well(1000.0, 1000.0 + L, 200, {{0.0, 1.0}});
  const double dp = superposed_pressure(k, std::span(&w, 1), Eigen::Vector3d(r, 0.0, 1000.0 + L / 2), t);
  hydro::TheisParameters theis{k.diffusivity, 1.0 / (4.0 * std::numbers::pi * k.mobility * L), 0.0};
  const double want = hydro::theis_unit_response(theis, r, t);
  // the ends are L/2 / √(ct) ≈ 7.9 diffusion lengths away (erfc(3.9) ≈ 3e-8 of a point's share)
  CHECK(std::fabs(dp - want) <= 1e-7 * want);
  MESSAGE("relative difference from Theis: " << std::fabs(dp - want) / want);
}

TEST_CASE("injection interval: quadrature error as stated (against 64 points)") {
  const RudnickiConstants k = constants();
  const double t = 3.0e7;
  struct Case {
    Eigen::Vector3d x;
    int n;
    double tol;
  };
  // interval 2000-2100 m: half-length a = 50 m
  for (const Case& c : {Case{{0.0, 0.0, 2550.0}, 4, 1e-10},   // on the axis, 10 a from the middle
                        Case{{50.0, 0.0, 2050.0}, 8, 5e-6},   // beside it, one half-length away
                        Case{{5000.0, 0.0, 3050.0}, 1, 1e-3}}) {  // 5 km off, 1 km below: midpoint rule
    CAPTURE(c.x.transpose());
    const InjectionSource fine = well(2000.0, 2100.0, 64, {{0.0, 1.0}});
    const InjectionSource coarse = well(2000.0, 2100.0, c.n, {{0.0, 1.0}});
    const PointResponse a = superposed_response(k, std::span(&fine, 1), c.x, t);
    const PointResponse b = superposed_response(k, std::span(&coarse, 1), c.x, t);
    MESSAGE("n = " << c.n << ": relative difference dp " << std::fabs(a.dp - b.dp) / a.dp << ", stress "
                    << max_abs(a.dstress - b.dstress) / max_abs(a.dstress));
    CHECK(std::fabs(a.dp - b.dp) <= c.tol * a.dp);
    CHECK(max_abs(a.dstress - b.dstress) <= c.tol * max_abs(a.dstress));
  }
}

TEST_CASE("injection interval: superposition over rate steps, wells and rate factors") {
  const RudnickiConstants k = constants();
  const Eigen::Vector3d x(3000.0, 1000.0, 3000.0);
  const double day = 86400.0;
  // 0.02 m³/s from day 0, shut in at day 100 (a step of −0.02)
  const InjectionSource a = well(2000.0, 2100.0, 4, {{0.0, 0.02}, {100 * day, -0.02}});
  const InjectionSource one = well(2000.0, 2100.0, 4, {{0.0, 1.0}});
  const double t = 250 * day;
  const PointResponse got = superposed_response(k, std::span(&a, 1), x, t);
  const PointResponse on = superposed_response(k, std::span(&one, 1), x, t);
  const PointResponse off = superposed_response(k, std::span(&one, 1), x, t - 100 * day);
  CHECK(std::fabs(got.dp - 0.02 * (on.dp - off.dp)) <= 1e-14 * 0.02 * on.dp);
  CHECK(max_abs(got.dstress - 0.02 * (on.dstress - off.dstress)) <= 1e-14 * 0.02 * max_abs(on.dstress));
  // at the shut-in time itself the step has not acted yet (t_j < t)
  CHECK(superposed_pressure(k, std::span(&a, 1), x, 100 * day) ==
        doctest::Approx(superposed_pressure(k, std::span(&one, 1), x, 100 * day) * 0.02).epsilon(1e-14));
  // two wells with factors add linearly; the pressure-only sum equals the full one
  const std::vector<InjectionSource> both{a, one};
  const std::vector<double> f{2.0, 0.5};
  const PointResponse sum = superposed_response(k, both, x, t, f);
  CHECK(std::fabs(sum.dp - (2.0 * got.dp + 0.5 * on.dp)) <= 1e-14 * sum.dp);
  CHECK(std::fabs(superposed_pressure(k, both, x, t, f) - sum.dp) <= 1e-14 * sum.dp);
  CHECK(max_abs(sum.dstress - sum.dstress.transpose()) == 0.0);
  // nothing before the first step
  CHECK(superposed_response(k, both, x, 0.0).dp == 0.0);
  // a zero-length interval is one point source with the whole rate
  const InjectionSource point = well(2050.0, 2050.0, 3, {{0.0, 1.0}});
  const PointResponse ps = point_source_response(k, x - Eigen::Vector3d(0.0, 0.0, 2050.0), t);
  CHECK(std::fabs(superposed_pressure(k, std::span(&point, 1), x, t) - ps.dp) <= 1e-14 * ps.dp);
}

TEST_CASE("injection interval: distances inside the well radius are clamped to it") {
  const RudnickiConstants k = constants();
  const InjectionSource w = well(1000.0, 1000.0, 1, {{0.0, 1.0}});
  const double t = 1e6;
  const double at_radius = point_source_pressure(k, 0.1, t);
  CHECK(superposed_pressure(k, std::span(&w, 1), Eigen::Vector3d(0.0, 0.0, 1000.0), t) == at_radius);
  CHECK(superposed_pressure(k, std::span(&w, 1), Eigen::Vector3d(0.03, 0.0, 1000.04), t) ==
        doctest::Approx(at_radius).epsilon(1e-15));
  CHECK(std::isfinite(superposed_response(k, std::span(&w, 1), Eigen::Vector3d(0.0, 0.0, 1000.0), t).dstress.sum()));
}
