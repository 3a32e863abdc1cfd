// Probabilistic screen; see slip_probability.hpp for the method. The pieces: the realizations
// (realization_sampler.hpp), the pressure model (pressure_model.hpp), the tracking and the
// per-segment results (here), the maps (probability_maps.hpp).
#include "core/probabilistic/slip_probability.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <utility>

#include "core/errors.hpp"
#include "core/probabilistic/group_factors.hpp"
#include "core/probabilistic/pressure_model.hpp"
#include "core/probabilistic/probability_maps.hpp"
#include "core/probabilistic/realization_sampler.hpp"
#include "core/probabilistic/seismicity_likelihood.hpp"
#include "core/stats/rank_correlation.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {

// What the per-segment results read: the realizations, the pressure model and what is prepared
// once for all segments.
struct Tracking {
  const std::vector<WellInput>& wells;
  const std::vector<SegmentInput>& segments;
  const RunSettings& settings;
  const SampledRealizations& r;
  const PressureModel& pm;
  std::vector<std::vector<double>> input_ranks;              // per sampled input, over the valid realizations
  std::vector<std::pair<std::uint64_t, Eigen::Index>> audit_cols;  // audited realizations: (index, column)
  std::vector<char> audited;                                 // per segment
  std::vector<VariantSearch> variants;                       // RunSettings::what_if, prepared
  const ImportanceWeights* weights = nullptr;                // conditioned runs: per column
};

Tracking prepare_tracking(const std::vector<WellInput>& wells, const std::vector<SegmentInput>& segments,
                          const RunSettings& settings, const SampledRealizations& r, const PressureModel& pm) {
  Tracking tr{wells, segments, settings, r, pm, {}, {}, {}, {}, nullptr};
  const std::size_t n = r.keep.size();
  tr.input_ranks.resize(static_cast<std::size_t>(r.inputs.rows()));
  for (std::size_t j = 0; j < tr.input_ranks.size(); ++j) {
    std::vector<double> col(n);
    for (std::size_t c = 0; c < n; ++c) col[c] = r.inputs(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(c));
    tr.input_ranks[j] = stats::average_ranks(col);
  }
  if (settings.attribute_median && pm.median_nodes.size() != settings.output_index.size() * wells.size())
    throw InputError("median attribution", std::to_string(pm.median_nodes.size()) + " table columns",
                     "every well's at every output time (build_pressure_model)");
  for (std::uint64_t i : settings.audit_realizations) {
    const auto it = std::lower_bound(r.keep.begin(), r.keep.end(), static_cast<Eigen::Index>(i));
    if (it != r.keep.end() && *it == static_cast<Eigen::Index>(i)) tr.audit_cols.emplace_back(i, it - r.keep.begin());
  }
  tr.audited.assign(segments.size(), 0);
  for (std::size_t s : settings.audit_segments)
    if (s < segments.size()) tr.audited[s] = 1;
  return tr;
}

// The fast path's results for the audited realizations at an audited segment.
void add_audit_entries(const Tracking& tr, const SegmentOutcome& o, std::vector<AuditEntry>& out) {
  if (!tr.audited[o.segment]) return;
  for (const auto& [i, c] : tr.audit_cols) {
    AuditEntry a;
    a.realization = i;
    a.segment = o.segment;
    a.diffusivity = tr.r.diffusivity[static_cast<std::size_t>(c)];
    a.prefactor = tr.r.prefactor[static_cast<std::size_t>(c)];
    for (Eigen::Index g = 0; g < tr.pm.factor.rows(); ++g) a.group_scale.push_back(tr.pm.factor(g, c));
    a.well_group = tr.pm.group_of;
    a.dp_crit = tr.r.dp_crit(static_cast<Eigen::Index>(o.segment), c);
    a.first_crossing = o.first_crossing[static_cast<std::size_t>(c)];
    for (std::size_t t = 0; t < tr.settings.output_index.size(); ++t)
      a.dp_at_output.push_back(o.dp_at_output(static_cast<Eigen::Index>(t), c));
    out.push_back(std::move(a));
  }
}

