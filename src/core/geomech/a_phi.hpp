#pragma once
// Simpson's A_φ: one number in [0, 3] for the faulting regime and the shape of the stress
// ellipsoid, and the horizontal stresses it implies at frictional equilibrium.
//
// Sources:
//   φ = (S2 − S3)/(S1 − S3);  A_φ = (n + 0.5) + (−1)^n (φ − 0.5),  n = 0 normal, 1 strike-slip,
//   2 reverse                                           Simpson (1997), JGR 102(B8), 17909–17919
//   (S1 − p)/(S3 − p) = [√(μ²+1) + μ]² (frictional equilibrium)   Zoback (2007) ch. 4
//
// Symbol table (code -> literature):
//   a_phi     A_φ   [0, 3]: 0–1 normal, 1–2 strike-slip, 2–3 reverse faulting
//   phi       φ     stress shape ratio, [0, 1]
//   n         n     0, 1, 2 (regime index)
//   sv, shmax, shmin, p0   Sv, SHmax, Shmin, Pp   Pa
//   mu        μ     friction of the optimally oriented faults
#include "core/geomech/stress_state.hpp"

namespace slipscreen::geomech {

// Throws InputError("A_phi", ...) unless 0 ≤ A_φ ≤ 3.
void check_a_phi(double a_phi);

// Magnitudes → A_φ (Simpson 1997). Domain: SHmax ≥ Shmin, S1 > S3 (InputError otherwise).
// Exact up to rounding. Continuous across the regime boundaries: A_φ = 1 where SHmax = Sv,
// A_φ = 2 where Shmin = Sv.
double a_phi(double sv, double shmax, double shmin);

// The regime of an A_φ value: [0, 1] normal, (1, 2) strike-slip, [2, 3] reverse.
FaultingRegime regime_of_a_phi(double a_phi);

// A_φ → magnitudes with S1 and S3 at frictional equilibrium for μ (Zoback 2007 ch. 4):
//   normal:      S1 = Sv, S3 = Shmin = p0 + (Sv − p0)/Q, SHmax = S3 + φ (S1 − S3)
//   strike-slip: S2 = Sv, Shmin − p0 = (Sv − p0)/(1 + φ (Q − 1)), SHmax − p0 = Q (Shmin − p0)
//   reverse:     S3 = Sv, S1 = SHmax = p0 + Q (Sv − p0), Shmin = S3 + φ (S1 − S3)
// with Q = [√(μ²+1)+μ]². Exact inverse of a_phi() (rounding only). Domain: 0 ≤ A_φ ≤ 3,
// μ > 0, Sv > p0 ≥ 0 (InputError otherwise).
HorizontalStresses horizontal_stresses_from_a_phi(double a_phi, double sv, double p0, double mu);

}  // namespace slipscreen::geomech
