#pragma once
// Seismicity-rate response of a population of rate-and-state faults to a Coulomb stress history.
//
// Source: Dieterich, J. (1994), "A constitutive law for rate of earthquake production and its
//   application to earthquake clustering", JGR 99(B2), 2601-2618:
//     R = r / (γ τ̇_r)                        seismicity rate
//     dγ = (1/(Aσ)) [dt - γ dS]             state evolution, S the Coulomb stress
//     γ0 = 1/τ̇_r                            steady state under background stressing
//     step ΔS:  γ -> γ exp(-ΔS/(Aσ))
//     after a step at constant τ̇_r:  R/r = 1 / {[exp(-ΔS/(Aσ)) - 1] exp(-t/t_a) + 1},
//     t_a = Aσ / τ̇_r                        aftershock duration
//
// Symbol table (code -> paper):
//   background_rate             r      background seismicity rate, events/s
//   a_sigma                     Aσ     constitutive parameter A times normal stress, Pa
//   background_stressing_rate   τ̇_r    background (tectonic) Coulomb stressing rate, Pa/s
//   aftershock_duration         t_a    Aσ / τ̇_r, s
//   coulomb_change              S - τ̇_r t   Coulomb stress change from injection, Pa
//   gamma_hat                   γ τ̇_r  normalised state (1 at steady state), so R = r / γ̂
//
// The modelled stress is S(t) = τ̇_r (t - t0) + ΔCFF(t): background stressing plus the
// injection-induced Coulomb stress change, with Aσ held constant (the usual Coulomb-stress
// form; Dieterich's normal-stress term in γ is not included).
//
// Integration: ΔCFF is piecewise linear between samples (a repeated time is a step). On each
// piece the stressing rate Ṡ is constant and the state equation has the exact solution
//   γ̂1 = γ̂0 exp(-x) + (Δt/t_a) φ(x),  x = Ṡ Δt / Aσ,  φ(x) = (1 - exp(-x))/x  (φ(0) = 1),
// evaluated in logarithms so that large steps neither overflow nor underflow. The expected
// number of events follows from the state equation itself (dt/γ = Aσ dγ/γ + dS):
//   N(t0, t1) = r t_a [ (S(t1) - S(t0))/Aσ + ln γ̂(t1) - ln γ̂(t0) ],
// exact for any history. So the integrator is exact (to rounding) for piecewise-linear ΔCFF,
// including the closed-form step response.
#include <span>
#include <vector>

namespace slipscreen::seismo {

struct RateStateParameters {
  double background_rate = 0.0;            // r, events/s (> 0)
  double a_sigma = 0.0;                    // Aσ, Pa (> 0)
  double background_stressing_rate = 0.0;  // τ̇_r, Pa/s (> 0)

  // Build from t_a instead of τ̇_r: τ̇_r = Aσ / t_a.
  static RateStateParameters from_aftershock_duration(double background_rate, double a_sigma,
                                                      double aftershock_duration);
  double aftershock_duration() const { return a_sigma / background_stressing_rate; }
};

// Throws InputError unless r, Aσ and τ̇_r are finite and positive.
void validate(const RateStateParameters& p);

// Dieterich (1994) closed form: rate t seconds after a Coulomb stress step ΔS applied to a
// population at steady state under constant τ̇_r. Valid: t >= 0, |ΔS/Aσ| <= 700. Exact.
double step_response_rate(const RateStateParameters& p, double stress_step, double t);

// Coulomb stress change history ΔCFF(t): times in s (non-decreasing; a repeated time is a
// step), changes in Pa. Before the first sample the population is at steady state; after the
// last sample ΔCFF stays at its last value (background stressing continues).
struct CoulombHistory {
  std::vector<double> time;            // s
  std::vector<double> coulomb_change;  // Pa
};

struct RateSample {
  double t = 0.0;          // s
  double rate = 0.0;       // R, events/s
  double expected = 0.0;   // expected events from the first history time to t
  double log_gamma = 0.0;  // ln γ̂ (0 at steady state)
};

// Rate and cumulative expected count at each output time (non-decreasing, >= the first
// history time). At a step time the value just after the step is reported. Valid domain:
// the history must keep ln γ̂ above -700 (rates up to e^700 r); beyond that NumericalError.
// Accuracy: exact to rounding for piecewise-linear ΔCFF (relative error ~1e-12 in tests).
// Throws InputError for unsorted or non-finite inputs.
std::vector<RateSample> rate_response(const CoulombHistory& history, const RateStateParameters& p,
                                      std::span<const double> output_times);

}  // namespace slipscreen::seismo
