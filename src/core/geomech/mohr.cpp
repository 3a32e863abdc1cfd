#include "core/geomech/mohr.hpp"

#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"

namespace slipscreen::geomech {

MohrDiagram mohr_diagram(const Eigen::Matrix3d& stress, double p, std::span<const FaultPlane> planes,
                         const Friction& f) {
  check(f);
  const auto ps = principal_stresses(stress);
  const double s1 = ps.values(0), s2 = ps.values(1), s3 = ps.values(2);
  const auto circle = [p](double a, double b) { return MohrCircle{0.5 * (a + b) - p, 0.5 * (a - b)}; };
  MohrDiagram d{{circle(s1, s3), circle(s1, s2), circle(s2, s3)}, {}, f.mu, f.cohesion};
  d.points.reserve(planes.size());
  for (const auto& plane : planes) {
    const NormalShear r = resolve_normal(stress, plane.normal());
    d.points.push_back({r.normal_stress - p, r.shear_stress});
  }
  return d;
}

}  // namespace slipscreen::geomech
