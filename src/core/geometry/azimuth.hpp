#pragma once
// Azimuths in the map plane and the strike of a fault trace.
//
// Conventions (common practice in structural geology):
// - An azimuth is measured clockwise from north, in radians, in [0, 2π).
// - "North" here is grid north (+y of the projected working CRS). Grid north differs from true
//   north by the meridian convergence of the projection, which grows away from the central
//   meridian (γ ≈ Δλ·sin φ: about 1.5° at 3° of longitude from it at 30° latitude). A strike or SHmax
//   azimuth measured against true north must be corrected by that angle when the difference
//   matters; docs/gis.md states how slipscreen handles it.
// - Strike follows the right-hand rule: the fault dips to the right when looking along strike,
//   so dip direction = strike + π/2.
//
// Symbols: az = azimuth, φs = strike, δ = dip (not used here), dd = dip direction.
#include "core/geometry/point.hpp"

namespace slipscreen::geometry {

// Angle reduced into [0, 2π). Exact for finite inputs up to rounding of fmod.
double normalize_azimuth(double radians);

// Grid azimuth of the direction from a to b: atan2(Δx, Δy) (clockwise from +y), in [0, 2π).
// Throws InputError when a and b coincide (the direction is undefined).
double azimuth(const Point2& a, const Point2& b);

// Strike (right-hand rule) of a trace whose direction of digitising has azimuth `trace_az`,
// given the fault's dip direction `dip_direction` (azimuth, rad). The strike is trace_az or
// trace_az + π, whichever puts the dip direction on its right (within ±π/2 of strike + π/2).
// A dip direction exactly along the trace (±π/2 from both candidates, within 1e-12 rad) is
// ambiguous and throws InputError naming `field`.
double strike_for_dip_direction(double trace_az, double dip_direction, const char* field = "dip_direction");

// Smallest absolute difference between two azimuths, in [0, π].
double azimuth_difference(double a, double b);

}  // namespace slipscreen::geometry
