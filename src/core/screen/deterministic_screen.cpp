#include "core/screen/deterministic_screen.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/hydro/pressure_field.hpp"

namespace slipscreen::screen {

namespace {

void check_times(const std::vector<double>& t, const char* field) {
  for (std::size_t i = 0; i < t.size(); ++i) {
    if (!std::isfinite(t[i])) throw InputError(field, std::to_string(t[i]), "finite times");
    if (i > 0 && !(t[i] > t[i - 1]))
      throw InputError(field, std::to_string(t[i]), "strictly increasing times");
  }
}

}  // namespace

ScreenResult deterministic_screen(const ScreenInputs& in, Progress progress, void* user) {
  if (in.output_times.empty()) throw InputError("output times", "(none)", "at least one output time");
  check_times(in.output_times, "output times");
  check_times(in.tracking_times, "tracking times");
  geomech::check(in.stress);
  geomech::check(in.friction);

  ScreenResult result;
  std::merge(in.tracking_times.begin(), in.tracking_times.end(), in.output_times.begin(), in.output_times.end(),
             std::back_inserter(result.tracked_times));
  result.tracked_times.erase(std::unique(result.tracked_times.begin(), result.tracked_times.end()),
                             result.tracked_times.end());

  // Stress on every segment (no pressure dependence).
  const Eigen::Matrix3d stress = geomech::stress_tensor_ned(in.stress);
  const double p0 = in.stress.pore_pressure;
  result.segments.resize(in.segments.size());
  std::vector<hydro::FieldPoint> points;
  std::vector<std::size_t> first_point(in.segments.size() + 1, 0);
  for (std::size_t s = 0; s < in.segments.size(); ++s) {
    const ScreenSegment& seg = in.segments[s];
    if (seg.check_points.empty())
      throw InputError("segment " + seg.segment_id, "no check points", "at least one check point");
    SegmentScreen& out = result.segments[s];
    const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip);
    const geomech::ResolvedStress rs = geomech::resolve(stress, p0, plane);
    geomech::Friction f = in.friction;
    if (seg.friction) f.mu = *seg.friction;
    const geomech::CriticalPressure cp = geomech::critical_pressure(rs.shear_stress, rs.normal_stress, p0, f);
    out.friction = f.mu;
    out.normal_stress = rs.normal_stress;
    out.effective_normal_stress = rs.effective_normal_stress;
    out.shear_stress = rs.shear_stress;
    out.slip_tendency = rs.slip_tendency;
    out.dilation_tendency = rs.dilation_tendency;
    out.rake = rs.rake;
    out.sense = rs.sense;
    out.dp_crit = cp.dp;
    out.status = cp.status;
    first_point[s] = points.size();
    for (const auto& p : seg.check_points) points.push_back({p.x, p.y});
  }
  first_point[in.segments.size()] = points.size();

  const std::size_t W = in.wells.size();
  const std::size_t K = in.output_times.size();
  const std::size_t G = result.tracked_times.size();
  for (auto& out : result.segments) {
    out.dp.assign(K, 0.0);
    out.dp_point.assign(K, 0);
    out.tracked_dp.assign(G, 0.0);
    out.well_share.assign(K * W, 0.0);
  }
  if (W == 0 || in.segments.empty()) return result;

  std::vector<hydro::WellSource> sources;
  for (const auto& w : in.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), in.boundaries);

  // Segments in blocks, so that progress can be reported and memory stays bounded; each block
  // is computed exactly as a whole run would be (results do not depend on the blocking).
  const std::size_t block = 32;
  for (std::size_t s0 = 0; s0 < in.segments.size(); s0 += block) {
    const std::size_t s1 = std::min(in.segments.size(), s0 + block);
    const std::span<const hydro::FieldPoint> pts(points.data() + first_point[s0], first_point[s1] - first_point[s0]);
    const hydro::PreparedPoints prepared = field.prepare(pts);
    result.radius_clamped = result.radius_clamped || prepared.any_clamped();
    const hydro::PressureResult tracked = field.evaluate(prepared, result.tracked_times, in.formation);
    const hydro::PressureResult at_out = field.evaluate(prepared, in.output_times, in.formation, {}, true);
    for (std::size_t s = s0; s < s1; ++s) {
      SegmentScreen& out = result.segments[s];
      const std::size_t pa = first_point[s] - first_point[s0], pb = first_point[s + 1] - first_point[s0];
      for (std::size_t g = 0; g < G; ++g) {
        double m = 0.0;
        for (std::size_t p = pa; p < pb; ++p) m = std::max(m, tracked.at(p, g));
        out.tracked_dp[g] = m;
        if (m > out.peak_dp) {
          out.peak_dp = m;
          out.peak_time = result.tracked_times[g];
        }
        if (!out.first_crossing && out.status == geomech::CriticalStatus::below_failure && m >= out.dp_crit)
          out.first_crossing = result.tracked_times[g];
      }
      for (std::size_t k = 0; k < K; ++k) {
        std::size_t best = pa;
        for (std::size_t p = pa; p < pb; ++p)
          if (at_out.at(p, k) > at_out.at(best, k)) best = p;
        const double total = at_out.at(best, k);
        out.dp[k] = total;
        out.dp_point[k] = best - pa;
        if (total > 0)
          for (std::size_t w = 0; w < W; ++w) out.well_share[k * W + w] = at_out.contribution(best, k, w) / total;
      }
    }
    if (progress) progress(double(s1) / double(in.segments.size()), user);
  }
  return result;
}

}  // namespace slipscreen::screen
