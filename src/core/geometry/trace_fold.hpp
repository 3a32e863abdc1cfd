#pragma once
// A fault trace that folds back on itself: a mapped trace is a line along the fault's surface
// intersection, so a sharp reversal or a crossing is almost always a digitising mistake
// (vertices out of order, two traces joined end to start, a spike), and it would give segments
// whose strikes are meaningless. The fault reader refuses such a trace unless the scenario
// accepts it (docs/gis.md).
//
// Method (this project's own, plain plane geometry on the trace in the working CRS):
// - Turning back: at an interior vertex the direction changes by the angle between the incoming
//   and outgoing edges, turn = atan2(|a × b|, a · b) in [0, π]; more than max_turn_rad
//   (default 150°) is a fold. A straight line turns by 0, a hairpin by π.
// - Crossing itself: two edges that are not neighbours along the trace intersect or touch
//   (orientation tests on coordinates taken relative to the first vertex; a trace whose end
//   returns to its start counts as touching). Edges are compared after sorting them along the
//   longer side of the trace's bounding box, so a typical trace costs about n log n.
// Repeated consecutive vertices are ignored (zero-length edges have no direction).
//
// Accuracy: the orientation tests are in double precision; a crossing or touch closer than
// about 1e-9 of the trace's extent may be missed or found (it is a fold in either case to
// within the mapping's accuracy).
// Valid domain: finite coordinates (split_trace checks them).
#include <cstddef>
#include <numbers>
#include <optional>
#include <string>
#include <vector>

#include "core/geometry/point.hpp"

namespace slipscreen::geometry {

inline constexpr double kMaxTurnRad = 150.0 * std::numbers::pi / 180.0;

struct TraceFold {
  enum class Kind { turns_back, crosses_itself };
  Kind kind = Kind::turns_back;
  // 0-based indices into the vertices given. turns_back: `vertex` is where the trace turns.
  // crosses_itself: the edge starting at `vertex` meets the earlier edge starting at `other_vertex`.
  std::size_t vertex = 0;
  std::size_t other_vertex = 0;
  double turn_rad = 0.0;  // turns_back: the change of direction at the vertex, rad
  Point2 at;              // the turning vertex, or a point where the edges meet
};

// The first fold along the trace: a turn back (first vertex along the trace), else the crossing
// whose later edge comes first along the trace. Nothing for a trace that does not fold.
std::optional<TraceFold> find_fold(const std::vector<Point2>& vertices, double max_turn_rad = kMaxTurnRad);

// The fold in words, vertices counted from 1 as a GIS shows them to a reader, e.g.
// "turns back by 172.4 deg at vertex 3 of 5 (501000, 6120000)".
std::string describe(const TraceFold& fold, std::size_t vertex_count);

}  // namespace slipscreen::geometry