// The slip margin Δp_crit − Δp(final output time) of segment s in every valid realization (never
// critical: the largest double, so that it ranks last and the ranks stay finite), from the
// segment's Δp at the output times (outputs × realizations).
std::vector<double> slip_margins(const Tracking& tr, std::size_t segment, const Eigen::MatrixXd& dp_at_output) {
  const auto s = static_cast<Eigen::Index>(segment);
  const Eigen::Index last = dp_at_output.rows() - 1;
  std::vector<double> margin(static_cast<std::size_t>(dp_at_output.cols()));
  for (std::size_t c = 0; c < margin.size(); ++c) {
    const double dc = tr.r.dp_crit(s, static_cast<Eigen::Index>(c));
    margin[c] = std::isinf(dc) ? std::numeric_limits<double>::max()
                               : dc - dp_at_output(last, static_cast<Eigen::Index>(c));
  }
  return margin;
}

// Slip counts by output time, the Δp_crit sketch and the counts apart over every valid
// realization.
void count_slips(const Tracking& tr, const SegmentOutcome& o, SegmentPart& res) {
  const std::size_t n = o.first_crossing.size(), n_out = tr.settings.output_index.size();
  const auto s = static_cast<Eigen::Index>(o.segment);
  for (std::size_t c = 0; c < n; ++c) {
    const double dc = tr.r.dp_crit(s, static_cast<Eigen::Index>(c));
    if (std::isinf(dc)) {
      ++res.never_critical;
      continue;
    }
    res.dp_crit.add(dc);
    const std::uint64_t u = tr.weights ? tr.weights->units[c] : 0;
    if (tr.weights) res.conditioned.dp_crit.add(dc, u);
    if (dc <= 0.0) {
      ++res.already_critical;
      res.conditioned.already_critical += u;
      continue;
    }
    const int first = o.first_crossing[c];
    if (first < 0) continue;
    ++res.first_slip[static_cast<std::size_t>(first)];
    for (std::size_t t = 0; t < n_out; ++t)
      if (tr.settings.output_index[t] >= static_cast<std::size_t>(first)) {
        ++res.slipped_by[t];
        if (tr.weights) res.conditioned.slipped_by[t] += u;
      }
  }
}

// Spearman ρ of every sampled input, then of the fault's strike and dip perturbations, with the
// slip margin.
std::vector<double> sensitivities(const Tracking& tr, std::size_t segment, const std::vector<double>& margin) {
  const auto margin_ranks = stats::average_ranks(margin);
  const std::size_t n_inputs = tr.input_ranks.size(), n = margin.size();
  std::vector<double> rho(n_inputs + 2);
  for (std::size_t j = 0; j < n_inputs; ++j) rho[j] = stats::spearman_from_ranks(tr.input_ranks[j], margin_ranks).rho;
  const std::size_t f = tr.segments[segment].fault;
  for (std::size_t a = 0; a < 2; ++a) {
    std::vector<double> pert(n);
    for (std::size_t c = 0; c < n; ++c)
      pert[c] = tr.r.perturbation(static_cast<Eigen::Index>(2 * f + a), static_cast<Eigen::Index>(c));
    rho[n_inputs + a] = stats::spearman_from_ranks(stats::average_ranks(pert), margin_ranks).rho;
  }
  return rho;
}

// The value of rank ⌊(n − 1)/2⌋ among vals[0..n) and the column holding it (ties by index).
// The sketch's estimate bounds it (relative accuracy α), so only the values in that window need
// ordering (all of them if the window misses); then the (rank − #smaller)-th equal value.
std::pair<double, Eigen::Index> median_realization(const double* vals, std::size_t n, const stats::QuantileSketch& sketch,
                                                   std::vector<double>& sorted) {
  const std::size_t rank = (n - 1) / 2;
  const double est = sketch.quantile(0.5);
  const double half = 2.0 * sketch.relative_accuracy() * std::abs(est) + sketch.zero_threshold();
  const double lo = est - half, hi = est + half;
  std::size_t below = 0;
  sorted.clear();
  for (std::size_t j = 0; j < n; ++j) {
    if (vals[j] < lo) ++below;
    else if (vals[j] <= hi) sorted.push_back(vals[j]);
  }
  if (!(below <= rank && rank < below + sorted.size())) {  // not in the window: order all
    sorted.assign(vals, vals + n);
    below = 0;
  }
  std::nth_element(sorted.begin(), sorted.begin() + static_cast<std::ptrdiff_t>(rank - below), sorted.end());
  const double median = sorted[rank - below];
  std::size_t tie = rank - static_cast<std::size_t>(std::count_if(vals, vals + n, [&](double y) { return y < median; }));
  for (std::size_t j = 0; j < n; ++j)
    if (vals[j] == median && tie-- == 0) return {median, static_cast<Eigen::Index>(j)};
  return {median, 0};
}

