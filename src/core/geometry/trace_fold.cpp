#include "core/geometry/trace_fold.hpp"

#include <algorithm>
#include <cmath>

#include "core/geometry/trace_segments.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::geometry {

namespace {

double cross(double ax, double ay, double bx, double by) { return ax * by - ay * bx; }

// Sign of the turn a -> b -> c: > 0 left, < 0 right, 0 collinear.
double orient(const Point2& a, const Point2& b, const Point2& c) {
  return cross(b.x - a.x, b.y - a.y, c.x - a.x, c.y - a.y);
}

bool within(const Point2& a, const Point2& b, const Point2& p) {  // p collinear with a-b
  return std::min(a.x, b.x) <= p.x && p.x <= std::max(a.x, b.x) && std::min(a.y, b.y) <= p.y &&
         p.y <= std::max(a.y, b.y);
}

// Where the closed segments p1-p2 and q1-q2 meet, if they do.
std::optional<Point2> meet(const Point2& p1, const Point2& p2, const Point2& q1, const Point2& q2) {
  const double d1 = orient(q1, q2, p1), d2 = orient(q1, q2, p2);
  const double d3 = orient(p1, p2, q1), d4 = orient(p1, p2, q2);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0)))
    return lerp(p1, p2, d1 / (d1 - d2));
  if (d1 == 0 && within(q1, q2, p1)) return p1;
  if (d2 == 0 && within(q1, q2, p2)) return p2;
  if (d3 == 0 && within(p1, p2, q1)) return q1;
  if (d4 == 0 && within(p1, p2, q2)) return q2;
  return std::nullopt;
}

struct Trace {
  std::vector<Point2> v;           // distinct consecutive vertices, relative to the first
  std::vector<std::size_t> index;  // their indices in the vertices given
  Point2 origin;
};

Trace distinct(const std::vector<Point2>& vertices) {
  Trace t;
  if (vertices.empty()) return t;
  t.origin = vertices.front();
  for (std::size_t i = 0; i < vertices.size(); ++i) {
    const Point2 p{vertices[i].x - t.origin.x, vertices[i].y - t.origin.y};
    if (!t.v.empty() && p == t.v.back()) continue;
    t.v.push_back(p);
    t.index.push_back(i);
  }
  return t;
}

std::optional<TraceFold> turn_back(const Trace& t, double max_turn_rad) {
  for (std::size_t k = 1; k + 1 < t.v.size(); ++k) {
    const double ax = t.v[k].x - t.v[k - 1].x, ay = t.v[k].y - t.v[k - 1].y;
    const double bx = t.v[k + 1].x - t.v[k].x, by = t.v[k + 1].y - t.v[k].y;
    const double turn = std::atan2(std::abs(cross(ax, ay, bx, by)), ax * bx + ay * by);
    if (turn > max_turn_rad) {
      TraceFold f;
      f.kind = TraceFold::Kind::turns_back;
      f.vertex = t.index[k];
      f.turn_rad = turn;
      f.at = {t.v[k].x + t.origin.x, t.v[k].y + t.origin.y};
      return f;
    }
  }
  return std::nullopt;
}

std::optional<TraceFold> crossing(const Trace& t) {
  const std::size_t edges = t.v.size() < 2 ? 0 : t.v.size() - 1;
  double xmin = 0, xmax = 0, ymin = 0, ymax = 0;
  for (const Point2& p : t.v)
    xmin = std::min(xmin, p.x), xmax = std::max(xmax, p.x), ymin = std::min(ymin, p.y), ymax = std::max(ymax, p.y);
  const bool along_x = xmax - xmin >= ymax - ymin;
  const auto lo = [&](std::size_t e, bool x) { return x ? std::min(t.v[e].x, t.v[e + 1].x) : std::min(t.v[e].y, t.v[e + 1].y); };
  const auto hi = [&](std::size_t e, bool x) { return x ? std::max(t.v[e].x, t.v[e + 1].x) : std::max(t.v[e].y, t.v[e + 1].y); };
  std::vector<std::size_t> order(edges);
  for (std::size_t e = 0; e < edges; ++e) order[e] = e;
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return lo(a, along_x) < lo(b, along_x) || (lo(a, along_x) == lo(b, along_x) && a < b);
  });

  std::optional<TraceFold> first;
  for (std::size_t a = 0; a < order.size(); ++a) {
    for (std::size_t b = a + 1; b < order.size() && lo(order[b], along_x) <= hi(order[a], along_x); ++b) {
      const std::size_t e1 = std::min(order[a], order[b]), e2 = std::max(order[a], order[b]);
      if (e2 - e1 < 2) continue;  // neighbours share a vertex; a reversal between them is a turn back
      if (lo(e1, !along_x) > hi(e2, !along_x) || lo(e2, !along_x) > hi(e1, !along_x)) continue;
      if (first && t.index[e2] >= first->vertex) continue;
      if (const auto p = meet(t.v[e1], t.v[e1 + 1], t.v[e2], t.v[e2 + 1])) {
        TraceFold f;
        f.kind = TraceFold::Kind::crosses_itself;
        f.vertex = t.index[e2];
        f.other_vertex = t.index[e1];
        f.at = {p->x + t.origin.x, p->y + t.origin.y};
        first = f;
      }
    }
  }
  return first;
}

}  // namespace

std::optional<TraceFold> find_fold(const std::vector<Point2>& vertices, double max_turn_rad) {
  const Trace t = distinct(vertices);
  if (auto f = turn_back(t, max_turn_rad)) return f;
  return crossing(t);
}

std::string describe(const TraceFold& f, std::size_t vertex_count) {
  const std::string of = " of " + std::to_string(vertex_count);
  if (f.kind == TraceFold::Kind::turns_back)
    return "turns back by " + util::number_text(f.turn_rad * 180.0 / std::numbers::pi, 4) + " deg at vertex " +
           std::to_string(f.vertex + 1) + of + " " + point_text(f.at);
  return "crosses itself: the edge from vertex " + std::to_string(f.vertex + 1) + of +
         " meets the edge from vertex " + std::to_string(f.other_vertex + 1) + " at " + point_text(f.at);
}

}  // namespace slipscreen::geometry
