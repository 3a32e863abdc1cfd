#pragma once
// Distance between two epicentres given in the catalog's coordinates.
//
// Sources: projected coordinates — Euclidean distance in the plane of the CRS (exact in that
//   CRS; true ground distance differs by the projection's scale error). Geographic
//   coordinates — haversine great-circle distance on a sphere of the IUGG mean Earth radius
//   R1 = 6371008.8 m (Moritz 2000, "Geodetic Reference System 1980", J. Geodesy 74), computed
//   with Boost.Geometry's haversine strategy.
//
// Symbol table: x, y — longitude/latitude in degrees or easting/northing in m; result in m.
#include "core/seismo/catalog.hpp"

namespace slipscreen::seismo {

inline constexpr double kMeanEarthRadius = 6371008.8;  // m, IUGG R1

// Accuracy: projected exact in the CRS plane; geographic within about 0.5 % of the WGS84
// ellipsoidal (geodesic) distance (sphere vs ellipsoid), adequate for buffers and r-t views.
double epicentral_distance(CoordinateKind kind, double x1, double y1, double x2, double y2);

}  // namespace slipscreen::seismo