// The check point holding the largest Δp of realization column c at output time t (fast path;
// the first one on ties).
std::size_t hottest_check_point(const Tracking& tr, std::size_t segment, Eigen::Index c, std::size_t t) {
  const auto& sur = *tr.pm.surrogate;
  const auto& draws = tr.pm.draws;
  const std::size_t k = tr.settings.output_index[t];
  double best = -std::numeric_limits<double>::infinity();
  std::size_t hottest = 0;
  for (std::size_t p = 0; p < tr.segments[segment].check_points.size(); ++p) {
    double v = 0.0;
    for (std::size_t g = 0; g < tr.pm.groups; ++g)
      v += sur.table(tr.pm.segment_points[segment][p], g).row(static_cast<Eigen::Index>(k)).dot(draws.basis.col(c)) *
           draws.scale(static_cast<Eigen::Index>(g), c);
    if (v > best) {
      best = v;
      hottest = p;
    }
  }
  return hottest;
}

// Each well's contribution to Δp at point `cp`, output time t, realization column c: every
// source of the well with its sign, from the well's table nodes at that time.
std::vector<double> well_contributions(const Tracking& tr, const hydro::ObservationPoint& cp, Eigen::Index c,
                                       std::size_t t) {
  const auto& pm = tr.pm;
  const std::size_t n_wells = tr.wells.size();
  const double inv4d = 0.25 / tr.r.diffusivity[static_cast<std::size_t>(c)];
  const std::size_t table_nodes = pm.grid.node_count();  // the model's tables' (build_pressure_model)
  std::vector<double> well_dp(n_wells, 0.0);
  for (std::size_t w = 0; w < n_wells; ++w) {
    const float* h_nodes = pm.median_nodes[t * n_wells + w].data();
    double h = 0.0;
    for (std::size_t j = pm.first_source[w]; j < pm.first_source[w + 1]; ++j) {
      const auto& src = pm.sources[j];
      const double dx = cp.x - src.x, dy = cp.y - src.y;
      const double r2 = std::max(dx * dx + dy * dy, src.radius * src.radius);
      h += src.sign * hydro::SimilarityTable::value_from_nodes(hydro::similarity_tap(pm.grid, table_nodes, r2 * inv4d),
                                                               h_nodes);
    }
    well_dp[w] = tr.r.prefactor[static_cast<std::size_t>(c)] * pm.factor(static_cast<Eigen::Index>(pm.group_of[w]), c) * h;
  }
  return well_dp;
}

// The well attribution of the segment's median Δp at every output time (see MedianAttribution).
std::vector<MedianAttribution> median_attributions(const Tracking& tr, std::size_t segment,
                                                   const std::vector<double>& by_time,
                                                   const std::vector<stats::QuantileSketch>& dp) {
  const std::size_t n = tr.r.keep.size();
  std::vector<double> sorted;
  sorted.reserve(tr.r.keep.size());
  std::vector<MedianAttribution> out(tr.settings.output_index.size());
  for (std::size_t t = 0; t < out.size(); ++t) {
    const auto [median, c] = median_realization(by_time.data() + t * n, n, dp.at(t), sorted);
    MedianAttribution& m = out[t];
    m.realization = static_cast<std::uint64_t>(tr.r.keep[static_cast<std::size_t>(c)]);
    m.dp = median;
    m.check_point = hottest_check_point(tr, segment, c, t);
    m.well_dp = well_contributions(tr, tr.segments[segment].check_points[m.check_point], c, t);
  }
  return out;
}

// A segment's results over every valid realization; with `by_time_out` (attribute_median) also
// its Δp by output time, t-major, for finish_over_all.
SegmentPart segment_part(const Tracking& tr, const SegmentOutcome& o, std::vector<double>* by_time_out) {
  const std::size_t n = o.first_crossing.size(), n_out = tr.settings.output_index.size();
  SegmentPart res;
  res.slipped_by.assign(n_out, 0);
  res.first_slip.assign(tr.settings.tracking_times.size(), 0);
  res.dp.assign(n_out, stats::QuantileSketch());
  // Δp by output time, each time's realizations contiguous (column t).
  const Eigen::MatrixXd by_time = o.dp_at_output.transpose();
  for (std::size_t t = 0; t < n_out; ++t)  // one sketch at a time (its buckets stay in cache)
    for (std::size_t c = 0; c < n; ++c) res.dp[t].add(by_time(static_cast<Eigen::Index>(c), static_cast<Eigen::Index>(t)));
  if (tr.weights) {
    res.conditioned.slipped_by.assign(n_out, 0);
    res.conditioned.dp.assign(n_out, stats::WeightedSketch());
    for (std::size_t t = 0; t < n_out; ++t)
      for (std::size_t c = 0; c < n; ++c)
        res.conditioned.dp[t].add(by_time(static_cast<Eigen::Index>(c), static_cast<Eigen::Index>(t)),
                                  tr.weights->units[c]);
  }
  count_slips(tr, o, res);
  for (const auto& v : tr.variants)
    res.what_if.push_back(variant_segment_slips(v, tr.r.dp_crit, o.segment, o.first_crossing, tr.settings.output_index));
  if (by_time_out) by_time_out->assign(by_time.data(), by_time.data() + by_time.size());
  return res;
}

