// The wells split for the allowable rate; see capacity_split.hpp.
#include "screening/capacity_split.hpp"

#include <algorithm>

#include "core/errors.hpp"

namespace slipscreen::screening {
namespace {
bool in_group(const scenario::ResolvedScenario& s, const std::string& id) {
  return std::find(s.capacity->wells.begin(), s.capacity->wells.end(), id) != s.capacity->wells.end();
}
}  // namespace

std::pair<hydro::RateSteps, hydro::RateSteps> split_steps(const hydro::RateSteps& steps, double from) {
  hydro::RateSteps before, after;
  double q_before = 0.0, q_at = 0.0;
  for (std::size_t j = 0; j < steps.time.size(); ++j) {
    if (steps.time[j] < from) {
      before.time.push_back(steps.time[j]);
      before.delta_rate.push_back(steps.delta_rate[j]);
      q_before += steps.delta_rate[j];
    }
    if (steps.time[j] <= from) q_at += steps.delta_rate[j];
  }
  if (q_before != 0.0) {
    before.time.push_back(from);
    before.delta_rate.push_back(-q_before);
  }
  if (q_at != 0.0) {
    after.time.push_back(from);
    after.delta_rate.push_back(q_at);
  }
  for (std::size_t j = 0; j < steps.time.size(); ++j)
    if (steps.time[j] > from) {
      after.time.push_back(steps.time[j]);
      after.delta_rate.push_back(steps.delta_rate[j]);
    }
  return {before, after};
}

probabilistic::GroupSplit capacity_split(const scenario::ResolvedScenario& s, const std::vector<probabilistic::WellInput>& wells,
                                         const std::vector<double>& tracked_times) {
  probabilistic::GroupSplit g;
  const auto& cap = *s.capacity;
  g.f_max = cap.up_to;
  const double t_end = s.output.times.back();
  g.horizon = static_cast<std::size_t>(std::lower_bound(tracked_times.begin(), tracked_times.end(), t_end) -
                                       tracked_times.begin());
  for (std::size_t w = 0; w < wells.size(); ++w) {
    if (!in_group(s, wells[w].id)) {
      g.wells.push_back(wells[w]);
      g.origin.push_back(w);
      g.in_group.push_back(0);
      continue;
    }
    auto [before, after] = cap.from ? split_steps(wells[w].steps, *cap.from) : std::pair{hydro::RateSteps{}, wells[w].steps};
    for (int part = 0; part < 2; ++part) {
      hydro::RateSteps& st = part == 0 ? before : after;
      if (st.time.empty()) continue;
      probabilistic::WellInput in = wells[w];
      in.steps = std::move(st);
      g.wells.push_back(std::move(in));
      g.origin.push_back(w);
      g.in_group.push_back(part == 1);
    }
  }
  if (std::find(g.in_group.begin(), g.in_group.end(), 1) == g.in_group.end())
    throw InputError("capacity.wells", cap.wells.front(),
                     "wells that inject after [capacity] from (the group has no rate to scale)", cap.where);
  return g;
}

}  // namespace slipscreen::screening
