#include "core/geometry/trace_segments.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/geometry/azimuth.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::geometry {

double polyline_length(const std::vector<Point2>& vertices) {
  double L = 0.0;
  for (std::size_t i = 1; i < vertices.size(); ++i) L += distance(vertices[i - 1], vertices[i]);
  return L;
}

Point2 point_at_arc_length(const std::vector<Point2>& vertices, double s) {
  if (vertices.empty()) throw InputError("trace", "no vertices", "a polyline with vertices");
  if (s <= 0.0) return vertices.front();
  double walked = 0.0;
  for (std::size_t i = 1; i < vertices.size(); ++i) {
    const double e = distance(vertices[i - 1], vertices[i]);
    if (walked + e >= s && e > 0.0) return lerp(vertices[i - 1], vertices[i], (s - walked) / e);
    walked += e;
  }
  return vertices.back();
}

std::vector<Point2> sub_polyline(const std::vector<Point2>& vertices, double s0, double s1) {
  std::vector<Point2> out{point_at_arc_length(vertices, s0)};
  double walked = 0.0;
  for (std::size_t i = 1; i + 1 < vertices.size(); ++i) {
    walked += distance(vertices[i - 1], vertices[i]);
    if (walked > s0 && walked < s1) out.push_back(vertices[i]);
  }
  out.push_back(point_at_arc_length(vertices, s1));
  return out;
}

std::vector<Point2> check_points(const std::vector<Point2>& vertices, int k) {
  if (k < 1) throw InputError("check_points", std::to_string(k), "at least 1 check point per segment");
  const double L = polyline_length(vertices);
  if (k == 1) return {point_at_arc_length(vertices, 0.5 * L)};
  std::vector<Point2> out;
  out.reserve(static_cast<std::size_t>(k));
  for (int i = 0; i < k; ++i) {
    // Ends are taken exactly, not by interpolation, so neighbouring segments share them.
    if (i == 0) out.push_back(vertices.front());
    else if (i == k - 1) out.push_back(vertices.back());
    else out.push_back(point_at_arc_length(vertices, L * i / (k - 1)));
  }
  return out;
}

std::vector<Point2> straight_trace(Point2 centre, double strike_rad, double length_m) {
  if (!(length_m > 0.0) || !std::isfinite(length_m))
    throw InputError("length", util::number_text(length_m) + " m", "a positive fault length");
  const double hx = 0.5 * length_m * std::sin(strike_rad), hy = 0.5 * length_m * std::cos(strike_rad);
  return {{centre.x - hx, centre.y - hy}, {centre.x + hx, centre.y + hy}};
}

std::string point_text(const Point2& p) {
  std::string s = "(";
  s += util::number_text(p.x, 12);
  s += ", ";
  s += util::number_text(p.y, 12);
  s += ")";
  return s;
}

namespace {

// The trace without repeated consecutive vertices, after checking every coordinate.
std::vector<Point2> distinct_vertices(const std::vector<Point2>& vertices) {
  std::vector<Point2> v;
  v.reserve(vertices.size());
  for (std::size_t i = 0; i < vertices.size(); ++i) {
    const Point2& p = vertices[i];
    const std::string field = "trace vertex " + std::to_string(i + 1);
    if (!std::isfinite(p.x) || !std::isfinite(p.y))
      throw InputError(field, point_text(p), "finite x and y coordinates");
    if (std::abs(p.x) > kMaxCoordinateM || std::abs(p.y) > kMaxCoordinateM)
      throw InputError(field, point_text(p),
                       "projected coordinates within 1e8 m of the origin (no place on Earth is farther)");
    if (v.empty() || !(p == v.back())) v.push_back(p);
  }
  if (v.size() < 2)
    throw InputError("trace", std::to_string(v.size()) + " distinct vertex",
                     "a line with at least two distinct vertices");
  return v;
}

void check_max_length(double max_length_m) {
  if (!(max_length_m > 0.0) || !std::isfinite(max_length_m))
    throw InputError("max_segment_length", util::number_text(max_length_m) + " m", "a positive length");
}

// n = ceil(L / max_length) for a checked trace, bounded before anyone allocates n segments.
std::size_t count_for(double length_m, double max_length_m) {
  if (!(length_m <= kMaxTraceLengthM))
    throw InputError("trace length", util::number_text(length_m, 6) + " m",
                     "a fault trace of at most 1000 km (a longer one is a coordinate typo or the wrong CRS)");
  const double n = std::max(1.0, std::ceil(length_m / max_length_m * (1.0 - 1e-12)));
  if (!(n <= static_cast<double>(kMaxSegmentsPerTrace)))
    throw InputError("max_segment_length", util::number_text(max_length_m, 6) + " m",
                     "a segment length giving at most 100000 segments on a trace of " +
                         util::number_text(length_m, 6) + " m (it gives " + util::number_text(n, 6) + ")");
  return static_cast<std::size_t>(n);
}

}  // namespace

std::size_t segment_count(const std::vector<Point2>& vertices, double max_length_m) {
  check_max_length(max_length_m);
  return count_for(polyline_length(distinct_vertices(vertices)), max_length_m);
}

std::vector<TraceSegment> split_trace(const std::vector<Point2>& vertices, double max_length_m,
                                      int k_check_points) {
  check_max_length(max_length_m);
  if (k_check_points < 1)
    throw InputError("check_points", std::to_string(k_check_points), "at least 1 check point per segment");
  const std::vector<Point2> v = distinct_vertices(vertices);
  const double L = polyline_length(v);
  const std::size_t n = count_for(L, max_length_m);
  std::vector<TraceSegment> out(n);
  for (std::size_t i = 0; i < n; ++i) {
    TraceSegment& s = out[i];
    const double s0 = L * static_cast<double>(i) / static_cast<double>(n);
    const double s1 = (i + 1 == n) ? L : L * static_cast<double>(i + 1) / static_cast<double>(n);
    s.index = i;
    s.vertices = sub_polyline(v, s0, s1);
    // Pieces share their cut points exactly: take the previous piece's end as this start.
    if (i > 0) s.vertices.front() = out[i - 1].end;
    if (i + 1 == n) s.vertices.back() = v.back();
    s.start = s.vertices.front();
    s.end = s.vertices.back();
    s.length_m = polyline_length(s.vertices);
    s.centre = point_at_arc_length(s.vertices, 0.5 * s.length_m);
    s.chord_azimuth_rad = azimuth(s.start, s.end);
    s.check_points = check_points(s.vertices, k_check_points);
  }
  return out;
}

}  // namespace slipscreen::geometry