// What needs every realization at a segment: the sensitivities from the slip margins, and the
// median attribution from Δp by output time ([t · n + c]) and its sketches.
FinishedSegment finish_over_all(const Tracking& tr, std::size_t segment, const std::vector<double>& margin,
                                const std::vector<double>& by_time, const std::vector<stats::QuantileSketch>& dp) {
  FinishedSegment f;
  f.sensitivity = sensitivities(tr, segment, margin);
  if (tr.settings.attribute_median) f.median = median_attributions(tr, segment, by_time, dp);
  return f;
}

// The segment's results: the counts of its (merged) part and what needs every realization.
SegmentResult finish_segment(SegmentPart&& part, FinishedSegment&& finished) {
  SegmentResult res;
  res.slipped_by = std::move(part.slipped_by);
  res.first_slip = std::move(part.first_slip);
  res.already_critical = part.already_critical;
  res.never_critical = part.never_critical;
  res.dp_crit = std::move(part.dp_crit);
  res.dp = std::move(part.dp);
  res.conditioned = std::move(part.conditioned);
  res.sensitivity = std::move(finished.sensitivity);
  res.median = std::move(finished.median);
  return res;
}

// A tracked segment's counts and sketches over every realization, and what needs all of them
// (`finished`).
SegmentPart tracked_segment(const Tracking& tr, const SegmentOutcome& o, FinishedSegment& finished) {
  std::vector<double> by_time;
  SegmentPart part = segment_part(tr, o, tr.settings.attribute_median ? &by_time : nullptr);
  finished = finish_over_all(tr, o.segment, slip_margins(tr, o.segment, o.dp_at_output), by_time, part.dp);
  return part;
}

// The segment's what-if counts into out.what_if and its results into out.segments.
void store_segment(std::size_t segment, SegmentPart&& part, FinishedSegment&& finished, ProbabilisticResult& out) {
  if (part.what_if.size() != out.what_if.size())
    throw InputError("what-if counts", std::to_string(part.what_if.size()), std::to_string(out.what_if.size()) + ", one per variant");
  for (std::size_t v = 0; v < part.what_if.size(); ++v) out.what_if[v][segment] = std::move(part.what_if[v]);
  out.segments[segment] = finish_segment(std::move(part), std::move(finished));
}

// Tracks every segment and fills out.segments and out.audit (audited pairs in (realization,
// segment) order).
void track_segments(const Tracking& tr, ProbabilisticResult& out) {
  const std::size_t n_seg = tr.segments.size();
  out.segments.resize(n_seg);
  out.what_if.assign(tr.variants.size(), std::vector<std::vector<std::uint64_t>>(n_seg));
  std::vector<std::vector<AuditEntry>> audit_by_segment(n_seg);
  track_slip(*tr.pm.surrogate, tr.pm.segment_points, tr.pm.draws, tr.r.dp_crit, tr.settings.output_index,
             [&](const SegmentOutcome& o) {
               add_audit_entries(tr, o, audit_by_segment[o.segment]);
               FinishedSegment f;
               SegmentPart part = tracked_segment(tr, o, f);
               store_segment(o.segment, std::move(part), std::move(f), out);
             });
  for (auto& v : audit_by_segment)
    for (auto& a : v) out.audit.push_back(std::move(a));
  std::sort(out.audit.begin(), out.audit.end(), [](const AuditEntry& a, const AuditEntry& b) {
    return std::make_pair(a.realization, a.segment) < std::make_pair(b.realization, b.segment);
  });
}

