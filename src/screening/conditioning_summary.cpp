// The conditioned run's summary; see conditioning_summary.hpp.
#include "screening/conditioning_summary.hpp"

#include <algorithm>
#include <cmath>

#include "core/stats/wilson_interval.hpp"
#include "screening/conditioning.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::screening {

std::vector<InputShift> input_shifts(const probabilistic::Conditioning& c, const std::vector<std::string>& names) {
  std::vector<InputShift> out;
  for (std::size_t j = 0; j < c.input_prior.size(); ++j) {
    if (!c.input_uncertain[j]) continue;
    const auto& a = c.input_prior[j];
    const auto& b = c.input_posterior[j];
    const double width = a.p95 - a.p05;
    if (!(width > 0.0)) continue;
    out.push_back({names.at(j), j, (b.p95 - b.p05) / width, (b.p50 - a.p50) / width});
  }
  const auto moved = [](const InputShift& x) { return std::max(std::abs(x.median_shift), std::abs(1.0 - x.width_ratio)); };
  std::stable_sort(out.begin(), out.end(), [&](const InputShift& x, const InputShift& y) { return moved(x) > moved(y); });
  return out;
}

std::string seismicity_sentence(const SeismicityUse& u) {
  const auto date = [](double t) { return util::format_iso_date(util::date_at(t)); };
  return std::to_string(u.used) + " earthquakes at or above Mc " + util::number_text(u.mc, 3) + " from " +
         date(u.data.t0) + " to " + date(u.data.t1) + ": " + std::to_string(u.assigned) +
         " assigned to the nearest fault segment within " + util::number_text(u.distance / 1000.0, 4) + " km, " +
         std::to_string(u.pool) + " in the background pool; left out: " + std::to_string(u.below_mc) + " below Mc, " +
         std::to_string(u.outside_window) + " outside that period";
}

ConditioningSummary conditioning_summary(const ProbabilisticRun& run, const PreparedRun& p) {
  ConditioningSummary c;
  const auto& cond = *run.result.conditioning;
  c.observations = run.settings.observations.size();
  c.realizations = run.result.realizations;
  c.n_eff = cond.weights.n_eff;
  c.warning = low_effective_sample_warning(c.n_eff, c.realizations);
  c.seismicity = run.seismicity;
  c.seismicity_beyond_domain = cond.seismicity_beyond_domain;
  c.moved = input_shifts(cond, run.result.input_names);
  if (c.moved.size() > kConsoleInputs) c.moved.resize(kConsoleInputs);
  const double z = stats::z_for_confidence(run.confidence);
  const std::size_t K = run.settings.output_index.size();
  for (std::size_t i = 0; i < run.result.segments.size(); ++i) {
    const auto ci = probabilistic::weighted_proportion(run.result.segments[i].conditioned.slipped_by[K - 1], cond.weights, z);
    c.segments.push_back({p.segments[i].segment_id, p.segments[i].fault_id, slip_probability(run, i, K - 1), ci.estimate,
                          ci.lower, ci.upper});
  }
  std::stable_sort(c.segments.begin(), c.segments.end(), [](const ConditionedSegment& a, const ConditionedSegment& b) {
    return std::max(a.p_prior, a.p_conditioned) > std::max(b.p_prior, b.p_conditioned);
  });
  if (c.segments.size() > kConsoleSegments) c.segments.resize(kConsoleSegments);
  return c;
}

}  // namespace slipscreen::screening
