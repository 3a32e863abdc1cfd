#pragma once
// A point in a projected (map) coordinate system: x = easting, y = northing, in metres.
// The working CRS of a run is always projected with metre units (see formats/gis/crs.hpp), so every
// core computation on positions uses this type. Geographic coordinates never reach the core.
#include <cmath>

namespace slipscreen::geometry {

struct Point2 {
  double x = 0.0;  // easting, m
  double y = 0.0;  // northing, m

  friend bool operator==(const Point2&, const Point2&) = default;
};

// Euclidean distance in the map plane, m.
inline double distance(const Point2& a, const Point2& b) { return std::hypot(b.x - a.x, b.y - a.y); }

// The point a fraction `f` of the way from a to b (f = 0 gives a, f = 1 gives b).
inline Point2 lerp(const Point2& a, const Point2& b, double f) {
  return {a.x + f * (b.x - a.x), a.y + f * (b.y - a.y)};
}

}  // namespace slipscreen::geometry
