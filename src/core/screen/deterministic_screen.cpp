#include "core/screen/deterministic_screen.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <limits>
#include <span>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/hydro/similarity_table.hpp"

namespace slipscreen::screen {

namespace {

constexpr double kTableStep = 0.025;       // ln x step of the similarity tables
constexpr double kTableAccuracy = 1e-6;    // stated table accuracy (similarity_table.hpp)
constexpr double kCandidateMargin = 2.0;   // safety factor on that bound when choosing check points

void check_times(const std::vector<double>& t, const char* field) {
  for (std::size_t i = 0; i < t.size(); ++i) {
    if (!std::isfinite(t[i])) throw InputError(field, std::to_string(t[i]), "finite times");
    if (i > 0 && !(t[i] > t[i - 1]))
      throw InputError(field, std::to_string(t[i]), "strictly increasing times");
  }
}

}  // namespace

ScreenResult deterministic_screen(const ScreenInputs& in, Progress progress, void* user) {
  if (in.output_times.empty()) throw InputError("output times", "(none)", "at least one output time");
  check_times(in.output_times, "output times");
  check_times(in.tracking_times, "tracking times");
  geomech::check(in.stress);
  geomech::check(in.friction);

  ScreenResult result;
  std::merge(in.tracking_times.begin(), in.tracking_times.end(), in.output_times.begin(), in.output_times.end(),
             std::back_inserter(result.tracked_times));
  result.tracked_times.erase(std::unique(result.tracked_times.begin(), result.tracked_times.end()),
                             result.tracked_times.end());

  // Stress on every segment (no pressure dependence).
  const Eigen::Matrix3d stress = geomech::stress_tensor_ned(in.stress);
  const double p0 = in.stress.pore_pressure;
  result.segments.resize(in.segments.size());
  std::vector<hydro::FieldPoint> points;
  std::vector<std::size_t> first_point(in.segments.size() + 1, 0);
  for (std::size_t s = 0; s < in.segments.size(); ++s) {
    const ScreenSegment& seg = in.segments[s];
    if (seg.check_points.empty())
      throw InputError("segment " + seg.segment_id, "no check points", "at least one check point");
    SegmentScreen& out = result.segments[s];
    const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip);
    const geomech::ResolvedStress rs = geomech::resolve(stress, p0, plane);
    geomech::Friction f = in.friction;
    if (seg.friction) f.mu = *seg.friction;
    const geomech::CriticalPressure cp = geomech::critical_pressure(rs.shear_stress, rs.normal_stress, p0, f);
    out.friction = f.mu;
    out.normal_stress = rs.normal_stress;
    out.effective_normal_stress = rs.effective_normal_stress;
    out.shear_stress = rs.shear_stress;
    out.slip_tendency = rs.slip_tendency;
    out.dilation_tendency = rs.dilation_tendency;
    out.rake = rs.rake;
    out.sense = rs.sense;
    out.dp_crit = cp.dp;
    out.status = cp.status;
    first_point[s] = points.size();
    for (const auto& p : seg.check_points) points.push_back({p.x, p.y});
  }
  first_point[in.segments.size()] = points.size();

  const std::size_t W = in.wells.size();
  const std::size_t K = in.output_times.size();
  const std::size_t G = result.tracked_times.size();
  for (auto& out : result.segments) {
    out.dp.assign(K, 0.0);
    out.dp_point.assign(K, 0);
    out.well_share.assign(K * W, 0.0);
    out.tracked_dp.assign(G, 0.0);
  }
  if (W == 0 || in.segments.empty()) return result;

