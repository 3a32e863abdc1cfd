#pragma once
// Splitting a fault trace (a polyline in the working CRS) into straight-ish segments of bounded
// length, each with its own strike and a stated number of check points.
//
// Method (this project's own, plain arc-length geometry):
// - The trace of length L (sum of its edge lengths) is cut into n = ceil(L / max_length) pieces
//   of equal arc length L/n, so no piece is longer than max_length and pieces of one trace are
//   equal. Cut points are interpolated on the edges; interior vertices of the trace stay in the
//   piece they fall in, so a piece follows the mapped trace exactly.
// - A segment's strike is the grid azimuth of its chord (first to last point), i.e. the mean
//   direction of a bent piece. Dip direction or the right-hand rule then fixes the sense (see
//   azimuth.hpp); this file reports the chord azimuth only.
// - Check points: k points at equal arc length along the piece, both ends included for k ≥ 2
//   (fractions i/(k−1)); the arc-length midpoint for k = 1. Δp is evaluated at each and the
//   maximum is used, so for one well the miss is bounded by the spacing L/(n(k−1)).
//
// Accuracy: positions are exact to rounding (a few ulp of the coordinates, ~1e-9 m at 1e6 m
// coordinates); lengths are sums of edge lengths (relative rounding ~1e-15 per edge).
// Valid domain: finite coordinates, at least two distinct vertices, max_length > 0, k ≥ 1, and
// the plausibility bounds below (checked before anything is allocated, so a typo cannot ask
// for gigabytes).
//
// Plausibility bounds (this project's own, docs/gis.md):
// - |x|, |y| ≤ 1e8 m: no projected coordinate on Earth is larger (the equator is 4.0e7 m long,
//   false eastings and northings are at most a few 1e7 m; common practice).
// - trace length ≤ 1,000 km: longer than any fault a basin-scale screening maps (the longest
//   continental strike-slip faults are of that order; common practice).
// - at most 100,000 segments per trace (1,000 km at 10 m segments).
#include <cstddef>
#include <string>
#include <vector>

#include "core/geometry/point.hpp"

namespace slipscreen::geometry {

inline constexpr double kMaxCoordinateM = 1.0e8;
inline constexpr double kMaxTraceLengthM = 1.0e6;
inline constexpr std::size_t kMaxSegmentsPerTrace = 100000;

struct TraceSegment {
  std::size_t index = 0;            // 0-based position along its trace
  std::vector<Point2> vertices;     // the piece of the trace, first = start, last = end
  Point2 start, end;                // end points (= vertices.front(), vertices.back())
  Point2 centre;                    // point at half the arc length of the piece
  double length_m = 0.0;            // arc length along the trace, m
  double chord_azimuth_rad = 0.0;   // grid azimuth start -> end, clockwise from north, [0, 2π)
  std::vector<Point2> check_points; // where Δp is evaluated; the maximum is used
};

// "(x, y)" with 12 significant digits, for messages ("(501000, 6120000)", "(1e+308, 0)", "(nan, 1)").
std::string point_text(const Point2& p);

// Total length of a polyline, m (sum of edge lengths).
double polyline_length(const std::vector<Point2>& vertices);

// The point at arc length s along the polyline (s clamped into [0, L]).
Point2 point_at_arc_length(const std::vector<Point2>& vertices, double s);

// Sub-polyline between arc lengths s0 < s1 (interpolated ends plus the vertices in between).
std::vector<Point2> sub_polyline(const std::vector<Point2>& vertices, double s0, double s1);

// k check points along a polyline, as described above.
std::vector<Point2> check_points(const std::vector<Point2>& vertices, int k);

// A straight trace of `length_m` centred on `centre` with grid azimuth `strike_rad` (for fault
// tables that give centre, strike and length): {centre − ½L·u, centre + ½L·u},
// u = (sin strike, cos strike). Digitised along strike, so the right-hand rule holds.
// Throws InputError for a non-positive or non-finite length.
std::vector<Point2> straight_trace(Point2 centre, double strike_rad, double length_m);

// The number of segments split_trace cuts the trace into, n = ceil(L / max_length_m), after
// the checks split_trace makes (below); nothing is allocated. For a reader that bounds a whole
// map's segment count before splitting.
std::size_t segment_count(const std::vector<Point2>& vertices, double max_length_m);

// Split a trace into segments of at most `max_length_m`, each with `k_check_points` check
// points. Repeated consecutive vertices are dropped first. Throws InputError when the trace has
// fewer than two distinct vertices, a non-finite coordinate or one beyond kMaxCoordinateM (the
// message names the vertex, counting from 1), a length beyond kMaxTraceLengthM, more than
// kMaxSegmentsPerTrace segments, max_length_m ≤ 0 or k < 1.
std::vector<TraceSegment> split_trace(const std::vector<Point2>& vertices, double max_length_m,
                                      int k_check_points);

}  // namespace slipscreen::geometry
