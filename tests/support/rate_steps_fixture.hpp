#pragma once
// Test helper: a well's rate steps with the rate from a date on multiplied by a factor, built
// directly (independently of screening/capacity_split.cpp) for reruns of the full screen.
#include "core/hydro/similarity_table.hpp"

namespace slipscreen::test {

// The group's steps with the rate from `from` on multiplied by f, built directly from the rate
// q(t) = Σ_{t_j ≤ t} Δq_j: unchanged before `from`, a step to f·q(from) at `from`, then f·Δq_j.
inline hydro::RateSteps scaled_from(const hydro::RateSteps& s, double f, double from) {
  hydro::RateSteps out;
  double q_before = 0.0, q_at = 0.0;
  for (std::size_t j = 0; j < s.time.size(); ++j) {
    if (s.time[j] < from) {
      out.time.push_back(s.time[j]);
      out.delta_rate.push_back(s.delta_rate[j]);
      q_before += s.delta_rate[j];
    }
    if (s.time[j] <= from) q_at += s.delta_rate[j];
  }
  if (f * q_at - q_before != 0.0) {
    out.time.push_back(from);
    out.delta_rate.push_back(f * q_at - q_before);
  }
  for (std::size_t j = 0; j < s.time.size(); ++j)
    if (s.time[j] > from) {
      out.time.push_back(s.time[j]);
      out.delta_rate.push_back(f * s.delta_rate[j]);
    }
  return out;
}

}  // namespace slipscreen::test
