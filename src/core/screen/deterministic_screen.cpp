#include "core/screen/deterministic_screen.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <tuple>
#include <utility>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/util/parallel_errors.hpp"
#include "core/util/word_codec.hpp"

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

// The tracked times: the tracking grid merged with the output times, each time once.
std::vector<double> merged_times(const std::vector<double>& tracking, const std::vector<double>& output) {
  std::vector<double> tracked;
  std::merge(tracking.begin(), tracking.end(), output.begin(), output.end(), std::back_inserter(tracked));
  tracked.erase(std::unique(tracked.begin(), tracked.end()), tracked.end());
  return tracked;
}

// Every segment's check points in one list: segment s holds points [first[s], first[s + 1]).
struct CheckPoints {
  std::vector<hydro::FieldPoint> points;
  std::vector<std::size_t> first;
};

// Stress on every segment (no pressure dependence): σn, τ, the tendencies and Δp_crit, from
// geomech/fault_stress.hpp and geomech/coulomb.hpp. Gathers the segments' check points.
CheckPoints resolve_segments(const ScreenInputs& in, std::vector<SegmentScreen>& segments) {
  const Eigen::Matrix3d stress = geomech::stress_tensor_ned(in.stress);
  const double p0 = in.stress.pore_pressure;
  segments.resize(in.segments.size());
  CheckPoints cps;
  cps.first.assign(in.segments.size() + 1, 0);
  for (std::size_t s = 0; s < in.segments.size(); ++s) {
    const ScreenSegment& seg = in.segments[s];
    if (seg.check_points.empty())
      throw InputError("segment " + seg.segment_id, "no check points", "at least one check point");
    SegmentScreen& out = segments[s];
    const geomech::FaultPlane plane = geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip);
    const geomech::ResolvedStress rs = geomech::resolve(stress, p0, plane);
    geomech::Friction f = in.friction;
    if (seg.friction) f.mu = *seg.friction;
    const geomech::CriticalPressure cp =
        in.stress_path_kappa > 0.0
            ? geomech::critical_pressure_poroelastic(stress, p0, plane.normal(), f, in.stress_path_kappa)
            : geomech::critical_pressure(rs.shear_stress, rs.normal_stress, p0, f);
    out.coulomb_change = geomech::coulomb_path_change(stress, plane.normal(), f.mu, in.stress_path_kappa);
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
    cps.first[s] = cps.points.size();
    for (const auto& p : seg.check_points) cps.points.push_back({p.x, p.y});
  }
  cps.first[in.segments.size()] = cps.points.size();
  return cps;
}

// What every block of segments shares: the field, the table Δp at the screened check points on
// the tracked times, the bound on the table error, and where the output times sit among the
// tracked times.
struct TabulatedField {
  const ScreenInputs& in;
  const hydro::PressureField& field;
  const std::vector<double>& tracked_times;
  double inv4d = 0;                          // 1/(4D)
  std::size_t first_point = 0;               // the first screened check point
  std::vector<double> series;                // [(p − first_point) · G + g]: Δp from the tables
  std::vector<double> table_error;           // per tracked time
  std::vector<std::size_t> out_index;        // tracked index of each output time
};

// The similarity tables' builder at the tracked times `own`: one grid for all wells, spanning
// x = r²/(4D) from the smallest well radius to the farthest source of any check point (of every
// segment, so that every process of a split run builds the same grid).
hydro::TableBuilder table_builder(const TabulatedField& tf, const std::vector<hydro::FieldPoint>& points,
                                  std::vector<hydro::RateSteps>& steps, std::span<const std::size_t> own) {
  const std::size_t W = tf.in.wells.size();
  double rw_min = std::numeric_limits<double>::infinity(), r2_max = 1.0;
  steps.assign(W, {});
  for (std::size_t w = 0; w < W; ++w) {
    rw_min = std::min(rw_min, tf.in.wells[w].radius);
    for (const auto& c : tf.in.wells[w].history.changes()) {
      steps[w].time.push_back(c.time);
      steps[w].delta_rate.push_back(c.delta);
    }
    for (const auto& src : tf.field.sources(w))
      for (const auto& p : points)
        r2_max = std::max(r2_max, (p.x - src.x) * (p.x - src.x) + (p.y - src.y) * (p.y - src.y));
  }
  const hydro::SimilarityGrid grid{std::log(rw_min * rw_min * tf.inv4d) - 0.1, std::log(r2_max * tf.inv4d) + 0.1,
                                   kTableStep, tf.in.formation.leakage_rate};
  return {steps, tf.tracked_times, grid, own};
}