// Chunks of the segments `own`, in order, whose surrogate holds at most `budget` bytes each at
// `point_bytes` per check point (at least one segment per chunk; one empty chunk when `own` is).
std::vector<SegmentRows> surrogate_chunks(SegmentRows own, const std::vector<SegmentInput>& segments, double point_bytes,
                                          double budget) {
  std::vector<SegmentRows> out;
  std::size_t first = own.first;
  double bytes = 0.0;
  for (std::size_t s = own.first; s < own.second; ++s) {
    const double b = point_bytes * static_cast<double>(segments[s].check_points.size());
    if (s > first && bytes + b > budget) {
      out.emplace_back(first, s);
      first = s;
      bytes = 0.0;
    }
    bytes += b;
  }
  out.emplace_back(first, own.second);
  return out;
}

// This part's range of segments tracked over every realization (as the unsplit run tracks them),
// and its block of valid realizations of the probability maps. With several `chunks` of its
// segments (surrogate_chunks; the model in `model`, whose surrogate holds the first chunk's
// points), the maps come first and their surrogate is then freed, and each later chunk's
// surrogate replaces the one before (rebuild_segment_surrogate).
PartialResult track_part(const Tracking& tr, std::size_t part, std::size_t parts, const std::vector<SegmentRows>& chunks,
                         PressureModel* model) {
  const ColumnRange mine = split_rows(tr.segments.size(), part, parts);
  if (chunks.empty() || chunks.front().first != mine.begin || chunks.back().second != mine.end ||
      (chunks.size() > 1 && model != &tr.pm))
    throw InputError("chunks of segments", std::to_string(chunks.size()),
                     "runs covering segments " + std::to_string(mine.begin) + " to " + std::to_string(mine.end) +
                         ", and the tracked model to rebuild when there are several");
  PartialResult p;
  p.first_segment = mine.begin;
  p.segments.resize(mine.size());
  p.finished.resize(mine.size());
  p.columns = split_columns(tr.r.keep.size(), part, parts);
  ProbabilityMaps maps = probability_maps(tr.pm, tr.r, tr.settings, p.columns);
  p.map_dangerous = std::move(maps.dangerous);
  p.map_oriented = std::move(maps.oriented);
  p.map_dangerous_already_critical = maps.dangerous_already_critical;
  p.map_oriented_already_critical = maps.oriented_already_critical;
  if (chunks.size() > 1) model->map_surrogate.reset();
  for (std::size_t k = 0; k < chunks.size(); ++k) {
    if (k > 0) rebuild_segment_surrogate(*model, tr.segments, tr.settings, chunks[k]);
    track_slip(
        *tr.pm.surrogate, tr.pm.segment_points, tr.pm.draws, tr.r.dp_crit, tr.settings.output_index,
        [&](const SegmentOutcome& o) {
          p.segments[o.segment - mine.begin] = tracked_segment(tr, o, p.finished[o.segment - mine.begin]);
        },
        chunks[k]);
    p.surrogate_error = std::max(p.surrogate_error, tr.pm.surrogate->max_relative_error());
  }
  return p;
}

// Segments [first, end) of `p` (relative to p.first_segment), moved out into a part of their own;
// with `whole` also p's map counts, columns and error estimate.
PartialResult take_segments(PartialResult& p, std::size_t first, std::size_t end, bool whole) {
  PartialResult out;
  out.first_segment = p.first_segment + first;
  for (std::size_t i = first; i < end; ++i) {
    out.segments.push_back(std::move(p.segments[i]));
    out.finished.push_back(std::move(p.finished[i]));
  }
  if (whole) {
    out.surrogate_error = p.surrogate_error;
    out.columns = p.columns;
    out.map_dangerous = std::move(p.map_dangerous);
    out.map_oriented = std::move(p.map_oriented);
    out.map_dangerous_already_critical = p.map_dangerous_already_critical;
    out.map_oriented_already_critical = p.map_oriented_already_critical;
  }
  return out;
}

