#include "core/probabilistic/slip_tracker.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/probabilistic/chunk_bounds.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr std::size_t kBlock = 256;  // realizations per matrix product
constexpr std::size_t kChunk = 24;   // tracking times per chunk of the first-crossing search

// The inputs shared by every segment of one track_slip call.
struct TrackInputs {
  const hydro::PressureSurrogate& surrogate;
  const PressureDraws& draws;
  const Eigen::MatrixXf& dp_crit;
  const std::vector<Eigen::Index>& out_rows;
  const Eigen::MatrixXd& basis_parts;  // split_basis(draws.basis), for the bounds
  std::size_t n_times, n_groups, n_chunks;
  Eigen::Index n_nodes, n_real;
};

// One thread's buffers, reused from segment to segment (no allocation once they have grown).
struct Workspace {
  std::vector<Eigen::MatrixXd> g_out, block;  // per (point, group): output rows; per group: basis × scale
  Eigen::MatrixXd series, best, chunk_bound, b;
  Eigen::RowVectorXd span;
  std::vector<Eigen::Index> all, active, in_chunk, sieved;
};

void check_track_inputs(std::size_t n_seg, Eigen::Index n_real, const Eigen::MatrixXf& dp_crit,
                        std::size_t n_times, std::span<const std::size_t> output_index) {
  if ((dp_crit.rows() != static_cast<Eigen::Index>(n_seg) && dp_crit.rows() != 1) || dp_crit.cols() != n_real)
    throw InputError("dp_crit", std::to_string(dp_crit.rows()) + "x" + std::to_string(dp_crit.cols()),
                     "one Δp_crit per segment and realization");
  for (std::size_t o : output_index)
    if (o >= n_times) throw InputError("output index", std::to_string(o), "a tracking-time index");
}

// Δp_crit of segment s in realization r (one shared row when dp_crit has a single row).
double critical_dp(const Eigen::MatrixXf& dp_crit, std::size_t s, Eigen::Index r) {
  return double(dp_crit(dp_crit.rows() == 1 ? 0 : static_cast<Eigen::Index>(s), r));
}

// Upper bound on Δp per chunk and realization (max over check points) into ws.chunk_bound
// (chunk_bounds.hpp), −∞ for the realizations that cannot cross at all: those whose bound over
// every time and check point at once (the first sieve) stays below Δp_crit, and those critical
// before injection.
void bound_chunks(const TrackInputs& in, const std::vector<std::size_t>& pts, std::size_t s, Workspace& ws) {
  const auto n_times = static_cast<Eigen::Index>(in.n_times);
  span_bounds(in.surrogate, pts, 0, n_times, in.basis_parts, in.draws.scale, ws.span, nullptr);
  ws.sieved.clear();
  for (Eigen::Index r = 0; r < in.n_real; ++r) {
    const double crit = critical_dp(in.dp_crit, s, r);
    if (crit > 0.0 && ws.span(r) >= crit) ws.sieved.push_back(r);
  }
  for (std::size_t i = 0; i < pts.size(); ++i) {
    chunk_bounds(in.surrogate, pts[i], 0, n_times, static_cast<Eigen::Index>(kChunk), in.basis_parts, in.draws.scale, ws.b,
                 nullptr, &ws.sieved);
    if (i == 0) ws.chunk_bound = ws.b;
    else ws.chunk_bound = ws.chunk_bound.cwiseMax(ws.b);
  }
}

