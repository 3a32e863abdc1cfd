#include "core/probabilistic/slip_tracker.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr std::size_t kBlock = 256;  // realizations per matrix product
constexpr std::size_t kChunk = 24;   // tracking times per chunk of the first-crossing search
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
                const std::function<void(const SegmentOutcome&)>& visit) {
  const Eigen::Index n_real = draws.basis.cols();
  const auto n_seg = segment_points.size();
  if ((dp_crit.rows() != static_cast<Eigen::Index>(n_seg) && dp_crit.rows() != 1) || dp_crit.cols() != n_real)
    throw InputError("dp_crit", std::to_string(dp_crit.rows()) + "x" + std::to_string(dp_crit.cols()),
                     "one Δp_crit per segment and realization");
  const std::size_t n_times = surrogate.time_count();
  for (std::size_t o : output_index)
    if (o >= n_times) throw InputError("output index", std::to_string(o), "a tracking-time index");
  const std::size_t n_groups = surrogate.group_count();
  const auto n_nodes = static_cast<Eigen::Index>(surrogate.node_count());
  const std::vector<Eigen::Index> out_rows(output_index.begin(), output_index.end());
  const Eigen::MatrixXd abs_basis = draws.basis.cwiseAbs();

  // Tracking times in chunks; a realization's series is evaluated in a chunk only where the
  // bound on that chunk reaches its threshold, in order, until the first crossing.
  const std::size_t n_chunks = (n_times + kChunk - 1) / kChunk;
  const auto n_real_u = static_cast<std::size_t>(n_real);

#pragma omp parallel
  {
    std::vector<Eigen::MatrixXd> g_out, block;  // per (point, group): output rows; per group: basis × scale
    Eigen::MatrixXd series, best, chunk_max, chunk_bound, b;
    std::vector<Eigen::Index> all(n_real_u), active, in_chunk;
    for (std::size_t r = 0; r < n_real_u; ++r) all[r] = static_cast<Eigen::Index>(r);
#pragma omp for schedule(dynamic, 1)
    for (std::size_t s = 0; s < n_seg; ++s) {
      SegmentOutcome res;
      res.segment = s;
      res.first_crossing.assign(n_real_u, -1);
      res.dp_at_output.setZero(static_cast<Eigen::Index>(output_index.size()), n_real);
      const auto& pts = segment_points[s];
      const auto crit_of = [&](Eigen::Index r) {
        return double(dp_crit(dp_crit.rows() == 1 ? 0 : static_cast<Eigen::Index>(s), r));
      };
      // Bound on |Δp| per chunk and realization (max over check points):
      // Σ_g |scale_g| Σ_d |ℓ_d| max_{k in chunk} |G_{p,g}(t_k, D_d)| (triangle inequality).
      for (std::size_t i = 0; i < pts.size(); ++i) {
        b.setZero(static_cast<Eigen::Index>(n_chunks), n_real);
        for (std::size_t g = 0; g < n_groups; ++g) {
          const Eigen::MatrixXd& t = surrogate.table(pts[i], g);
          chunk_max.resize(static_cast<Eigen::Index>(n_chunks), n_nodes);
          for (std::size_t q = 0; q < n_chunks; ++q) {
            const auto k0 = static_cast<Eigen::Index>(q * kChunk);
            const auto len = static_cast<Eigen::Index>(std::min(kChunk, n_times - q * kChunk));
            chunk_max.row(static_cast<Eigen::Index>(q)) = t.middleRows(k0, len).cwiseAbs().colwise().maxCoeff();
          }
          b.noalias() += ((chunk_max * abs_basis).array().rowwise() *
                          draws.scale.row(static_cast<Eigen::Index>(g)).array().abs())
                             .matrix();
        }
        chunk_bound = i == 0 ? b : chunk_bound.cwiseMax(b);
      }
      // Δp at the output times for every realization.
      g_out.resize(pts.size() * n_groups);
      for (std::size_t i = 0; i < pts.size(); ++i)
        for (std::size_t g = 0; g < n_groups; ++g) g_out[i * n_groups + g] = surrogate.table(pts[i], g)(out_rows, Eigen::all);
      block.resize(n_groups);
      // Evaluates the rows [k0, k0 + len) (len = 0: the output rows) for the realizations in
      // `list`, in blocks of kBlock, and hands each block's maximum over check points to `use`.
      const auto evaluate = [&](const std::vector<Eigen::Index>& list, Eigen::Index k0, Eigen::Index len,
                                const auto& use) {
        for (std::size_t c0 = 0; c0 < list.size(); c0 += kBlock) {
          const auto nb = static_cast<Eigen::Index>(std::min(kBlock, list.size() - c0));
          for (std::size_t g = 0; g < n_groups; ++g) {
            block[g].resize(n_nodes, nb);
            for (Eigen::Index c = 0; c < nb; ++c) {
              const Eigen::Index r = list[c0 + static_cast<std::size_t>(c)];
              block[g].col(c) = draws.basis.col(r) * draws.scale(static_cast<Eigen::Index>(g), r);
            }
          }
          for (std::size_t i = 0; i < pts.size(); ++i) {
            for (std::size_t g = 0; g < n_groups; ++g) {
              if (len == 0) {
                if (g == 0) series.noalias() = g_out[i * n_groups + g] * block[g];
                else series.noalias() += g_out[i * n_groups + g] * block[g];
              } else {
                const auto rows = surrogate.table(pts[i], g).middleRows(k0, len);
                if (g == 0) series.noalias() = rows * block[g];
                else series.noalias() += rows * block[g];
              }
            }
            if (i == 0) best = series;
            else best = best.cwiseMax(series);
          }
          use(c0, nb);
        }
      };
      evaluate(all, 0, 0, [&](std::size_t c0, Eigen::Index nb) {
        for (Eigen::Index c = 0; c < nb; ++c) res.dp_at_output.col(all[c0 + static_cast<std::size_t>(c)]) = best.col(c);
      });
      // First crossings: chunk by chunk, only where the chunk's bound reaches Δp_crit.
      active.clear();
      for (Eigen::Index r = 0; r < n_real; ++r) {
        const double crit = crit_of(r);
        if (crit <= 0.0) res.first_crossing[static_cast<std::size_t>(r)] = 0;  // critical before injection
        else if (chunk_bound.col(r).maxCoeff() >= crit) active.push_back(r);
      }
      for (std::size_t q = 0; q < n_chunks && !active.empty(); ++q) {
        const auto qi = static_cast<Eigen::Index>(q);
        in_chunk.clear();
        for (Eigen::Index r : active)
          if (chunk_bound(qi, r) >= crit_of(r)) in_chunk.push_back(r);
        const auto k0 = static_cast<Eigen::Index>(q * kChunk);
        const auto len = static_cast<Eigen::Index>(std::min(kChunk, n_times - q * kChunk));
        evaluate(in_chunk, k0, len, [&](std::size_t c0, Eigen::Index nb) {
          for (Eigen::Index c = 0; c < nb; ++c) {
            const Eigen::Index r = in_chunk[c0 + static_cast<std::size_t>(c)];
            const double crit = crit_of(r);
            for (Eigen::Index k = 0; k < len; ++k)
              if (best(k, c) >= crit) {
                res.first_crossing[static_cast<std::size_t>(r)] = static_cast<int>(k0 + k);
                break;
              }
          }
        });
        std::erase_if(active, [&](Eigen::Index r) { return res.first_crossing[static_cast<std::size_t>(r)] >= 0; });
      }
      visit(res);
    }
  }
}

}  // namespace slipscreen::probabilistic