// Tracks this part's segments and map block and hands them to split.gather; on part 0, merges
// every part and fills out's segments and maps as the unsplit run does (returns true), elsewhere
// returns false. `chunks` and `model` as in track_part. The memory at the merge (docs/cluster.md):
// with `release` the model is emptied once this part has tracked (the merge does not need it);
// the segments go to part 0 in rounds of RunSettings::merge_segments (every part runs the same number of
// rounds, from the largest part's segment count), each part's first round carrying its map
// counts; a part frees each round's segments once encoded, and part 0 keeps its own as they are
// (it gathers empty pieces) and frees each received block once decoded.
bool merge_split(const Tracking& tr, const RealizationSplit& split, ProbabilisticResult& out,
                 const std::vector<SegmentRows>& chunks, PressureModel* model, bool release) {
  PartialResult mine = track_part(tr, split.part, split.parts, chunks, model);
  if (release && model) *model = PressureModel{};
  std::size_t most = 0;
  for (std::size_t q = 0; q < split.parts; ++q) most = std::max(most, split_rows(tr.segments.size(), q, split.parts).size());
  const std::size_t batch = std::max<std::size_t>(1, tr.settings.merge_segments);
  const std::size_t rounds = std::max<std::size_t>(1, (most + batch - 1) / batch);
  std::vector<PartialResult> parts(split.parts);
  for (std::size_t k = 0; k < rounds; ++k) {
    std::vector<std::uint8_t> encoded;
    if (split.part != 0) {
      const std::size_t first = std::min(mine.segments.size(), k * batch);
      const std::size_t end = std::min(mine.segments.size(), first + batch);
      encoded = encode_partial(take_segments(mine, first, end, k == 0));
    }
    auto all = split.gather(std::move(encoded));
    if (!all) continue;
    if (split.part != 0 || all->size() != split.parts)
      throw InputError("partial results", std::to_string(all->size()) + " on part " + std::to_string(split.part),
                       std::to_string(split.parts) + ", one per part, on part 0 only");
    for (std::size_t q = 1; q < all->size(); ++q) {
      PartialResult piece = decode_partial((*all)[q]);
      std::vector<std::uint8_t>().swap((*all)[q]);
      PartialResult& p = parts[q];
      if (k == 0) {
        p = std::move(piece);
        continue;
      }
      if (piece.first_segment != p.first_segment + p.segments.size() || piece.finished.size() != piece.segments.size())
        throw InputError("part " + std::to_string(q) + "'s segments in round " + std::to_string(k),
                         std::to_string(piece.segments.size()) + " from " + std::to_string(piece.first_segment),
                         "the segments that follow its earlier rounds, from " +
                             std::to_string(p.first_segment + p.segments.size()));
      for (auto& g : piece.segments) p.segments.push_back(std::move(g));
      for (auto& f : piece.finished) p.finished.push_back(std::move(f));
    }
  }
  if (split.part != 0) return false;
  parts[0] = std::move(mine);
  PartialResult m = merge_partials(std::move(parts));
  if (m.columns.end != tr.r.keep.size())
    throw InputError("merged columns", std::to_string(m.columns.end), std::to_string(tr.r.keep.size()) + " valid realizations");
  if (m.first_segment != 0 || m.segments.size() != tr.segments.size() || m.finished.size() != tr.segments.size())
    throw InputError("merged segments", std::to_string(m.segments.size()) + " from " + std::to_string(m.first_segment),
                     "every one of the " + std::to_string(tr.segments.size()) + " segments, from 0");
  out.surrogate_error = m.surrogate_error;
  out.segments.resize(m.segments.size());
  out.what_if.assign(tr.variants.size(), std::vector<std::vector<std::uint64_t>>(m.segments.size()));
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t s = 0; s < m.segments.size(); ++s)
    errors.iteration(s, [&] { store_segment(s, std::move(m.segments[s]), std::move(m.finished[s]), out); });
  errors.rethrow();
  out.map_dangerous = std::move(m.map_dangerous);
  out.map_oriented = std::move(m.map_oriented);
  out.map_dangerous_already_critical = m.map_dangerous_already_critical;
  out.map_oriented_already_critical = m.map_oriented_already_critical;
  return true;
}

// The pressure model of a group's scaled part (group_factors.hpp): its split wells over the part
// of their schedules that is scaled, each taking the sampled rate factor of its origin well (the
// same realizations and rate groups as the screen's).
PressureModel group_part_model(const GroupSplit& g, const std::vector<SegmentInput>& segments, const RunSettings& settings,
                               const InputList& list, const SampledRealizations& r, const util::WorkShare* share = nullptr,
                               std::optional<SegmentRows> own = std::nullopt) {
  if (g.origin.size() != g.wells.size() || g.in_group.size() != g.wells.size())
    throw InputError("well group", std::to_string(g.wells.size()) + " wells", "an origin and a flag per split well");
  std::vector<WellInput> part;
  InputList part_list = list;
  part_list.well_rate.clear();
  for (std::size_t w = 0; w < g.wells.size(); ++w)
    if (g.in_group[w]) {
      part.push_back(g.wells[w]);
      part_list.well_rate.push_back(list.well_rate.at(g.origin[w]));
    }
  if (part.empty()) throw InputError("well group", "(no well)", "at least one well whose rates are scaled");
  return build_pressure_model(part, segments, settings, part_list, r, share, own);
}

}  // namespace