// Table Δp at some points and tracked times, and the bound on the table error at those times.
struct TableValues {
  std::vector<double> series;  // [p · own.size() + k]
  std::vector<double> error;   // [k]
};

// Adds the wells [first, first + tables.size()) to the table Δp at the points [pa, pb) (sources
// clamped to r_w as in hydro::PressureField::prepare) and to the bound on the table error: the
// stated accuracy of each source's table, summed over sources. A point adds its wells and their
// sources in order, so blocks of wells give the same sums as one.
void add_table_block(const TabulatedField& tf, const std::vector<hydro::FieldPoint>& points, std::size_t pa,
                     std::size_t pb, std::size_t first, const std::vector<hydro::SimilarityTable>& tables,
                     TableValues& v) {
  const std::size_t G = v.error.size();
  for (std::size_t i = 0; i < tables.size(); ++i)
    for (std::size_t g = 0; g < G; ++g)
      v.error[g] += kTableAccuracy * tf.in.formation.pressure_per_rate *
                    static_cast<double>(tf.field.sources(first + i).size()) * tables[i].scale(g);
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 64)
  for (std::size_t p = pa; p < pb; ++p)
    errors.iteration(p, [&] {
      const hydro::FieldPoint& pt = points[p];
      double* row = &v.series[(p - pa) * G];
      for (std::size_t i = 0; i < tables.size(); ++i) {
        const double rw2 = tf.in.wells[first + i].radius * tf.in.wells[first + i].radius;
        for (const auto& src : tf.field.sources(first + i)) {
          const double dx = pt.x - src.x, dy = pt.y - src.y;
          tables[i].accumulate(tables[i].tap(std::max(dx * dx + dy * dy, rw2) * tf.inv4d), src.sign, row);
        }
      }
    });
  errors.rethrow();
}

// The table Δp at the check points [pa, pb) at the tracked times `own`, the tables built by
// blocks of wells (ScreenInputs::table_block_bytes) and each block dropped before the next.
TableValues table_values(const TabulatedField& tf, const CheckPoints& cps, std::size_t pa, std::size_t pb,
                         std::span<const std::size_t> own) {
  TableValues v{std::vector<double>((pb - pa) * own.size(), 0.0), std::vector<double>(own.size(), 0.0)};
  if (own.empty()) return v;
  std::vector<hydro::RateSteps> steps;
  const hydro::TableBuilder builder = table_builder(tf, cps.points, steps, own);
  for (const auto& [w0, w1] : builder.blocks(tf.in.table_block_bytes))
    add_table_block(tf, cps.points, pa, pb, w0, builder.build(w0, w1), v);
  for (double& x : v.series) x *= tf.in.formation.pressure_per_rate;
  return v;
}

// The tracked times whose tables part `part` of `parts` builds: every parts-th from `part`
// (interleaved, as a time's tables cost grows with the rate steps before it).
std::vector<std::size_t> part_times(std::size_t G, std::size_t part, std::size_t parts) {
  std::vector<std::size_t> own;
  for (std::size_t g = part; g < G; g += parts) own.push_back(g);
  return own;
}