// Evaluates the rows [k0, k0 + len) (len = 0: the output rows, ws.g_out) for the realizations in
// `list`, in blocks of kBlock, and hands each block's maximum over check points (ws.best) to `use`.
template <class Use>
void evaluate_series(const TrackInputs& in, const std::vector<std::size_t>& pts, Workspace& ws,
                     const std::vector<Eigen::Index>& list, Eigen::Index k0, Eigen::Index len, const Use& use) {
  for (std::size_t c0 = 0; c0 < list.size(); c0 += kBlock) {
    const auto nb = static_cast<Eigen::Index>(std::min(kBlock, list.size() - c0));
    for (std::size_t g = 0; g < in.n_groups; ++g) {
      ws.block[g].resize(in.n_nodes, nb);
      for (Eigen::Index c = 0; c < nb; ++c) {
        const Eigen::Index r = list[c0 + static_cast<std::size_t>(c)];
        ws.block[g].col(c) = in.draws.basis.col(r) * in.draws.scale(static_cast<Eigen::Index>(g), r);
      }
    }
    for (std::size_t i = 0; i < pts.size(); ++i) {
      for (std::size_t g = 0; g < in.n_groups; ++g) {
        if (len == 0) {
          if (g == 0) ws.series.noalias() = ws.g_out[i * in.n_groups + g] * ws.block[g];
          else ws.series.noalias() += ws.g_out[i * in.n_groups + g] * ws.block[g];
        } else {
          const auto rows = in.surrogate.table(pts[i], g).middleRows(k0, len);
          if (g == 0) ws.series.noalias() = rows * ws.block[g];
          else ws.series.noalias() += rows * ws.block[g];
        }
      }
      if (i == 0) ws.best = ws.series;
      else ws.best = ws.best.cwiseMax(ws.series);
    }
    use(c0, nb);
  }
}

// Δp at the output times for every realization.
void pressure_at_outputs(const TrackInputs& in, const std::vector<std::size_t>& pts, Workspace& ws,
                         SegmentOutcome& res) {
  ws.g_out.resize(pts.size() * in.n_groups);
  for (std::size_t i = 0; i < pts.size(); ++i)
    for (std::size_t g = 0; g < in.n_groups; ++g)
      ws.g_out[i * in.n_groups + g] = in.surrogate.table(pts[i], g)(in.out_rows, Eigen::all);
  ws.block.resize(in.n_groups);
  evaluate_series(in, pts, ws, ws.all, 0, 0, [&](std::size_t c0, Eigen::Index nb) {
    for (Eigen::Index c = 0; c < nb; ++c) res.dp_at_output.col(ws.all[c0 + static_cast<std::size_t>(c)]) = ws.best.col(c);
  });
}

// First crossings: chunk by chunk, only where the chunk's bound reaches Δp_crit.
void search_first_crossings(const TrackInputs& in, const std::vector<std::size_t>& pts, Workspace& ws,
                            SegmentOutcome& res) {
  const std::size_t s = res.segment;
  ws.active.clear();
  for (Eigen::Index r = 0; r < in.n_real; ++r) {
    const double crit = critical_dp(in.dp_crit, s, r);
    if (crit <= 0.0) res.first_crossing[static_cast<std::size_t>(r)] = 0;  // critical before injection
    else if (ws.chunk_bound.col(r).maxCoeff() >= crit) ws.active.push_back(r);
  }
  for (std::size_t q = 0; q < in.n_chunks && !ws.active.empty(); ++q) {
    const auto qi = static_cast<Eigen::Index>(q);
    ws.in_chunk.clear();
    for (Eigen::Index r : ws.active)
      if (ws.chunk_bound(qi, r) >= critical_dp(in.dp_crit, s, r)) ws.in_chunk.push_back(r);
    const auto k0 = static_cast<Eigen::Index>(q * kChunk);
    const auto len = static_cast<Eigen::Index>(std::min(kChunk, in.n_times - q * kChunk));
    evaluate_series(in, pts, ws, ws.in_chunk, k0, len, [&](std::size_t c0, Eigen::Index nb) {
      for (Eigen::Index c = 0; c < nb; ++c) {
        const Eigen::Index r = ws.in_chunk[c0 + static_cast<std::size_t>(c)];
        const double crit = critical_dp(in.dp_crit, s, r);
        for (Eigen::Index k = 0; k < len; ++k)
          if (ws.best(k, c) >= crit) {
            res.first_crossing[static_cast<std::size_t>(r)] = static_cast<int>(k0 + k);
            break;
          }
      }
    });
    std::erase_if(ws.active, [&](Eigen::Index r) { return res.first_crossing[static_cast<std::size_t>(r)] >= 0; });
  }
}

