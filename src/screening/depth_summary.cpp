#include "screening/depth_summary.hpp"

#include <algorithm>
#include <limits>

#include "core/stats/wilson_interval.hpp"
#include "core/util/civil_date.hpp"

namespace slipscreen::screening {

DepthSummary summarize_depth(const PreparedRun& p, const DepthScreen& d, const DepthProbability* probability) {
  DepthSummary out;
  const auto& segs = d.result.segments;
  out.segments = segs.size();
  if (probability) out.realizations = probability->realizations;
  for (std::size_t i = 0; i < segs.size(); ++i) {
    const poro::DepthSegmentScreen& g = segs[i];
    DepthLine l;
    l.segment_id = p.segments[i].segment_id;
    l.fault_id = p.segments[i].fault_id;
    l.already_critical = g.already_critical;
    out.already_critical_count += g.already_critical;
    if (g.first_crossing && g.crossing_point && g.crossing_change) {
      l.first_crossing = util::format_iso_date(util::date_at(*g.first_crossing));
      l.crossing_depth = d.points[i][*g.crossing_point].z();
      l.crossing_dcff = g.crossing_change->dcff;
      ++out.crossing_count;
    }
    l.closest_margin = std::numeric_limits<double>::infinity();
    for (std::size_t k = 0; k < g.change.size(); ++k)
      l.closest_margin = std::min(l.closest_margin, g.friction * g.dp_crit[g.point[k]] - g.change[k].dcff);
    if (probability && !probability->slipped[i].empty()) {
      const auto ci = stats::wilson_interval(probability->slipped[i].back(), probability->realizations, probability->z);
      l.p_final = ci.estimate, l.ci_low = ci.lower, l.ci_high = ci.upper;
    }
    out.lines.push_back(std::move(l));
  }
  const auto before = [&](const DepthLine& a, const DepthLine& b) {
    if (probability) return a.p_final.value_or(-1.0) > b.p_final.value_or(-1.0);
    if (a.already_critical != b.already_critical) return a.already_critical;
    if (a.first_crossing.has_value() != b.first_crossing.has_value()) return a.first_crossing.has_value();
    if (a.first_crossing && *a.first_crossing != *b.first_crossing) return *a.first_crossing < *b.first_crossing;
    return a.closest_margin < b.closest_margin;
  };
  std::stable_sort(out.lines.begin(), out.lines.end(), before);
  return out;
}

}  // namespace slipscreen::screening