// The table Δp at the check points [first, end) on the tracked times. Split across processes
// (an active `share`) by tracked times: each part builds every well's tables at its times only,
// for every check point, and the parts exchange the values (P · G doubles in all, far less than
// the tables; docs/cluster.md). A value is summed over the same sources in the same order
// whichever part computes it, so the results are those of one process.
TabulatedField tabulate(const ScreenInputs& in, const hydro::PressureField& field, const CheckPoints& cps,
                        std::size_t first, std::size_t end, const std::vector<double>& tracked_times,
                        const util::WorkShare* share) {
  const std::size_t G = tracked_times.size();
  TabulatedField tf{in, field, tracked_times, 1.0 / (4.0 * in.formation.diffusivity), first, {}, {}, {}};
  tf.out_index.resize(in.output_times.size());
  for (std::size_t k = 0; k < in.output_times.size(); ++k)
    tf.out_index[k] = static_cast<std::size_t>(
        std::lower_bound(tracked_times.begin(), tracked_times.end(), in.output_times[k]) - tracked_times.begin());
  if (!share || !share->active()) {
    TableValues v = table_values(tf, cps, first, end, part_times(G, 0, 1));
    tf.series = std::move(v.series);
    tf.table_error = std::move(v.error);
    return tf;
  }
  const std::size_t P = cps.points.size();
  std::vector<std::vector<std::uint8_t>> all;
  {
    const TableValues mine = table_values(tf, cps, 0, P, part_times(G, share->part, share->parts));
    util::WordWriter out;
    out.reserve(2 + mine.error.size() + mine.series.size());
    out.doubles(mine.error);
    out.doubles(mine.series);
    all = share->all_gather(std::move(out).bytes());
  }
  if (all.size() != share->parts)
    throw InputError("shared table pressures", std::to_string(all.size()) + " parts", std::to_string(share->parts));
  tf.series.assign((end - first) * G, 0.0);
  tf.table_error.assign(G, 0.0);
  for (std::size_t q = 0; q < all.size(); ++q) {
    const std::vector<std::size_t> times = part_times(G, q, share->parts);
    util::WordReader piece(all[q], "the table pressures of another process (deterministic_screen.cpp tabulate)");
    const std::vector<double> error = piece.doubles(), series = piece.doubles();
    if (error.size() != times.size() || series.size() != P * times.size() || !piece.done())
      piece.fail(std::to_string(error.size()) + " times and " + std::to_string(series.size()) + " values");
    for (std::size_t k = 0; k < times.size(); ++k) tf.table_error[times[k]] = error[k];
    for (std::size_t p = first; p < end; ++p)
      for (std::size_t k = 0; k < times.size(); ++k) tf.series[(p - first) * G + times[k]] = series[p * times.size() + k];
  }
  return tf;
}

// Each well's fraction of the exact Δp at point 0 and time i of `exact` (0 when Δp = 0), written
// to `all` (W values) unless it is null; returns the largest fraction's well and value (the first
// well on ties; well 0 and 0 when no fraction is positive).
std::pair<std::size_t, double> well_fractions(const hydro::PressureResult& exact, std::size_t i, std::size_t W,
                                              double* all) {
  const double total = exact.at(0, i);
  std::pair<std::size_t, double> lead{0, 0.0};
  for (std::size_t w = 0; w < W; ++w) {
    const double v = total > 0 ? exact.contribution(0, i, w) / total : 0.0;
    if (v > lead.second) lead = {w, v};
    if (all) all[w] = v;
  }
  return lead;
}

