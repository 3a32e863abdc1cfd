#include "core/seismo/epicentral_distance.hpp"

#include <boost/geometry.hpp>
#include <cmath>

namespace slipscreen::seismo {

double epicentral_distance(CoordinateKind kind, double x1, double y1, double x2, double y2) {
  namespace bg = boost::geometry;
  if (kind == CoordinateKind::projected) return std::hypot(x2 - x1, y2 - y1);
  using P = bg::model::point<double, 2, bg::cs::spherical_equatorial<bg::degree>>;
  // Haversine great-circle distance (Boost.Geometry strategy, radius in m).
  return bg::distance(P(x1, y1), P(x2, y2), bg::strategy::distance::haversine<double>(kMeanEarthRadius));
}

}  // namespace slipscreen::seismo