  std::vector<hydro::WellSource> sources;
  for (const auto& w : in.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), in.boundaries);
  hydro::validate(in.formation);

  // Similarity tables of every well over the tracked times (one grid for all wells, spanning
  // x = r²/(4D) from the smallest well radius to the farthest source of any check point).
  const double inv4d = 1.0 / (4.0 * in.formation.diffusivity);
  double rw_min = std::numeric_limits<double>::infinity(), r2_max = 1.0;
  std::vector<hydro::RateSteps> steps(W);
  for (std::size_t w = 0; w < W; ++w) {
    rw_min = std::min(rw_min, in.wells[w].radius);
    for (const auto& c : in.wells[w].history.changes()) {
      steps[w].time.push_back(c.time);
      steps[w].delta_rate.push_back(c.delta);
    }
    for (const auto& src : field.sources(w))
      for (const auto& p : points)
        r2_max = std::max(r2_max, (p.x - src.x) * (p.x - src.x) + (p.y - src.y) * (p.y - src.y));
  }
  const hydro::SimilarityGrid grid{std::log(rw_min * rw_min * inv4d) - 0.1, std::log(r2_max * inv4d) + 0.1,
                                           kTableStep};
  const auto tables = hydro::build_tables(steps, result.tracked_times, grid);

  // Bound on the table error of any point's Δp at tracked time g: the stated accuracy of each
  // source's table, summed over sources.
  std::vector<double> table_error(G, 0.0);
  for (std::size_t w = 0; w < W; ++w)
    for (std::size_t g = 0; g < G; ++g)
      table_error[g] += kTableAccuracy * in.formation.pressure_per_rate *
                        static_cast<double>(field.sources(w).size()) * tables[w].scale(g);
  std::vector<std::size_t> out_index(K);  // tracked index of each output time
  for (std::size_t k = 0; k < K; ++k)
    out_index[k] = static_cast<std::size_t>(
        std::lower_bound(result.tracked_times.begin(), result.tracked_times.end(), in.output_times[k]) -
        result.tracked_times.begin());

  // Segments in blocks, so that progress can be reported and memory stays bounded; each block
  // is computed exactly as a whole run would be (results do not depend on the blocking).
  const std::size_t block = 64;
  std::vector<double> series;  // [local point * G + g]: Δp from the tables
  for (std::size_t s0 = 0; s0 < in.segments.size(); s0 += block) {
    const std::size_t s1 = std::min(in.segments.size(), s0 + block);
    const std::size_t first = first_point[s0], n_pts = first_point[s1] - first;
    const std::span<const hydro::FieldPoint> pts(points.data() + first, n_pts);
    const hydro::PreparedPoints prepared = field.prepare(pts);
    result.radius_clamped = result.radius_clamped || prepared.any_clamped();
    series.assign(n_pts * G, 0.0);
#pragma omp parallel for schedule(dynamic, 4)
    for (std::size_t p = 0; p < n_pts; ++p) {
      double* row = &series[p * G];
      for (std::size_t w = 0; w < W; ++w)
        for (std::size_t j = prepared.offset[p * W + w]; j < prepared.offset[p * W + w + 1]; ++j)
          tables[w].accumulate(tables[w].tap(prepared.r2[j] * inv4d), prepared.sign[j], row);
      for (std::size_t g = 0; g < G; ++g) row[g] *= in.formation.pressure_per_rate;
    }

    std::exception_ptr failure;  // an exception must not leave an OpenMP region
#pragma omp parallel for schedule(dynamic, 1)
    for (std::size_t s = s0; s < s1; ++s) {
      try {
        SegmentScreen& out = result.segments[s];
        const std::size_t pa = first_point[s] - first, pb = first_point[s + 1] - first;
        // Exact Δp at the output times, at the check points that can hold the maximum: those
        // within twice the table error of the highest table value (the exact maximum is among them).
        std::vector<std::vector<std::size_t>> cand_times(pb - pa);  // per point: output indices
        for (std::size_t k = 0; k < K; ++k) {
          const std::size_t g = out_index[k];
          double m = -std::numeric_limits<double>::infinity();
          for (std::size_t p = pa; p < pb; ++p) m = std::max(m, series[p * G + g]);
          for (std::size_t p = pa; p < pb; ++p)
            if (series[p * G + g] >= m - 2.0 * kCandidateMargin * table_error[g]) cand_times[p - pa].push_back(k);
        }
        std::vector<double> best(K, -std::numeric_limits<double>::infinity());
        for (std::size_t p = pa; p < pb; ++p) {
          const auto& ks = cand_times[p - pa];
          if (ks.empty()) continue;
          std::vector<double> ts;
          for (std::size_t k : ks) ts.push_back(in.output_times[k]);
          const hydro::PreparedPoints one = field.prepare(pts.subspan(p, 1));
          const hydro::PressureResult exact = field.evaluate(one, ts, in.formation, {}, true);
          for (std::size_t i = 0; i < ks.size(); ++i) {
            const std::size_t k = ks[i];
            const double total = exact.at(0, i);
            if (!(total > best[k])) continue;  // the first point holding the maximum wins ties
            best[k] = total;
            out.dp[k] = total;
            out.dp_point[k] = p - pa;
            for (std::size_t w = 0; w < W; ++w)
              out.well_share[k * W + w] = total > 0 ? exact.contribution(0, i, w) / total : 0.0;
          }
        }
        // Peak and first crossing on the tracked times: table values, exact at the output times.
        std::vector<double> m(G, -std::numeric_limits<double>::infinity());
        for (std::size_t p = pa; p < pb; ++p)
          for (std::size_t g = 0; g < G; ++g) m[g] = std::max(m[g], series[p * G + g]);
        for (std::size_t k = 0; k < K; ++k) m[out_index[k]] = out.dp[k];
        for (std::size_t g = 0; g < G; ++g) {
          out.tracked_dp[g] = std::max(0.0, m[g]);
          if (m[g] > out.peak_dp) {
            out.peak_dp = m[g];
            out.peak_time = result.tracked_times[g];
          }
          if (!out.first_crossing && out.status == geomech::CriticalStatus::below_failure && m[g] >= out.dp_crit)
            out.first_crossing = result.tracked_times[g];
        }
      } catch (...) {
#pragma omp critical(screen_failure)
        if (!failure) failure = std::current_exception();
      }
    }
    if (failure) std::rethrow_exception(failure);
    if (progress) progress(double(s1) / double(in.segments.size()), user);
  }
  return result;
}

}  // namespace slipscreen::screen