// Exact Δp at the output times, at the check points [pa, pb) of one segment that can hold the
// maximum: those within twice the table error of the highest table value (the exact maximum is
// among them). Fills dp, dp_point and well_share.
void exact_output_dp(const TabulatedField& tf, std::span<const hydro::FieldPoint> pts,
                     std::span<const double> series, std::size_t pa, std::size_t pb, SegmentScreen& out) {
  const std::size_t W = tf.in.wells.size();
  const std::size_t K = tf.in.output_times.size();
  const std::size_t G = tf.tracked_times.size();
  std::vector<std::vector<std::size_t>> cand_times(pb - pa);  // per point: output indices
  for (std::size_t k = 0; k < K; ++k) {
    const std::size_t g = tf.out_index[k];
    double m = -std::numeric_limits<double>::infinity();
    for (std::size_t p = pa; p < pb; ++p) m = std::max(m, series[p * G + g]);
    for (std::size_t p = pa; p < pb; ++p)
      if (series[p * G + g] >= m - 2.0 * kCandidateMargin * tf.table_error[g]) cand_times[p - pa].push_back(k);
  }
  std::vector<double> best(K, -std::numeric_limits<double>::infinity());
  for (std::size_t p = pa; p < pb; ++p) {
    const auto& ks = cand_times[p - pa];
    if (ks.empty()) continue;
    std::vector<double> ts;
    for (std::size_t k : ks) ts.push_back(tf.in.output_times[k]);
    const hydro::PreparedPoints one = tf.field.prepare(pts.subspan(p, 1));
    const hydro::PressureResult exact = tf.field.evaluate(one, ts, tf.in.formation, {}, true);
    for (std::size_t i = 0; i < ks.size(); ++i) {
      const std::size_t k = ks[i];
      const double total = exact.at(0, i);
      if (!(total > best[k])) continue;  // the first point holding the maximum wins ties
      best[k] = total;
      out.dp[k] = total;
      out.dp_point[k] = p - pa;
      std::tie(out.leading_well[k], out.leading_share[k]) =
          well_fractions(exact, i, W, tf.in.all_well_shares ? &out.well_share[k * W] : nullptr);
    }
  }
}

// Peak and first crossing of one segment on the tracked times: the maximum over its check points
// [pa, pb) of the table values, replaced by the exact values at the output times.
void track_peak_and_crossing(const TabulatedField& tf, std::span<const double> series, std::size_t pa,
                             std::size_t pb, SegmentScreen& out) {
  const std::size_t G = tf.tracked_times.size();
  std::vector<double> m(G, -std::numeric_limits<double>::infinity());
  for (std::size_t p = pa; p < pb; ++p)
    for (std::size_t g = 0; g < G; ++g) m[g] = std::max(m[g], series[p * G + g]);
  for (std::size_t k = 0; k < tf.in.output_times.size(); ++k) m[tf.out_index[k]] = out.dp[k];
  for (std::size_t g = 0; g < G; ++g) {
    out.tracked_dp[g] = std::max(0.0, m[g]);
    if (m[g] > out.peak_dp) {
      out.peak_dp = m[g];
      out.peak_time = tf.tracked_times[g];
    }
    if (!out.first_crossing && out.status == geomech::CriticalStatus::below_failure && m[g] >= out.dp_crit)
      out.first_crossing = tf.tracked_times[g];
  }
}

// Each well's share of the exact Δp at the first crossing, at the check point holding the
// maximum there (an output time: the exact maximum's point; otherwise the table maximum's, the
// first on ties).
void crossing_shares(const TabulatedField& tf, std::span<const hydro::FieldPoint> pts, std::span<const double> series,
                     std::size_t pa, std::size_t pb, SegmentScreen& out) {
  if (!out.first_crossing) return;
  const std::size_t G = tf.tracked_times.size(), W = tf.in.wells.size();
  const auto g = static_cast<std::size_t>(
      std::lower_bound(tf.tracked_times.begin(), tf.tracked_times.end(), *out.first_crossing) - tf.tracked_times.begin());
  std::size_t point = pa;
  const auto k_out = std::find(tf.out_index.begin(), tf.out_index.end(), g);
  if (k_out != tf.out_index.end()) point = pa + out.dp_point[static_cast<std::size_t>(k_out - tf.out_index.begin())];
  else
    for (std::size_t p = pa + 1; p < pb; ++p)
      if (series[p * G + g] > series[point * G + g]) point = p;
  const hydro::PreparedPoints one = tf.field.prepare(pts.subspan(point, 1));
  const std::vector<double> ts{*out.first_crossing};
  const hydro::PressureResult exact = tf.field.evaluate(one, ts, tf.in.formation, {}, true);
  if (tf.in.all_well_shares) out.crossing_share.assign(W, 0.0);
  std::tie(out.crossing_well, out.crossing_well_share) =
      well_fractions(exact, 0, W, tf.in.all_well_shares ? out.crossing_share.data() : nullptr);
}

