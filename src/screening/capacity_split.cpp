// The wells split for the allowable rate; see capacity_split.hpp.
#include "screening/capacity_split.hpp"

#include <algorithm>

#include "core/errors.hpp"

namespace slipscreen::screening {
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

probabilistic::GroupSplit split_group(const std::vector<probabilistic::WellInput>& wells,
                                      const std::vector<std::string>& ids, std::optional<double> from,
                                      const std::string& field, const std::string& where) {
  probabilistic::GroupSplit g;
  for (std::size_t w = 0; w < wells.size(); ++w) {
    if (std::find(ids.begin(), ids.end(), wells[w].id) == ids.end()) {
      g.wells.push_back(wells[w]);
      g.origin.push_back(w);
      g.in_group.push_back(0);
      continue;
    }
    auto [before, after] = from ? split_steps(wells[w].steps, *from) : std::pair{hydro::RateSteps{}, wells[w].steps};
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
    throw InputError(field, ids.front(), "wells that inject after the date given (the group has no rate to scale)", where);
  return g;
}

probabilistic::GroupSplit capacity_split(const scenario::ResolvedScenario& s,
                                         const std::vector<probabilistic::WellInput>& wells,
                                         const std::vector<double>& tracked_times) {
  const auto& cap = *s.capacity;
  probabilistic::GroupSplit g = split_group(wells, cap.wells, cap.from, "capacity.wells", cap.where);
  g.f_max = cap.up_to;
  const double t_end = s.output.times.back();
  g.horizon = static_cast<std::size_t>(std::lower_bound(tracked_times.begin(), tracked_times.end(), t_end) -
                                       tracked_times.begin());
  return g;
}

}  // namespace slipscreen::screening
