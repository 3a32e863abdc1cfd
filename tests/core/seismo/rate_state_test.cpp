#include "core/seismo/rate_state.hpp"

#include <doctest/doctest.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
constexpr double kYear = 365.25 * 86400.0;
// r = 2 events/yr, Aσ = 0.05 MPa, t_a = 20 yr (fictional but typical magnitudes).
const RateStateParameters kP = RateStateParameters::from_aftershock_duration(2.0 / kYear, 0.05e6, 20.0 * kYear);
}  // namespace

TEST_CASE("steady state: no stress change gives the background rate") {
  const CoulombHistory h{{0.0, 10.0 * kYear}, {0.0, 0.0}};
  const std::vector<double> out = {0.0, 3.0 * kYear, 10.0 * kYear, 50.0 * kYear};
  const auto s = rate_response(h, kP, out);
  for (const auto& x : s) CHECK(x.rate == doctest::Approx(kP.background_rate).epsilon(1e-12));
  CHECK(s[2].expected == doctest::Approx(20.0).epsilon(1e-12));   // r t = 2/yr · 10 yr
  CHECK(s[3].expected == doctest::Approx(100.0).epsilon(1e-12));
}

TEST_CASE("step response: general integrator against Dieterich's closed form") {
  // Dieterich (1994): R/r = 1/{[exp(-ΔS/Aσ) - 1] exp(-t/t_a) + 1}; the step is written as two
  // samples at the same time. Positive (0.3 MPa = 6 Aσ) and negative (stress shadow) steps.
  for (double ds : {0.3e6, 0.02e6, -0.1e6}) {
    CAPTURE(ds);
    const double t0 = 5.0 * kYear;
    const CoulombHistory h{{0.0, t0, t0}, {0.0, 0.0, ds}};
    std::vector<double> out;
    for (double yr : {0.0, 1e-4, 0.01, 0.5, 2.0, 10.0, 40.0, 200.0}) out.push_back(t0 + yr * kYear);
    const auto s = rate_response(h, kP, out);
    for (std::size_t k = 0; k < out.size(); ++k) {
      const double exact = step_response_rate(kP, ds, out[k] - t0);
      CHECK(s[k].rate == doctest::Approx(exact).epsilon(1e-11));
      // Expected count since the step, against Boost.Math Gauss-Kronrod quadrature of the
      // closed-form rate (a general-purpose library as reference), plus 5 yr of background.
      if (k == 0) continue;
      const double q = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
          [&](double t) { return step_response_rate(kP, ds, t); }, 0.0, out[k] - t0, 15, 1e-13);
      CHECK(s[k].expected == doctest::Approx(10.0 + q).epsilon(1e-9));
    }
  }
}

TEST_CASE("ramp history: general integrator against Boost odeint") {
  // ΔCFF rises linearly by 0.2 MPa over 2 yr, stays, then a 0.05 MPa drop over 1 yr.
  // Reference: dγ̂/dt = 1/t_a - γ̂ Ṡ(t)/Aσ integrated by Boost.Numeric.Odeint
  // (runge_kutta_dopri5, controlled, tolerance 1e-12), R = r/γ̂.
  const CoulombHistory h{{0.0, 1.0 * kYear, 3.0 * kYear, 6.0 * kYear, 7.0 * kYear},
                         {0.0, 0.0, 0.2e6, 0.2e6, 0.15e6}};
  auto sdot = [&](double t) {
    double d = 0.0;
    if (t >= 1.0 * kYear && t < 3.0 * kYear) d = 0.2e6 / (2.0 * kYear);
    if (t >= 6.0 * kYear && t < 7.0 * kYear) d = -0.05e6 / kYear;
    return kP.background_stressing_rate + d;
  };
  const std::vector<double> out = {0.5 * kYear, 2.0 * kYear, 3.0 * kYear, 4.5 * kYear, 6.5 * kYear, 9.0 * kYear};
  const auto s = rate_response(h, kP, out);
  using State = std::vector<double>;  // {γ̂, N}
  namespace ode = boost::numeric::odeint;
  const double t_a = kP.aftershock_duration();
  auto rhs = [&](const State& y, State& dy, double t) {
    dy[0] = 1.0 / t_a - y[0] * sdot(t) / kP.a_sigma;
    dy[1] = kP.background_rate / y[0];
  };
  State y = {1.0, 0.0};
  double t = 0.0;
  // Integrate piece by piece so the stepper never straddles a kink in Ṡ.
  const std::vector<double> stops = {0.5 * kYear, 1.0 * kYear, 2.0 * kYear, 3.0 * kYear, 4.5 * kYear,
                                     6.0 * kYear, 6.5 * kYear, 7.0 * kYear, 9.0 * kYear};
  std::size_t k = 0;
  for (double stop : stops) {
    ode::integrate_adaptive(ode::make_controlled<ode::runge_kutta_dopri5<State>>(1e-12, 1e-12), rhs, y, t, stop,
                            1e3);
    t = stop;
    if (k < out.size() && stop == out[k]) {
      CAPTURE(stop / kYear);
      CHECK(s[k].rate == doctest::Approx(kP.background_rate / y[0]).epsilon(1e-8));
      CHECK(s[k].expected == doctest::Approx(y[1]).epsilon(1e-8));
      ++k;
    }
  }
  CHECK(k == out.size());
  // Sanity, Dieterich (1994): during a sustained stressing rate Ṡ the rate tends to r Ṡ/τ̇_r;
  // here Ṡ/τ̇_r = 1 + (0.1 MPa/yr)/(0.0025 MPa/yr) = 41, approached within 2 yr << t_a only partly,
  // so the rate at 3 yr lies between r and 41 r.
  CHECK(s[2].rate > kP.background_rate);
  CHECK(s[2].rate < 41.0 * kP.background_rate);
}

TEST_CASE("bad rate-and-state inputs are input errors") {
  CHECK_THROWS_AS(validate(RateStateParameters{0.0, 1e5, 1.0}), InputError);
  CHECK_THROWS_AS(validate(RateStateParameters{1.0, -1.0, 1.0}), InputError);
  CHECK_THROWS_AS(RateStateParameters::from_aftershock_duration(1.0, 1e5, 0.0), InputError);
  const CoulombHistory bad{{0.0, 2.0, 1.0}, {0.0, 0.0, 0.0}};
  const std::vector<double> out = {0.5};
  CHECK_THROWS_WITH_AS(rate_response(bad, kP, out), doctest::Contains("non-decreasing"), InputError);
  const CoulombHistory ok{{10.0, 20.0}, {0.0, 0.0}};
  const std::vector<double> early = {5.0};
  CHECK_THROWS_AS(rate_response(ok, kP, early), InputError);
  // A step of 1000 Aσ cannot be represented: a numerical error, never inf/NaN in the output.
  const CoulombHistory huge{{0.0, 1.0, 1.0}, {0.0, 0.0, 1000.0 * kP.a_sigma}};
  const std::vector<double> at = {1.0};
  CHECK_THROWS_AS(rate_response(huge, kP, at), NumericalError);
}