std::vector<std::uint64_t> slipped_by_tracking(const SegmentResult& segment) {
  std::vector<std::uint64_t> by(segment.first_slip.size());
  std::uint64_t sum = 0;
  for (std::size_t k = 0; k < by.size(); ++k) by[k] = sum += segment.first_slip[k];
  return by;
}

std::optional<std::size_t> first_tracking_index_reaching(const SegmentResult& segment, std::uint64_t realizations,
                                                         double threshold) {
  if (realizations == 0) return std::nullopt;
  const double n = static_cast<double>(realizations);
  std::uint64_t sum = 0;
  for (std::size_t k = 0; k < segment.first_slip.size(); ++k) {
    sum += segment.first_slip[k];
    if (static_cast<double>(sum) / n >= threshold) return k;
  }
  return std::nullopt;
}

double MedianAttribution::share(std::size_t w) const {
  double total = 0.0;
  for (double v : well_dp) total += v;
  return total > 0.0 ? well_dp.at(w) / total : 0.0;
}

ProbabilisticResult run_probabilistic(const UncertainModel& model, const std::vector<WellInput>& wells,
                                      const std::vector<SegmentInput>& segments, const RunSettings& settings,
                                      const RealizationSplit* split) {
  const stats::RealizationCount count(static_cast<std::int64_t>(settings.realizations), "realizations");
  if (wells.empty()) throw InputError("wells", "(none)", "at least one well with an injection history");
  if (segments.empty()) throw InputError("fault segments", "(none)", "at least one fault segment");
  if (settings.tracking_times.empty() || settings.output_index.empty())
    throw InputError("output times", "(none)", "at least one output time on the tracking grid");
  if (!(model.depth > 0.0)) throw InputError("reference depth", std::to_string(model.depth), "a depth > 0 m");
  const bool split_run = split && split->parts > 1;
  if (split_run && (!split->gather || split->part >= split->parts))
    throw InputError("realization split", std::to_string(split->part) + " of " + std::to_string(split->parts),
                     "a part below the part count and a gather function");
  if (split_run && !settings.audit_realizations.empty())
    throw InputError("audit realizations", std::to_string(settings.audit_realizations.size()),
                     "none in a run split across processes");
  std::size_t fault_count = 0;
  for (const auto& s : segments) {
    if (s.check_points.empty()) throw InputError("segment check points", "0", "at least one check point per segment");
    fault_count = std::max(fault_count, s.fault + 1);
  }

  // A part of a split run tracks its own segments, so it draws only their thresholds and its
  // surrogate holds only their check points (docs/cluster.md); the allowable rate and the
  // seismicity likelihood read every segment's.
  std::optional<SegmentRows> own;
  if (split_run && !settings.capacity && !settings.seismicity) {
    const ColumnRange rows = split_rows(segments.size(), split->part, split->parts);
    own = SegmentRows{rows.begin, rows.end};
  }
  const InputList list = make_inputs(model, wells, fault_count);
  const SampledRealizations r = sample_realizations(model, list, segments, fault_count, settings, count, own);
  ProbabilisticResult out;
  out.realizations = r.keep.size();
  out.rejected = r.drawn - r.keep.size();
  out.beyond_frictional_limit = r.beyond_frictional_limit;
  out.sampler = r.sampler;
  out.input_names = sampled_input_names(model, wells, fault_count);

  const util::WorkShare share = split_run ? split->work_share() : util::WorkShare{};
  // A part tracks its segments in chunks when their surrogate would hold more than
  // surrogate_chunk_bytes (not with what-if variants, whose models cover every own segment).
  std::vector<SegmentRows> chunks;
  if (own) {
    const double d_min = *std::min_element(r.diffusivity.begin(), r.diffusivity.end());
    const double d_max = *std::max_element(r.diffusivity.begin(), r.diffusivity.end());
    const double point_bytes = 8.0 * static_cast<double>(rate_group_count(list)) *
                               static_cast<double>(surrogate_node_count(settings, d_min, d_max)) *
                               static_cast<double>(settings.tracking_times.size() + 1);
    chunks = settings.what_if.empty() ? surrogate_chunks(*own, segments, point_bytes, settings.surrogate_chunk_bytes)
                                      : std::vector<SegmentRows>{*own};
  }
  PressureModel pm = build_pressure_model(wells, segments, settings, list, r, &share, own ? std::optional(chunks.front()) : own);
  out.diffusivity_min = pm.diffusivity_min;
  out.diffusivity_max = pm.diffusivity_max;
  out.surrogate_error = pm.surrogate->max_relative_error();
  // The allowable rate is not split yet: part 0 computes it over every realization (each part
  // samples them all and builds the same model), so it equals the unsplit run's (docs/cluster.md,
  // "Not done yet"). The what-if variants are searched segment by segment while the screen tracks
  // (segment_part), from the screen's first crossings, and their counts merge like the screen's.
  const auto decision_answers = [&] {
    if (settings.capacity)
      out.capacity = group_factor_curves(pm, group_part_model(*settings.capacity, segments, settings, list, r), r.dp_crit,
                                         settings.capacity->horizon, settings.capacity->f_max,
                                         settings.capacity->thresholds, settings.capacity->z);
  };
  if (!settings.observations.empty() || settings.seismicity) {  // every part computes every weight
    SeismicityLikelihood seismicity;
    if (settings.seismicity) seismicity = seismicity_likelihood(pm, r, list, settings);
    out.conditioning = condition_on_pressures(pm, wells, settings, list, r.inputs, seismicity.log_likelihood);
    out.conditioning->seismicity_beyond_domain = seismicity.beyond_domain;
  }
  Tracking tr = prepare_tracking(wells, segments, settings, r, pm);
  if (out.conditioning) tr.weights = &out.conditioning->weights;
  for (const auto& v : settings.what_if)
    tr.variants.push_back(
        prepare_variant(pm, group_part_model(v, segments, settings, list, r, &share, own), v.factor, r.keep.size()));
  if (split_run) {
    if (!own) {  // the whole surrogate: this part's segments in one chunk
      const ColumnRange rows = split_rows(segments.size(), split->part, split->parts);
      chunks = {SegmentRows{rows.begin, rows.end}};
    }
    // The allowable rate reads the model after the merge; nothing else does.
    if (!merge_split(tr, *split, out, chunks, &pm, !settings.capacity))
      out.merged_elsewhere = true;
    else
      decision_answers();
    return out;
  }
  track_segments(tr, out);
  decision_answers();

  ProbabilityMaps maps = probability_maps(pm, r, settings);
  out.map_dangerous = std::move(maps.dangerous);
  out.map_oriented = std::move(maps.oriented);
  out.map_dangerous_already_critical = maps.dangerous_already_critical;
  out.map_oriented_already_critical = maps.oriented_already_critical;
  return out;
}

