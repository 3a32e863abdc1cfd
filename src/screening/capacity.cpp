// The allowable rate of a group of wells; see capacity.hpp.
#include "screening/capacity.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/errors.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/probabilistic/critical_factor.hpp"
#include "core/stats/wilson_interval.hpp"
#include "core/util/parallel_errors.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::screening {
namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();

bool in_group(const scenario::ResolvedScenario& s, const std::string& id) {
  return std::find(s.capacity->wells.begin(), s.capacity->wells.end(), id) != s.capacity->wells.end();
}

FactorAnswer answer_of(double limit, std::optional<std::size_t> binding, double up_to) {
  FactorAnswer a;
  a.beyond = !(limit <= up_to);
  a.limit = a.beyond ? kInf : limit;
  a.allowed = a.beyond ? up_to : allowed_below(limit);
  if (!a.beyond) a.binding = binding;
  return a;
}

// The deterministic answer: best-estimate Δp at every check point and tracked time t ≤ T, the
// rest and the group apart (similarity tables of the split wells, hydro/similarity_table.hpp,
// at the formation's D and μ/(4π k h)), then critical_factor() against Δp_crit − margin.
void deterministic_answer(const PreparedRun& p, const screen::ScreenResult& det,
                          const probabilistic::GroupSplit& split, CapacityResult& out) {
  std::vector<double> times;
  for (double t : det.tracked_times)
    if (t <= out.horizon) times.push_back(t);
  const double d = p.inputs.formation.diffusivity, pf = p.inputs.formation.pressure_per_rate;
  double rw_min = kInf, r2_max = 1.0;
  std::vector<hydro::RateSteps> steps;
  for (const auto& w : split.wells) {
    steps.push_back(w.steps);
    rw_min = std::min(rw_min, w.radius);
    for (const auto& seg : p.inputs.segments)
      for (const auto& c : seg.check_points)
        for (const auto& im : hydro::image_wells(w.x, w.y, p.inputs.boundaries))
          r2_max = std::max(r2_max, (c.x - im.x) * (c.x - im.x) + (c.y - im.y) * (c.y - im.y));
  }
  const hydro::SimilarityGrid grid{std::log(rw_min * rw_min / (4.0 * d)) - 0.1, std::log(r2_max / (4.0 * d)) + 0.1, 0.025};
  const auto tables = hydro::build_tables(steps, times, grid);
  // Each segment's critical factor (OpenMP over segments), then the answer in segment order.
  std::vector<double> f_seg(p.inputs.segments.size(), kInf);
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 4)
  for (std::size_t si = 0; si < p.inputs.segments.size(); ++si)
    errors.iteration(si, [&] {
      const double crit = det.segments[si].dp_crit - out.margin;
      if (std::isinf(crit)) return;
      double f = kInf;
      std::vector<double> rest(times.size()), group(times.size());
      for (const auto& c : p.inputs.segments[si].check_points) {
        std::fill(rest.begin(), rest.end(), 0.0);
        std::fill(group.begin(), group.end(), 0.0);
        for (std::size_t w = 0; w < split.wells.size(); ++w) {
          auto& into = split.in_group[w] ? group : rest;
          for (const auto& im : hydro::image_wells(split.wells[w].x, split.wells[w].y, p.inputs.boundaries)) {
            const double r2 = std::max((c.x - im.x) * (c.x - im.x) + (c.y - im.y) * (c.y - im.y),
                                       split.wells[w].radius * split.wells[w].radius);
            const auto tap = tables[w].tap(r2 / (4.0 * d));
            for (std::size_t k = 0; k < times.size(); ++k) into[k] += pf * im.sign * tables[w].value(tap, k);
          }
        }
        f = std::min(f, probabilistic::critical_factor(rest, group, crit));
      }
      f_seg[si] = f;
    });
  errors.rethrow();
  double limit = kInf;
  std::optional<std::size_t> binding;
  for (std::size_t si = 0; si < f_seg.size(); ++si) {
    if (std::isinf(det.segments[si].dp_crit - out.margin)) continue;
    const double f = f_seg[si];
    if (f == 0.0) out.deterministic_reached_without.push_back(si);
    else if (f < limit) {
      limit = f;
      binding = si;
    }
  }
  out.deterministic = answer_of(limit, binding, out.up_to);
}
}  // namespace

double allowed_below(double limit) {
  if (!(limit > 0.0) || std::isinf(limit)) return limit;
  const double unit = std::pow(10.0, std::floor(std::log10(limit)) - 2.0);
  double a = std::floor(limit / unit) * unit;
  if (a >= limit) a = (std::floor(limit / unit) - 1.0) * unit;
  return a;
}

CapacityResult capacity_answer(const scenario::ResolvedScenario& s, const PreparedRun& p,
                               const screen::ScreenResult& det, ProbabilisticRun& prob) {
  const auto& cap = *s.capacity;
  CapacityResult out;
  out.wells = cap.wells;
  out.from = cap.from;
  out.horizon = s.output.times.back();
  out.up_to = cap.up_to;
  out.margin = cap.margin;
  out.confidence = prob.confidence;
  out.curves = std::move(prob.result.capacity);
  for (const auto& seg : p.segments) {
    out.segment_ids.push_back(seg.segment_id);
    out.fault_ids.push_back(seg.fault_id);
  }
  const double z = stats::z_for_confidence(prob.confidence);
  for (double th : prob.thresholds) {
    CapacityThreshold c;
    c.threshold = th;
    const auto w = probabilistic::allowable_factor(out.curves, th, probabilistic::ProbabilityBound::wilson_upper, z);
    // The point estimate's answer over the same segments as the conservative one (allowable_factor.hpp).
    const auto pt = probabilistic::allowable_factor(out.curves, th, probabilistic::ProbabilityBound::point_estimate, z,
                                                    probabilistic::ProbabilityBound::wilson_upper);
    c.wilson = answer_of(w.limit, w.binding, cap.up_to);
    c.point = answer_of(pt.limit, pt.binding, cap.up_to);
    c.reached_without = w.reached_without;
    out.thresholds.push_back(std::move(c));
  }
  for (const auto& w : s.wells) {
    if (!in_group(s, w.id)) continue;
    GroupWellPlan plan{w.id, {}};
    for (const auto& per : w.periods) {
      if (per.rate == 0.0) continue;
      const double start = cap.from ? std::max(per.start, *cap.from) : per.start;
      if (per.end <= start) continue;
      plan.periods.push_back({start, per.end, per.rate});
    }
    out.plan.push_back(std::move(plan));
  }
  deterministic_answer(p, det, *prob.settings.capacity, out);
  return out;
}

}  // namespace slipscreen::screening
