#pragma once
// Triggering front of fluid-induced seismicity in the r-t plane.
//
// Source: Shapiro, S. A., Huenges, E. & Borm, G. (1997), "Estimating the crust permeability
//   from fluid-injection-induced seismic emission at the KTB site", Geophys. J. Int. 131,
//   F15-F18:  r = sqrt(4π D t).
//
// Symbol table (code -> paper):
//   diffusivity   D    hydraulic diffusivity, m²/s
//   t             t    time since the start of injection, s
//   radius        r    distance of the triggering front from the injection point, m
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::seismo {

// Shapiro et al. (1997) r = sqrt(4π D t). Valid: D > 0, t >= 0 (r = 0 for t <= 0 is not
// allowed: negative t throws InputError). Exact arithmetic; as physics, the envelope of
// triggering for a point source in a homogeneous isotropic medium.
double front_radius(double diffusivity, double t);

// The diffusivity whose front passes through (r, t): D = r² / (4π t). Valid: r >= 0, t > 0.
double front_diffusivity(double radius, double t);

// One event in the r-t view around a well.
struct RtPoint {
  std::size_t event = 0;   // index into the caller's event list
  double t = 0.0;          // s since injection start
  double r = 0.0;          // m from the well
  double d_fit = 0.0;      // D whose front passes through the point (0 when t == 0)
};

// Points for events at or after `start` (same time axis as `event_times`); distances are given
// (computed by the caller in working coordinates). Events before the start are left out.
std::vector<RtPoint> rt_points(std::span<const double> event_times, std::span<const double> distances,
                               double start);

// Fraction of the given points lying on or inside the front for D (r <= sqrt(4π D t)).
// Returns 0 for no points.
double fraction_inside_front(std::span<const RtPoint> points, double diffusivity);

}  // namespace slipscreen::seismo
