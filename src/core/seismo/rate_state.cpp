#include "core/seismo/rate_state.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
namespace {

// ln φ(x), φ(x) = (1 - e^-x)/x, stable for all x.
double log_phi(double x) {
  if (std::abs(x) < 1e-6) return -x / 2.0 + x * x / 24.0;
  if (x > 0.0) return std::log(-std::expm1(-x)) - std::log(x);
  if (-x < 700.0) return std::log(std::expm1(-x)) - std::log(-x);
  return -x - std::log(-x);  // e^-x >> 1
}

double log_add_exp(double a, double b) {
  if (a == -std::numeric_limits<double>::infinity()) return b;
  if (b == -std::numeric_limits<double>::infinity()) return a;
  const double hi = std::max(a, b), lo = std::min(a, b);
  return hi + std::log1p(std::exp(lo - hi));
}

// State and cumulative count carried through the history.
struct State {
  double t = 0.0;
  double log_gamma = 0.0;
  double expected = 0.0;
};

// Dieterich (1994) state equation over dt at constant stressing rate s_dot (Pa/s).
void advance(State& st, double dt, double s_dot, const RateStateParameters& p) {
  if (dt <= 0.0) return;
  const double t_a = p.aftershock_duration();
  const double x = s_dot * dt / p.a_sigma;
  const double lg1 = log_add_exp(st.log_gamma - x, std::log(dt / t_a) + log_phi(x));
  st.expected += p.background_rate * t_a * (x + lg1 - st.log_gamma);
  st.log_gamma = lg1;
  st.t += dt;
}

// Dieterich (1994) stress step: γ -> γ exp(-ΔS/Aσ); no events in zero time.
void step(State& st, double ds, const RateStateParameters& p) { st.log_gamma -= ds / p.a_sigma; }

double rate_of(const State& st, const RateStateParameters& p) {
  if (st.log_gamma < -700.0)
    throw NumericalError("rate-and-state: the seismicity rate exceeds e^700 times the background rate at t = " +
                         util::number_text(st.t, 6) + " s (Coulomb stress increase far larger than Aσ = " + util::number_text(p.a_sigma, 6) + " Pa)");
  return p.background_rate * std::exp(-st.log_gamma);
}

}  // namespace

RateStateParameters RateStateParameters::from_aftershock_duration(double background_rate, double a_sigma,
                                                                  double aftershock_duration) {
  if (!(aftershock_duration > 0.0) || !std::isfinite(aftershock_duration))
    throw InputError("aftershock duration t_a", util::number_text(aftershock_duration, 6), "a positive duration such as '10 yr'");
  return {background_rate, a_sigma, a_sigma / aftershock_duration};
}

void validate(const RateStateParameters& p) {
  if (!(p.background_rate > 0.0) || !std::isfinite(p.background_rate))
    throw InputError("background rate r", util::number_text(p.background_rate, 6), "a positive event rate such as '2 1/yr'");
  if (!(p.a_sigma > 0.0) || !std::isfinite(p.a_sigma))
    throw InputError("A sigma", util::number_text(p.a_sigma, 6), "a positive stress such as '0.05 MPa'");
  if (!(p.background_stressing_rate > 0.0) || !std::isfinite(p.background_stressing_rate))
    throw InputError("background stressing rate", util::number_text(p.background_stressing_rate, 6),
                     "a positive stressing rate in Pa/s (or give t_a)");
}

// Dieterich (1994): R/r = 1 / {[exp(-ΔS/Aσ) - 1] exp(-t/t_a) + 1}.
double step_response_rate(const RateStateParameters& p, double stress_step, double t) {
  validate(p);
  if (!(t >= 0.0)) throw InputError("time after step", util::number_text(t, 6), "a time >= 0 s");
  const double u = stress_step / p.a_sigma;
  if (std::abs(u) > 700.0) throw InputError("stress step / A sigma", util::number_text(u, 6), "a magnitude <= 700");
  return p.background_rate / (std::expm1(-u) * std::exp(-t / p.aftershock_duration()) + 1.0);
}

std::vector<RateSample> rate_response(const CoulombHistory& h, const RateStateParameters& p,
                                      std::span<const double> output_times) {
  validate(p);
  if (h.time.empty() || h.time.size() != h.coulomb_change.size())
    throw InputError("Coulomb stress history", std::to_string(h.time.size()) + " times, " +
                         std::to_string(h.coulomb_change.size()) + " values",
                     "at least one sample and one stress change per time");
  for (std::size_t i = 0; i < h.time.size(); ++i) {
    if (!std::isfinite(h.time[i]) || !std::isfinite(h.coulomb_change[i]))
      throw InputError("Coulomb stress history", "sample " + std::to_string(i + 1), "finite times and stresses");
    if (i > 0 && h.time[i] < h.time[i - 1])
      throw InputError("Coulomb stress history time", util::number_text(h.time[i], 6), "non-decreasing times (a repeated time is a step)");
  }
  for (std::size_t k = 0; k < output_times.size(); ++k) {
    if (!std::isfinite(output_times[k]) || output_times[k] < h.time.front() ||
        (k > 0 && output_times[k] < output_times[k - 1]))
      throw InputError("output time", util::number_text(output_times[k], 6),
                       "non-decreasing times at or after the first stress sample " + util::number_text(h.time.front(), 6));
  }
  const double tau_r = p.background_stressing_rate;
  State st{h.time.front(), 0.0, 0.0};
  std::vector<RateSample> out;
  out.reserve(output_times.size());
  std::size_t i = 0;  // current sample: st.t lies in [time[i], time[i+1])
  // Apply steps at the very first time (repeated first samples).
  auto apply_steps_at = [&](std::size_t& j) {
    while (j + 1 < h.time.size() && h.time[j + 1] == h.time[j]) {
      step(st, h.coulomb_change[j + 1] - h.coulomb_change[j], p);
      ++j;
    }
  };
  apply_steps_at(i);
  for (double target : output_times) {
    while (true) {
      const bool last = i + 1 >= h.time.size();
      const double seg_end = last ? std::numeric_limits<double>::infinity() : h.time[i + 1];
      const double s_dot = last ? tau_r
                                : tau_r + (h.coulomb_change[i + 1] - h.coulomb_change[i]) / (h.time[i + 1] - h.time[i]);
      if (target < seg_end) {
        advance(st, target - st.t, s_dot, p);
        break;
      }
      advance(st, seg_end - st.t, s_dot, p);
      st.t = seg_end;  // exact, against accumulated rounding
      ++i;
      apply_steps_at(i);
      if (target == seg_end) break;
    }
    out.push_back({target, rate_of(st, p), st.expected, st.log_gamma});
  }
  return out;
}

}  // namespace slipscreen::seismo
