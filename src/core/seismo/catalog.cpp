#include "core/seismo/catalog.hpp"

namespace slipscreen::seismo {

std::vector<double> magnitudes(const Catalog& c) {
  std::vector<double> m;
  m.reserve(c.events.size());
  for (const auto& e : c.events) m.push_back(e.magnitude);
  return m;
}

std::vector<double> times(const Catalog& c) {
  std::vector<double> t;
  t.reserve(c.events.size());
  for (const auto& e : c.events) t.push_back(e.time);
  return t;
}

Catalog reprojected(const Catalog& c, const PointTransform& transform, CoordinateKind kind, std::string crs) {
  Catalog out = c;
  out.kind = kind;
  out.crs = std::move(crs);
  for (auto& e : out.events) {
    const auto p = transform(e.x, e.y);
    e.x = p[0];
    e.y = p[1];
  }
  return out;
}

}  // namespace slipscreen::seismo
