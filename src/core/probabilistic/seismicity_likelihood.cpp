// The seismicity log-likelihood of the realizations; see seismicity_likelihood.hpp.
#include "core/probabilistic/seismicity_likelihood.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/seismo/point_process.hpp"
#include "core/util/number_text.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {

constexpr Eigen::Index kBlock = 512;  // realizations per surrogate evaluation

// ℓ_s of every realization for segment s (its events in `times`), into row s of `out`.
void segment_terms(const PressureModel& pm, const SampledRealizations& r, const InputList& list,
                   const RunSettings& settings, std::size_t s, const std::vector<double>& times, Eigen::MatrixXd& out) {
  const SeismicityData& d = *settings.seismicity;
  const std::size_t n_seg = pm.segment_points.size();
  const Eigen::Index n = pm.draws.basis.cols();
  std::vector<seismo::AssignedEvent> events;
  for (double t : times) events.push_back({t, 0});
  const double length_km = d.segment_length.at(s) / 1000.0;
  // Only the tracking times up to the first at or after t1 matter (ΔCFF later than t1 does not
  // enter the window), so the rest of the series is not evaluated.
  const auto& tt = settings.tracking_times;
  const std::size_t rows = std::min<std::size_t>(
      tt.size(), static_cast<std::size_t>(std::lower_bound(tt.begin(), tt.end(), d.t1) - tt.begin()) + 1);
  const auto nr = static_cast<Eigen::Index>(rows);
  const std::span<const double> times_used(tt.data(), rows);
  const auto& points = pm.segment_points[s];
  SeriesBuffers buf;
  Eigen::MatrixXd series;
  std::vector<Eigen::Index> cols;
  std::vector<double> dp(rows);
  for (Eigen::Index c0 = 0; c0 < n; c0 += kBlock) {
    const Eigen::Index nb = std::min(kBlock, n - c0);
    cols.resize(static_cast<std::size_t>(nb));
    for (Eigen::Index c = 0; c < nb; ++c) cols[static_cast<std::size_t>(c)] = c0 + c;
    point_series(pm, points, nr, cols, 0, buf, series);
    const Eigen::MatrixXd best = max_over_points(series, points.size(), nr);
    for (Eigen::Index c = 0; c < nb; ++c) {
      const auto col = static_cast<std::size_t>(c0 + c);
      for (std::size_t k = 0; k < dp.size(); ++k) dp[k] = best(static_cast<Eigen::Index>(k), c);
      const auto ci = static_cast<Eigen::Index>(col);
      const double a_sigma = r.inputs(static_cast<Eigen::Index>(list.a_sigma), ci);
      const double rate = r.inputs(static_cast<Eigen::Index>(list.background_rate), ci) * length_km;
      seismo::SegmentRateModel m{segment_coulomb_history(times_used, dp, r.coulomb_path[col * n_seg + s], d.injection_start),
                                 seismo::RateStateParameters{rate, a_sigma, d.stressing_rate}};
      try {
        out(static_cast<Eigen::Index>(s), ci) = seismo::seismicity_log_likelihood({m}, 0.0, events, d.t0, d.t1).log_likelihood;
      } catch (const NumericalError&) {  // rates beyond e^700 r: the realization cannot explain the data
        out(static_cast<Eigen::Index>(s), ci) = -std::numeric_limits<double>::infinity();
      }
    }
  }
}

}  // namespace

seismo::CoulombHistory segment_coulomb_history(std::span<const double> tracking_times, std::span<const double> dp,
                                               const geomech::CoulombPathChange& path, double injection_start) {
  if (dp.size() != tracking_times.size())
    throw InputError("Δp series", std::to_string(dp.size()) + " values", "one per tracking time");
  seismo::CoulombHistory h;
  if (tracking_times.empty() || injection_start < tracking_times.front()) {
    h.time.push_back(injection_start);
    h.coulomb_change.push_back(0.0);
  }
  for (std::size_t k = 0; k < tracking_times.size(); ++k) {
    h.time.push_back(tracking_times[k]);
    h.coulomb_change.push_back(path.at(dp[k]));
  }
  return h;
}

SeismicityLikelihood seismicity_likelihood(const PressureModel& pm, const SampledRealizations& r, const InputList& list,
                                           const RunSettings& settings) {
  if (!settings.seismicity) throw InputError("seismicity", "(none)", "observed earthquakes");
  const SeismicityData& d = *settings.seismicity;
  const std::size_t n_seg = pm.segment_points.size();
  const auto n = static_cast<std::size_t>(pm.draws.basis.cols());
  if (list.a_sigma == InputList::npos || list.background_rate == InputList::npos)
    throw InputError("seismicity inputs", "(not sampled)", "Aσ and the background rate among the sampled inputs");
  if (r.coulomb_path.size() != n * n_seg)
    throw InputError("Coulomb paths", std::to_string(r.coulomb_path.size()), "one per segment and realization");
  if (d.segment_length.size() != n_seg)
    throw InputError("segment lengths", std::to_string(d.segment_length.size()), "one per segment");
  if (!(d.t1 > d.t0) || !(d.injection_start <= d.t0) || settings.tracking_times.empty() ||
      d.t1 > settings.tracking_times.back())
    throw InputError("seismicity window", util::number_text(d.t0, 12) + " to " + util::number_text(d.t1, 12) + " s",
                     "a window from the first injection or later, ending after it starts and by the last tracking time");
  std::vector<std::vector<double>> times(n_seg);
  std::vector<seismo::AssignedEvent> pool;
  for (const auto& e : d.events) {
    if (e.segment == seismo::kBackgroundPool) pool.push_back(e);
    else if (e.segment < n_seg) times[e.segment].push_back(e.time);
    else throw InputError("event segment", std::to_string(e.segment), "a segment index or the background pool");
  }
  SeismicityLikelihood out;
  out.pool_log_likelihood = seismo::seismicity_log_likelihood({}, d.pool_rate, pool, d.t0, d.t1).log_likelihood;
  Eigen::MatrixXd terms(static_cast<Eigen::Index>(n_seg), static_cast<Eigen::Index>(n));
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t s = 0; s < n_seg; ++s)
    errors.iteration(s, [&] { segment_terms(pm, r, list, settings, s, times[s], terms); });
  errors.rethrow();
  out.log_likelihood.assign(n, out.pool_log_likelihood);
  for (std::size_t c = 0; c < n; ++c) {
    for (std::size_t s = 0; s < n_seg; ++s)  // segment order: the same sum for any thread count
      out.log_likelihood[c] += terms(static_cast<Eigen::Index>(s), static_cast<Eigen::Index>(c));
    out.beyond_domain += std::isinf(out.log_likelihood[c]) ? 1 : 0;
  }
  return out;
}

}  // namespace slipscreen::probabilistic