// One segment's outcome: the chunk bounds, Δp at the output times, then the first crossings.
void track_segment(const TrackInputs& in, const std::vector<std::size_t>& pts, Workspace& ws, SegmentOutcome& res) {
  res.first_crossing.assign(static_cast<std::size_t>(in.n_real), -1);
  res.dp_at_output.setZero(static_cast<Eigen::Index>(in.out_rows.size()), in.n_real);
  bound_chunks(in, pts, res.segment, ws);
  pressure_at_outputs(in, pts, ws, res);
  search_first_crossings(in, pts, ws, res);
}
}  // namespace

PressureDraws make_pressure_draws(const hydro::PressureSurrogate& surrogate, std::span<const double> diffusivity,
                                  std::span<const double> prefactor, const Eigen::MatrixXd& rate_factor) {
  const auto n = static_cast<Eigen::Index>(diffusivity.size());
  if (prefactor.size() != diffusivity.size() || rate_factor.cols() != n ||
      rate_factor.rows() != static_cast<Eigen::Index>(surrogate.group_count()))
    throw InputError("realization draws", std::to_string(diffusivity.size()),
                     "one diffusivity, prefactor and rate factor per group for every realization");
  PressureDraws d;
  d.basis.resize(static_cast<Eigen::Index>(surrogate.node_count()), n);
  d.scale.resize(rate_factor.rows(), n);
  for (Eigen::Index r = 0; r < n; ++r) {
    const auto i = static_cast<std::size_t>(r);
    surrogate.basis(diffusivity[i], d.basis.col(r).data());
    for (Eigen::Index g = 0; g < rate_factor.rows(); ++g)
      d.scale(g, r) = prefactor[i] * rate_factor(g, r);
  }
  return d;
}

void track_slip(const hydro::PressureSurrogate& surrogate, const std::vector<std::vector<std::size_t>>& segment_points,
                const PressureDraws& draws, const Eigen::MatrixXf& dp_crit,
                std::span<const std::size_t> output_index,
                const std::function<void(const SegmentOutcome&)>& visit, std::optional<SegmentRows> only) {
  const Eigen::Index n_real = draws.basis.cols();
  const auto n_seg = segment_points.size();
  const std::size_t first = only ? only->first : 0, end = only ? only->second : n_seg;
  if (first > end || end > n_seg)
    throw InputError("tracked segments", std::to_string(first) + " to " + std::to_string(end),
                     "a range of the " + std::to_string(n_seg) + " segments");
  const std::size_t n_times = surrogate.time_count();
  check_track_inputs(n_seg, n_real, dp_crit, n_times, output_index);
  const std::vector<Eigen::Index> out_rows(output_index.begin(), output_index.end());
  const Eigen::MatrixXd basis_parts = split_basis(draws.basis);

  // Tracking times in chunks; a realization's series is evaluated in a chunk only where the
  // bound on that chunk reaches its threshold, in order, until the first crossing.
  const TrackInputs in{surrogate, draws, dp_crit, out_rows, basis_parts,
                       n_times, surrogate.group_count(), (n_times + kChunk - 1) / kChunk,
                       static_cast<Eigen::Index>(surrogate.node_count()), n_real};
  const auto n_real_u = static_cast<std::size_t>(n_real);

  util::ParallelErrors errors;
#pragma omp parallel
  {
    Workspace ws;
    errors.setup([&] {
      ws.all.resize(n_real_u);
      for (std::size_t r = 0; r < n_real_u; ++r) ws.all[r] = static_cast<Eigen::Index>(r);
    });
#pragma omp for schedule(dynamic, 1)
    for (std::size_t s = first; s < end; ++s)
      errors.iteration(s, [&] {
        SegmentOutcome res;
        res.segment = s;
        track_segment(in, segment_points[s], ws, res);
        visit(res);
      });
  }
  errors.rethrow();
}

}  // namespace slipscreen::probabilistic
