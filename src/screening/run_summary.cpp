#include "screening/run_summary.hpp"

#include <algorithm>

#include "core/stats/wilson_interval.hpp"

namespace slipscreen::screening {

RunSummary summarize_run(const scenario::ResolvedScenario& s, const PreparedRun& prepared,
                         const screen::ScreenResult& result, const ProbabilisticRun* prob,
                         std::optional<CatalogReview> review) {
  RunSummary summary;
  summary.fault_count = prepared.fault_count;
  summary.segment_count = prepared.segments.size();
  summary.well_count = prepared.wells.size();
  summary.radius_clamped = result.radius_clamped;
  summary.last_date = util::format_iso_date(s.output.dates.back());
  const std::size_t K = s.output.times.size();
  for (std::size_t i = 0; i < result.segments.size(); ++i) {
    const auto& r = result.segments[i];
    SegmentLine line;
    line.segment_id = prepared.segments[i].segment_id;
    line.fault_id = prepared.segments[i].fault_id;
    line.dp_crit = r.dp_crit;
    line.peak_dp = r.peak_dp;
    line.final_dp = r.dp.back();
    line.status = r.status;
    if (r.first_crossing) line.first_crossing = util::format_iso_date(util::date_at(*r.first_crossing));
    // At the first crossing when there is one (a well starting later is never named for it),
    // otherwise at the last output time.
    line.leading_at_crossing = r.first_crossing.has_value();
    const double share = line.leading_at_crossing ? r.crossing_well_share : r.leading_share[K - 1];
    if (share > line.leading_share) {
      line.leading_share = share;
      line.leading_well = prepared.wells[line.leading_at_crossing ? r.crossing_well : r.leading_well[K - 1]].id;
    }
    summary.crossing_count += r.first_crossing.has_value();
    summary.already_critical_count += r.status == geomech::CriticalStatus::already_critical;
    summary.closest.push_back(line);
  }
  std::stable_sort(summary.closest.begin(), summary.closest.end(), [](const SegmentLine& a, const SegmentLine& b) {
    return a.dp_crit - a.peak_dp < b.dp_crit - b.peak_dp;
  });
  if (prob) {
    const auto& pr = prob->result;
    ProbabilisticSummary ps;
    ps.realizations = pr.realizations;
    ps.rejected = pr.rejected;
    ps.beyond_frictional_limit = pr.beyond_frictional_limit;
    ps.sampler = std::string(stats::sampling_method_name(pr.sampler.method));
    ps.confidence = prob->confidence;
    ps.thresholds = prob->thresholds;
    ps.mc_half_width_max = prob->mc_half_width_max;
    ps.surrogate_error = pr.surrogate_error;
    const double z = stats::z_for_confidence(prob->confidence);
    for (std::size_t i = 0; i < pr.segments.size(); ++i) {
      const auto& seg = pr.segments[i];
      ps.already_critical_segments += seg.already_critical > 0;
      const auto ci = stats::wilson_interval(seg.slipped_by[K - 1], pr.realizations, z);
      FlaggedSegment f;
      for (double th : prob->thresholds)
        if (ci.estimate >= th) f.threshold = th;
      if (f.threshold <= 0.0) continue;
      f.segment_id = prepared.segments[i].segment_id;
      f.fault_id = prepared.segments[i].fault_id;
      f.p_final = ci.estimate;
      f.ci_low = ci.lower;
      f.ci_high = ci.upper;
      f.p_already_critical = static_cast<double>(seg.already_critical) / static_cast<double>(pr.realizations);
      f.first_date = first_date_reaching(*prob, i, f.threshold);
      ps.flagged.push_back(std::move(f));
    }
    std::stable_sort(ps.flagged.begin(), ps.flagged.end(),
                     [](const FlaggedSegment& a, const FlaggedSegment& b) { return a.p_final > b.p_final; });
    summary.probabilistic = std::move(ps);
    if (pr.conditioning) summary.conditioning = conditioning_summary(*prob, prepared);
  }
  if (review) summary.catalog = std::make_shared<const CatalogReview>(std::move(*review));
  return summary;
}

}  // namespace slipscreen::screening