// Screens the segments [s0, s1) as one block: each segment's exact Δp at the output times, peak
// and first crossing from the table Δp at their check points.
void screen_block(const TabulatedField& tf, const CheckPoints& cps, std::size_t s0, std::size_t s1,
                  std::vector<SegmentScreen>& segments) {
  const std::size_t first = cps.first[s0], n_pts = cps.first[s1] - first;
  const std::span<const hydro::FieldPoint> pts(cps.points.data() + first, n_pts);
  const std::size_t G = tf.tracked_times.size();
  const std::span<const double> series(tf.series.data() + (first - tf.first_point) * G, n_pts * G);
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t s = s0; s < s1; ++s)
    errors.iteration(s, [&] {
      const std::size_t pa = cps.first[s] - first, pb = cps.first[s + 1] - first;
      exact_output_dp(tf, pts, series, pa, pb, segments[s]);
      track_peak_and_crossing(tf, series, pa, pb, segments[s]);
      crossing_shares(tf, pts, series, pa, pb, segments[s]);
    });
  errors.rethrow();
}

}  // namespace

ScreenResult deterministic_screen(const ScreenInputs& in, Progress progress, void* user, SegmentRange only,
                                  const util::WorkShare* share) {
  if (in.output_times.empty()) throw InputError("output times", "(none)", "at least one output time");
  check_times(in.output_times, "output times");
  check_times(in.tracking_times, "tracking times");
  geomech::check(in.stress);
  geomech::check(in.friction);

  ScreenResult result;
  result.tracked_times = merged_times(in.tracking_times, in.output_times);
  const CheckPoints cps = resolve_segments(in, result.segments);

  const std::size_t W = in.wells.size();
  const std::size_t K = in.output_times.size();
  const std::size_t G = result.tracked_times.size();
  result.well_count = W;
  for (auto& out : result.segments) {
    out.dp.assign(K, 0.0);
    out.dp_point.assign(K, 0);
    out.well_share.assign(in.all_well_shares ? K * W : 0, 0.0);
    out.leading_well.assign(K, 0);
    out.leading_share.assign(K, 0.0);
    out.tracked_dp.assign(G, 0.0);
  }
  if (W == 0 || in.segments.empty()) return result;

  std::vector<hydro::WellSource> sources;
  for (const auto& w : in.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), in.boundaries);
  hydro::validate(in.formation);
  const std::size_t end = std::min(only.end, in.segments.size()), first = std::min(only.first, end);
  // Every screened check point checked (finite, inside the region; InputError otherwise) before
  // any table is built.
  const std::span<const hydro::FieldPoint> screened(cps.points.data() + cps.first[first], cps.first[end] - cps.first[first]);
  result.radius_clamped = field.check_points(screened);
  // Split across processes, the table Δp is computed at every segment's check points (tabulate).
  if (share && share->active()) (void)field.check_points(cps.points);
  const TabulatedField tf = tabulate(in, field, cps, cps.first[first], cps.first[end], result.tracked_times, share);

  // Segments in blocks, so that progress can be reported; each block is computed exactly as a
  // whole run would be (results do not depend on the blocking).
  const std::size_t block = 64;
  for (std::size_t s0 = first; s0 < end; s0 += block) {
    const std::size_t s1 = std::min(end, s0 + block);
    screen_block(tf, cps, s0, s1, result.segments);
    if (progress) progress(double(s1 - first) / double(end - first), user);
  }
  return result;
}

}  // namespace slipscreen::screen
