// The deterministic screen of faults in depth; see depth_screen.hpp.
#include "screening/depth_screen.hpp"

#include <cmath>
#include <map>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::screening {

DepthRange depth_range(const scenario::RegionSpec& region, const formats::FaultSegment& seg) {
  DepthRange r;
  if (seg.top_m && seg.bottom_m) {
    r.top = *seg.top_m, r.bottom = *seg.bottom_m;
  } else if (!std::isnan(region.faults.top)) {
    r.top = region.faults.top, r.bottom = region.faults.bottom;
  } else {
    r.top = r.bottom = region.reference_depth;
  }
  r.levels = r.bottom > r.top ? region.faults.depth_levels : 1;
  return r;
}

std::optional<DepthScreen> depth_screen(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const scenario::RegionSpec& region = s.region;
  if (!region.formation.poroelastic_3d) return std::nullopt;
  poro::DepthScreenInputs in;
  try {
    in.medium = poro::rudnicki_constants(scenario::poroelastic_medium_of(region.formation));
  } catch (const InputError& e) {
    throw e.located(region.file + " [formation]");
  }
  in.friction = p.inputs.friction;
  in.output_times = p.inputs.output_times;
  in.tracking_times = p.inputs.tracking_times;
  // Frame of core/poro/fault_screen.hpp: (grid north, grid east, depth) = (y, x, z).
  for (std::size_t w = 0; w < p.wells.size(); ++w) {
    const scenario::WellSpec& spec = p.wells[w];
    const screen::ScreenWell& sw = p.inputs.wells[w];
    poro::InjectionSource src;
    try {
      src.points = poro::open_interval_points(sw.y, sw.x, spec.top, spec.bottom, kIntervalPoints);
    } catch (const InputError& e) {
      throw e.located(spec.source + " (well '" + spec.id + "')");
    }
    src.changes = sw.history.changes();
    src.radius = sw.radius;
    in.wells.push_back(std::move(src));
  }
  const double zref = region.reference_depth;
  // the in-situ stress at each depth level of a range, from the region's own description (one
  // set per distinct range: the region's [faults] top..bottom, or a fault's own)
  std::map<std::pair<double, double>, std::vector<geomech::AndersonianStress>> stress_by_range;
  const auto stress_at = [&](double top, double bottom, int levels) -> const std::vector<geomech::AndersonianStress>& {
    auto [it, fresh] = stress_by_range.try_emplace({top, bottom});
    if (fresh)
      for (int i = 0; i < levels; ++i) {
        scenario::RegionSpec at = region;
        at.reference_depth = levels == 1 ? 0.5 * (top + bottom) : top + (bottom - top) * i / (levels - 1.0);
        it->second.push_back(stress_at_reference_depth(at));
      }
    return it->second;
  };
  DepthScreen out;
  for (std::size_t g = 0; g < p.segments.size(); ++g) {
    const formats::FaultSegment& seg = p.segments[g];
    // the fault's own depth range (attributes top, bottom) over the region's [faults] top..bottom
    const DepthRange dr = depth_range(region, seg);
    const double top = dr.top, bottom = dr.bottom;
    const int levels = dr.levels;
    const std::vector<geomech::AndersonianStress>& stress = stress_at(top, bottom, levels);
    const screen::ScreenSegment& ss = p.inputs.segments[g];
    // strikes in the screen are true azimuths (grid azimuth less the meridian convergence): the
    // stress's SHmax azimuth goes to the grid frame by the same convergence
    const double convergence = seg.strike_rad - ss.strike;
    std::vector<Eigen::Vector2d> trace;
    for (const auto& q : ss.check_points) trace.emplace_back(q.y, q.x);
    std::vector<Eigen::Vector3d> pts;
    try {
      pts = poro::depth_check_points(trace, seg.strike_rad, seg.dip_rad, zref, top, bottom, levels);
    } catch (const InputError& e) {
      throw e.located(region.file + " [faults] (segment '" + seg.segment_id + "')");
    }
    poro::DepthSegment ds;
    ds.segment_id = seg.segment_id;
    ds.strike = seg.strike_rad;
    ds.dip = seg.dip_rad;
    ds.friction = ss.friction;
    std::vector<Eigen::Vector3d> xyz;
    for (std::size_t i = 0; i < pts.size(); ++i) {
      geomech::AndersonianStress st = stress[i % static_cast<std::size_t>(levels)];
      st.shmax_azimuth += convergence;
      ds.points.push_back({pts[i], st});
      xyz.emplace_back(pts[i].y(), pts[i].x(), pts[i].z());
    }
    in.segments.push_back(std::move(ds));
    out.points.push_back(std::move(xyz));
  }
  out.result = poro::depth_screen(in);
  out.inputs = std::move(in);
  return out;
}

}  // namespace slipscreen::screening