AuditEntry plain_slip_check(const AuditEntry& fast, const std::vector<WellInput>& wells,
                            const std::vector<SegmentInput>& segments, const RunSettings& settings) {
  AuditEntry a = fast;
  const auto& seg = segments.at(a.segment);
  const std::size_t n_t = settings.tracking_times.size();
  std::vector<double> best(n_t, 0.0);
  for (std::size_t p = 0; p < seg.check_points.size(); ++p) {
    std::vector<double> dp(n_t, 0.0);
    for (std::size_t w = 0; w < wells.size(); ++w) {
      const double f = a.prefactor * a.group_scale.at(a.well_group.at(w));
      for (const auto& im : hydro::image_wells(wells[w].x, wells[w].y, settings.boundaries)) {
        const double dx = seg.check_points[p].x - im.x, dy = seg.check_points[p].y - im.y;
        const double r2 = std::max(dx * dx + dy * dy, wells[w].radius * wells[w].radius);
        for (std::size_t k = 0; k < n_t; ++k)
          dp[k] += f * im.sign * hydro::SimilarityTable::direct(wells[w].steps, r2 / (4.0 * a.diffusivity), settings.tracking_times[k],
                                                                       settings.leakage_rate);
      }
    }
    for (std::size_t k = 0; k < n_t; ++k) best[k] = p == 0 ? dp[k] : std::max(best[k], dp[k]);
  }
  a.first_crossing = -1;
  if (a.dp_crit <= 0.0) a.first_crossing = 0;
  else
    for (std::size_t k = 0; k < n_t; ++k)
      if (best[k] >= a.dp_crit) {
        a.first_crossing = static_cast<int>(k);
        break;
      }
  a.dp_at_output.clear();
  for (std::size_t o : settings.output_index) a.dp_at_output.push_back(best[o]);
  return a;
}

}  // namespace slipscreen::probabilistic
