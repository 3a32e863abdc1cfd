#include "screening/pressure_history.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "core/hydro/pressure_field.hpp"
#include "core/util/civil_date.hpp"

namespace slipscreen::screening {

std::vector<std::size_t> segments_closest_to_failure(const screen::ScreenResult& r, std::size_t top) {
  std::vector<std::size_t> order(r.segments.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  const auto margin = [&](std::size_t i) { return r.segments[i].dp_crit - r.segments[i].peak_dp; };
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return margin(a) < margin(b); });
  order.resize(std::min(order.size(), top));
  return order;
}

namespace {

bool first_of_month(double t) {
  const double days = t / util::kSecondsPerDay;
  return days == std::floor(days) && util::civil_from_days(static_cast<std::int64_t>(days)).day == 1;
}

}  // namespace

SegmentPressureHistory segment_pressure_history(const PreparedRun& p, const screen::ScreenResult& r,
                                                std::size_t top) {
  SegmentPressureHistory h;
  const auto& in = p.inputs;
  for (const auto& w : in.wells) h.wells.push_back(w.id);
  if (top == 0 || in.wells.empty() || in.segments.empty() || in.output_times.empty()) return h;
  h.segments = segments_closest_to_failure(r, top);
  const auto& outputs = in.output_times;
  for (double t : r.tracked_times)
    if (first_of_month(t) || std::binary_search(outputs.begin(), outputs.end(), t)) h.times.push_back(t);

  std::vector<hydro::WellSource> sources;
  for (const auto& w : in.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), in.boundaries);
  const std::size_t T = h.times.size(), W = in.wells.size(), S = h.segments.size();
  h.check_point.assign(S * T, 0);
  h.dp.assign(S * T, 0.0);
  h.contribution.assign(S * T * W, 0.0);
  for (std::size_t i = 0; i < S; ++i) {
    const auto& cps = in.segments[h.segments[i]].check_points;
    std::vector<hydro::FieldPoint> pts;
    for (const auto& c : cps) pts.push_back({c.x, c.y});
    const hydro::PreparedPoints prepared = field.prepare(pts);
    const hydro::PressureResult res = field.evaluate(prepared, h.times, in.formation, {}, true);
    for (std::size_t k = 0; k < T; ++k) {
      std::size_t best = 0;
      for (std::size_t q = 1; q < cps.size(); ++q)
        if (res.at(q, k) > res.at(best, k)) best = q;  // the first point holding the maximum wins ties
      h.check_point[i * T + k] = best;
      h.dp[i * T + k] = res.at(best, k);
      for (std::size_t w = 0; w < W; ++w) h.contribution[(i * T + k) * W + w] = res.contribution(best, k, w);
    }
  }
  return h;
}

}  // namespace slipscreen::screening
