// The deterministic screen of faults in depth; see fault_screen.hpp.
#include "core/poro/fault_screen.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <limits>
#include <numbers>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::poro {

CoulombChange coulomb_change(const Eigen::Matrix3d& dstress, double dp, const Eigen::Vector3d& n,
                             const Eigen::Vector3d& slip, double mu) {
  CoulombChange c;
  c.dtau = -slip.dot(dstress * n);  // u · (ΔS n_d), n_d = −n
  c.dsigma_n = n.dot(dstress * n);
  c.dp = dp;
  c.dcff = c.dtau - mu * (c.dsigma_n - dp);
  return c;
}

std::vector<Eigen::Vector3d> depth_check_points(const std::vector<Eigen::Vector2d>& trace_points, double strike,
                                                double dip, double reference_depth, double top, double bottom,
                                                int levels) {
  if (!(std::isfinite(top) && std::isfinite(bottom) && top >= 0.0 && bottom >= top) || levels < 1)
    throw InputError("fault depth range", util::number_text(top) + " to " + util::number_text(bottom),
                     "finite depths with 0 <= top <= bottom (m) and at least one level");
  const double min_dip = std::numbers::pi / 180.0;
  if (bottom > top && !(dip >= min_dip))
    throw InputError("dip", util::number_text(dip * 180.0 / std::numbers::pi),
                     "at least 1 degree for a fault with a depth range");
  // horizontal dip direction (strike + 90°) in (north, east)
  const Eigen::Vector2d down_dip(-std::sin(strike), std::cos(strike));
  std::vector<Eigen::Vector3d> out;
  for (const Eigen::Vector2d& p : trace_points)
    for (int i = 0; i < levels; ++i) {
      const double z = levels == 1 ? 0.5 * (top + bottom) : top + (bottom - top) * i / (levels - 1.0);
      const double offset = z == reference_depth ? 0.0 : (z - reference_depth) / std::tan(dip);
      const Eigen::Vector2d h = p + offset * down_dip;
      out.emplace_back(h.x(), h.y(), z);
    }
  return out;
}

namespace {

struct PointSetup {
  Eigen::Vector3d n, slip;
  double dp_crit = 0;
};

// The plane's normal, background slip direction and Δp_crit at each point of a segment.
std::vector<PointSetup> setup(const DepthSegment& s, const geomech::Friction& f) {
  const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(s.strike, s.dip);
  std::vector<PointSetup> out;
  for (const DepthCheckPoint& p : s.points) {
    geomech::check(p.stress);
    const geomech::ResolvedStress r =
        geomech::resolve(geomech::stress_tensor_ned(p.stress), p.stress.pore_pressure, plane);
    PointSetup ps;
    ps.n = plane.normal();
    ps.slip = r.slip_direction;  // zero without shear: Δτ = 0 there
    ps.dp_crit = geomech::critical_pressure(r.shear_stress, r.normal_stress, p.stress.pore_pressure, f).dp;
    out.push_back(ps);
  }
  return out;
}

}  // namespace

DepthScreenResult depth_screen(const DepthScreenInputs& in) {
  geomech::check(in.friction);
  for (std::size_t i = 1; i < in.output_times.size(); ++i)
    if (!(in.output_times[i] > in.output_times[i - 1]))
      throw InputError("output times", util::number_text(in.output_times[i]), "strictly increasing times");
  DepthScreenResult res;
  std::set_union(in.tracking_times.begin(), in.tracking_times.end(), in.output_times.begin(), in.output_times.end(),
                 std::back_inserter(res.tracked_times));
  res.tracked_times.erase(std::unique(res.tracked_times.begin(), res.tracked_times.end()), res.tracked_times.end());
  // every input checked before any computing
  std::vector<std::vector<PointSetup>> setups;
  std::vector<geomech::Friction> frictions;
  for (const DepthSegment& s : in.segments) {
    if (s.points.empty()) throw InputError("check points", "0", "at least one check point on segment '" + s.segment_id + "'");
    geomech::Friction f = in.friction;
    if (s.friction) f.mu = *s.friction;
    geomech::check(f);
    setups.push_back(setup(s, f));
    frictions.push_back(f);
  }
  for (std::size_t g = 0; g < in.segments.size(); ++g) {
    const DepthSegment& s = in.segments[g];
    const geomech::Friction& f = frictions[g];
    const std::vector<PointSetup>& ps = setups[g];
    DepthSegmentScreen out;
    out.friction = f.mu;
    for (const PointSetup& p : ps) {
      out.dp_crit.push_back(p.dp_crit);
      if (p.dp_crit <= 0.0) out.already_critical = true;
    }
    // ΔCFF − μΔp_crit at every point: the point with the largest is the closest to failure
    const auto evaluate = [&](double t, std::size_t& best, CoulombChange& at) {
      double best_margin = -std::numeric_limits<double>::infinity();
      for (std::size_t i = 0; i < ps.size(); ++i) {
        const PointResponse r = superposed_response(in.medium, in.wells, s.points[i].position, t);
        const CoulombChange c = coulomb_change(r.dstress, r.dp, ps[i].n, ps[i].slip, f.mu);
        const double margin = c.dcff - f.mu * ps[i].dp_crit;
        if (margin > best_margin) {
          best_margin = margin;
          best = i;
          at = c;
        }
        if (c.dcff > out.peak_dcff) {
          out.peak_dcff = c.dcff;
          out.peak_time = t;
        }
      }
      return best_margin;
    };
    for (double t : res.tracked_times) {
      std::size_t best = 0;
      CoulombChange at;
      const double margin = evaluate(t, best, at);
      if (!out.already_critical && !out.first_crossing && margin >= 0.0) {
        out.first_crossing = t;
        out.crossing_point = best;
        out.crossing_change = at;
      }
      if (std::binary_search(in.output_times.begin(), in.output_times.end(), t)) {
        out.point.push_back(best);
        out.change.push_back(at);
      }
    }
    res.segments.push_back(std::move(out));
  }
  return res;
}

}  // namespace slipscreen::poro
