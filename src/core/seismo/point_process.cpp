// Poisson point-process log-likelihood of a catalog; see point_process.hpp.
#include "core/seismo/point_process.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {

PointProcessLikelihood seismicity_log_likelihood(const std::vector<SegmentRateModel>& segments,
                                                 double background_pool_rate, const std::vector<AssignedEvent>& events,
                                                 double t0, double t1) {
  if (!(t1 > t0) || !std::isfinite(t0) || !std::isfinite(t1))
    throw InputError("catalog window", util::number_text(t0, 12) + " to " + util::number_text(t1, 12) + " s",
                     "a window whose end is after its start");
  std::vector<std::vector<double>> times(segments.size());
  std::size_t pool = 0;
  for (const auto& e : events) {
    if (!(e.time >= t0 && e.time <= t1))
      throw InputError("event time", util::number_text(e.time, 12) + " s", "a time within the catalog window");
    if (e.segment == kBackgroundPool) ++pool;
    else if (e.segment < segments.size()) times[e.segment].push_back(e.time);
    else throw InputError("event segment", std::to_string(e.segment), "a segment index or the background pool");
  }
  PointProcessLikelihood out;
  if (pool > 0 && !(background_pool_rate > 0.0))
    throw InputError("background pool rate", util::number_text(background_pool_rate, 6), "a rate > 0 (events in the pool)");
  if (background_pool_rate > 0.0) {
    out.sum_log_rate += static_cast<double>(pool) * std::log(background_pool_rate);
    out.expected += background_pool_rate * (t1 - t0);
  }
  for (std::size_t s = 0; s < segments.size(); ++s) {
    const auto& m = segments[s];
    if (m.history.time.empty() || m.history.time.front() > t0)
      throw InputError("segment " + std::to_string(s) + " Coulomb history", "starting after the window",
                       "a history from the window's start or earlier");
    std::vector<double>& at = times[s];
    std::sort(at.begin(), at.end());
    std::vector<double> query{t0};
    query.insert(query.end(), at.begin(), at.end());
    query.push_back(t1);
    const auto r = rate_response(m.history, m.params, query);
    for (std::size_t i = 1; i + 1 < r.size(); ++i) out.sum_log_rate += std::log(r[i].rate);
    out.expected += r.back().expected - r.front().expected;
  }
  out.log_likelihood = out.sum_log_rate - out.expected;
  return out;
}

}  // namespace slipscreen::seismo
