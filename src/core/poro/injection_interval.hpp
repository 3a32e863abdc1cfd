#pragma once
// Wells as sources of the 3-D poroelastic model: the open interval as Gauss–Legendre points,
// and the superposition of Rudnicki (1986) point sources over those points, over each well's
// rate steps and over wells (poro/rudnicki.hpp). Biot's equations are linear, so
//   Δp(x, t) = Σ_w f_w Σ_i w_i Σ_{t_j < t} Δq_{w,j} · P(x − x_{w,i}, t − t_j)
//   Δσ(x, t) = the same sum of the point-source stress change
// (superposition in time: Earlougher 1977, ch. 2; in space: linearity).
//
// Symbols: f_w rate factor of well w [1], x_{w,i} Gauss–Legendre node i on well w's open
// interval with weight w_i (Σ w_i = 1) [m, NED: z is depth], Δq_{w,j} rate change at t_j
// [m³/s, s], P the unit-rate point response [Pa per m³/s].
//
// Accuracy of the interval quadrature (Gauss–Legendre; Abramowitz & Stegun 1964, 25.4.29): the
// point response along the interval is analytic except at the branch points of
// r = √((z − z0)² + ρ²), z = z0 ± iρ (ρ the horizontal distance, z0 the point's depth), so the
// n-point rule converges like Λ^(−2n), Λ = a' + √(a'² − 1) the Bernstein-ellipse parameter of the
// nearest branch point in units of the half-length (Trefethen 2013, Approximation Theory and
// Approximation Practice, ch. 19). Measured against 64 points (tests/core/poro/
// injection_interval_test.cpp), relative to the largest value: on the interval's axis 10
// half-lengths from its middle (Λ ≈ 20), 4 points: 7e-11; beside the middle one half-length
// from the axis (Λ = 1 + √2), 8 points: 3e-7 (Δp), 2e-6 (Δσ); 100 half-lengths off and 20 below
// (a fault 5 km away and 1 km below a 100 m interval), 1 point (the midpoint rule): 6e-5. A
// vertical interval of zero length is one point source.
//
// Distances below the well radius are clamped to it (the source is singular there, as the
// Theis line source; hydro/theis.hpp), along the same direction (straight down if the point is
// the source itself).
#include <cstddef>
#include <span>
#include <vector>

#include "core/hydro/rate_history.hpp"
#include "core/poro/rudnicki.hpp"

namespace slipscreen::poro {

// Nodes in (−1, 1) ascending and weights (summing to 2) of the n-point Gauss–Legendre rule, by
// Newton's method on the Legendre polynomial (to rounding). n ≥ 1.
void gauss_legendre(int n, std::vector<double>& nodes, std::vector<double>& weights);

struct SourcePoint {
  Eigen::Vector3d position;  // m: x, y in the working CRS, z depth (positive down)
  double weight = 1.0;       // share of the well's rate, Σ = 1 per well
};

// n Gauss–Legendre points on the vertical open interval [top, bottom] (depths, m) at (x, y).
// InputError naming "open interval" unless 0 ≤ top ≤ bottom are finite and n ≥ 1.
std::vector<SourcePoint> open_interval_points(double x, double y, double top, double bottom, int n);

// A well of the 3-D model.
struct InjectionSource {
  std::vector<SourcePoint> points;
  std::vector<hydro::RateChange> changes;  // sorted in time (RateHistory::changes())
  double radius = 0.1;                     // m, distances are clamped to it
};

// Δp and Δσ (compression positive) at point x and time t from every well, each well's rates
// times factors[w] (empty: all 1). Before a well's first change it contributes 0.
PointResponse superposed_response(const RudnickiConstants& k, std::span<const InjectionSource> wells,
                                  const Eigen::Vector3d& x, double t, std::span<const double> factors = {});

// Δp only (cheaper: no tensor).
double superposed_pressure(const RudnickiConstants& k, std::span<const InjectionSource> wells, const Eigen::Vector3d& x,
                           double t, std::span<const double> factors = {});

}  // namespace slipscreen::poro
