#pragma once
// The leaky well function of Hantush & Jacob (1955) and the leakage factor B.
//
// Sources:
//   W(u, β) = ∫_u^∞ exp(−y − β²/(4y))/y dy, β = r/B       Hantush & Jacob (1955), Trans. AGU 36(1)
//   s = Q/(4πT) W(u, r/B), u = r²S/(4Tt); in pressure: Δp = q μ/(4π k h) W(r²/(4Dt), r/B)
//   B = √(T b'/K') = √(k h b'/k')                          Hantush & Jacob (1955); Hantush (1956)
//   W(0, β) = 2 K0(β) (steady state)                       Hantush & Jacob (1955) (Jacob 1946)
//   W(u, β) = 2 K0(β) − W(β²/(4u), β)                      substitution y → β²/(4y) in the integral
//   W(u, 0) = E1(u) (Theis 1935)
//
// Symbol table (code -> paper): u u, beta β = r/B, leakage_factor B [m], aquitard_thickness b'
// [m], aquitard_permeability k' [m²], permeability k [m²], thickness h [m], transmissivity T
// [m²/s], aquitard_conductivity K' [m/s], K0 the modified Bessel function of the second kind.
//
// The model: a confined formation overlain (or underlain) by an aquitard of thickness b' and
// vertical permeability k' with a constant head beyond it; flow in the aquitard is vertical and
// its storage neglected (Hantush & Jacob 1955). The leakage caps the far-field pressure rise at
// the steady 2K0(r/B) profile. B → ∞ (an impervious aquitard) is Theis.
//
// Method (the project's own): for u ≥ β/2, the substitution y = u e^t gives
//   W = ∫_0^T exp(−u e^t − (β²/(4u)) e^(−t)) dt,
// whose integrand is smooth, at most 1 and, because β²/(4u) ≤ u there, decreasing on t ≥ 0; T
// is chosen so that the integrand has fallen below e^(−48) of its value at 0 (u (e^T + e^(−T) − 2)
// ≥ 48, so the tail is below 1e-20 of W). The integral is taken by tanh-sinh (double-exponential)
// quadrature (Boost.Math; Takahasi & Mori 1974) with a relative tolerance of 1e-14: the
// integrand is analytic, so the levels converge double-exponentially (at most about 500
// integrand values; 61-point Gauss–Kronrod was tried and its error estimate stalled on
// rounding for u ≳ 250, refining to thousands of panels). For u < β/2 the
// reflection 2K0(β) − W(β²/(4u), β) is used (K0 from Boost.Math): there W ≥ K0(β) ≥ the
// subtracted term, so the subtraction loses at most one bit. β = 0 returns E1 (well_function.hpp).
// Where c = β²/(4u) ≤ 1e-4 (a nearly impervious aquitard, or early times) the series
// W = Σ_n (−c)^n/n! E_{n+1}(u) (expanding exp(−β²/(4y)) under the integral) is summed to four
// terms with E_{n+1} = (e^−u − u E_n)/n: the remainder is below c⁴/24 · E1 ≤ 5e-18 E1, and the
// recurrence's growth of rounding (about u per step) is multiplied by c^n, so this path is as
// accurate as E1 itself and costs two exponentials and one E1.
//
// Accuracy: ≤ 1e-12 relative against scipy.integrate.quad of the defining integral (run at test
// time; observed 2.8e-14) over 1e-10 ≤ u ≤ 500 and 1e-6 ≤ β ≤ 20; W(u, β) equals E1(u) within
// 1e-10 relative for β ≤ 1e-8 and 1e-6 ≤ u ≤ 700 (observed 1.9e-12, which is the true
// difference, about β²/(4u) · E2(u)/E1(u), at u = 1e-6); W(1e-12, β) equals 2K0(β) to 1e-12. Cost: a few hundred exponentials per value, ~1e6 values per second
// (bench/e1_bench prints it beside E1's); one to two orders of magnitude above E1.
//
// Domain and end behaviour: u = 0 -> 2K0(β) (+∞ when β = 0); u > kWellFunctionUnderflow -> 0
// (W ≤ E1(u)); β ≥ 0 finite; u < 0, β < 0 or NaN -> NaN.
namespace slipscreen::hydro {

// W(u, β) as above.
double leaky_well_function(double u, double beta);

// B = √(k h b'/k') in metres, for a formation of permeability k and thickness h below (or above)
// an aquitard of thickness b' and vertical permeability k' (the fluid's viscosity and density
// cancel: T/K' = k h/k'). InputError naming the field unless each is finite and positive.
double leakage_factor(double permeability, double thickness, double aquitard_thickness, double aquitard_permeability);

}  // namespace slipscreen::hydro
