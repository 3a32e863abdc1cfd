#include "core/seismo/nearest_fault.hpp"

#include <boost/geometry.hpp>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::seismo {

std::vector<NearestFault> nearest_faults(const Catalog& catalog, const std::vector<FaultTrace>& traces) {
  namespace bg = boost::geometry;
  using Point = bg::model::d2::point_xy<double>;
  using Line = bg::model::linestring<Point>;
  if (catalog.kind != CoordinateKind::projected)
    throw InputError("catalog coordinates", catalog.crs, "projected working coordinates (reproject the catalog first)");
  if (traces.empty()) throw InputError("fault traces", "none", "at least one fault trace");
  std::vector<Line> lines;
  for (std::size_t i = 0; i < traces.size(); ++i) {
    if (traces[i].size() < 2)
      throw InputError("fault trace " + std::to_string(i + 1), std::to_string(traces[i].size()) + " vertices",
                       "at least 2 vertices");
    Line l;
    for (const auto& v : traces[i]) bg::append(l, Point(v[0], v[1]));
    lines.push_back(std::move(l));
  }
  std::vector<NearestFault> out;
  out.reserve(catalog.events.size());
  for (const auto& e : catalog.events) {
    NearestFault best;
    const Point p(e.x, e.y);
    for (std::size_t i = 0; i < lines.size(); ++i) {
      const double d = bg::distance(p, lines[i]);
      if (d < best.distance) best = {i, d};
    }
    out.push_back(best);
  }
  return out;
}

}  // namespace slipscreen::seismo
