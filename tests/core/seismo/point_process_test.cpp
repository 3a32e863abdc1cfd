#include "core/seismo/point_process.hpp"

#include <doctest/doctest.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
constexpr double kYear = 365.25 * 86400.0;
// Fictional parameters: r = 0.5 events/yr on a segment, Aσ = 0.05 MPa, t_a = 100 yr.
const RateStateParameters kP = RateStateParameters::from_aftershock_duration(0.5 / kYear, 0.05e6, 100.0 * kYear);
}  // namespace

TEST_CASE("Poisson point-process log-likelihood (Ogata 1988) equals a direct numerical integration") {
  // Two segments with Coulomb steps of 0.15 MPa and −0.04 MPa at year 3 (histories from year 0),
  // a pool of rate 2 events/yr; window years 1 to 12; events on both segments and in the pool.
  const double step = 3.0 * kYear, t0 = 1.0 * kYear, t1 = 12.0 * kYear, pool = 2.0 / kYear;
  const double ds[2] = {0.15e6, -0.04e6};
  std::vector<SegmentRateModel> seg;
  for (double d : ds) seg.push_back({CoulombHistory{{0.0, step, step}, {0.0, 0.0, d}}, kP});
  const std::vector<AssignedEvent> ev{{2.0 * kYear, 0},  {3.01 * kYear, 0}, {3.5 * kYear, 0}, {8.0 * kYear, 0},
                                      {5.0 * kYear, 1},  {1.5 * kYear, kBackgroundPool},
                                      {9.0 * kYear, kBackgroundPool}};
  const auto got = seismicity_log_likelihood(seg, pool, ev, t0, t1);
  // Direct: λ from Dieterich's closed form (before the step: r), ∫ λ by Boost.Math adaptive
  // Gauss–Kronrod quadrature (a general-purpose library), split at the step.
  double direct = 0.0;
  for (const auto& e : ev) {
    if (e.segment == kBackgroundPool) direct += std::log(pool);
    else direct += std::log(e.time < step ? kP.background_rate : step_response_rate(kP, ds[e.segment], e.time - step));
  }
  for (double d : ds) {
    const double after = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        [&](double t) { return step_response_rate(kP, d, t); }, 0.0, t1 - step, 20, 1e-14);
    direct -= kP.background_rate * (step - t0) + after;
  }
  direct -= pool * (t1 - t0);
  CHECK(got.log_likelihood == doctest::Approx(direct).epsilon(1e-9));
  CHECK(got.log_likelihood == doctest::Approx(got.sum_log_rate - got.expected).epsilon(1e-15));
}

TEST_CASE("point process: constant rates give n ln λ − λ T") {
  // No Coulomb change: every segment at its background rate r (closed form).
  const std::vector<SegmentRateModel> seg{{CoulombHistory{{0.0}, {0.0}}, kP}};
  const std::vector<AssignedEvent> ev{{2 * kYear, 0}, {4 * kYear, 0}, {5 * kYear, 0}};
  const auto got = seismicity_log_likelihood(seg, 0.0, ev, 0.0, 10 * kYear);
  const double r = kP.background_rate;
  CHECK(got.log_likelihood == doctest::Approx(3 * std::log(r) - r * 10 * kYear).epsilon(1e-12));
}

TEST_CASE("point process: bad windows, events and pools are refused") {
  const std::vector<SegmentRateModel> seg{{CoulombHistory{{0.0}, {0.0}}, kP}};
  CHECK_THROWS_AS(seismicity_log_likelihood(seg, 0.0, {}, 5.0, 5.0), InputError);
  CHECK_THROWS_AS(seismicity_log_likelihood(seg, 0.0, {{20.0, 0}}, 0.0, 10.0), InputError);
  CHECK_THROWS_AS(seismicity_log_likelihood(seg, 0.0, {{2.0, 3}}, 0.0, 10.0), InputError);
  CHECK_THROWS_AS(seismicity_log_likelihood(seg, 0.0, {{2.0, kBackgroundPool}}, 0.0, 10.0), InputError);
  const std::vector<SegmentRateModel> late{{CoulombHistory{{5.0}, {0.0}}, kP}};
  CHECK_THROWS_AS(seismicity_log_likelihood(late, 0.0, {}, 0.0, 10.0), InputError);
}
