#include "core/probabilistic/slip_tracker.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr std::size_t kBlock = 256;  // realizations per matrix product
}  // namespace

PressureDraws make_pressure_draws(const PressureSurrogate& surrogate, std::span<const double> diffusivity,
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

void track_slip(const PressureSurrogate& surrogate, const std::vector<std::vector<std::size_t>>& segment_points,
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

#pragma omp parallel
  {
    std::vector<Eigen::MatrixXd> g_out, block;  // per (point, group): output rows; per group: basis × scale
    Eigen::MatrixXd series, best;
    Eigen::VectorXd bound;
    std::vector<Eigen::Index> full, outputs_only;
#pragma omp for schedule(dynamic, 1)
    for (std::size_t s = 0; s < n_seg; ++s) {
      SegmentOutcome res;
      res.segment = s;
      res.first_crossing.assign(static_cast<std::size_t>(n_real), -1);
      res.dp_at_output.setZero(static_cast<Eigen::Index>(output_index.size()), n_real);
      const auto& pts = segment_points[s];
      const auto crit_of = [&](Eigen::Index r) {
        return double(dp_crit(dp_crit.rows() == 1 ? 0 : static_cast<Eigen::Index>(s), r));
      };
      // The bound on Δp over all tracking times, per realization (max over check points).
      for (std::size_t i = 0; i < pts.size(); ++i) {
        Eigen::VectorXd b = Eigen::VectorXd::Zero(n_real);
        for (std::size_t g = 0; g < n_groups; ++g) {
          const Eigen::Map<const Eigen::RowVectorXd> cmax(surrogate.column_max(pts[i], g), n_nodes);
          const Eigen::RowVectorXd bg = cmax * abs_basis;
          b += (bg.array() * draws.scale.row(static_cast<Eigen::Index>(g)).array().abs()).matrix().transpose();
        }
        bound = i == 0 ? b : bound.cwiseMax(b);
      }
      // Full tracking series only where the threshold can be reached; Δp at the output times
      // for every realization.
      full.clear();
      outputs_only.clear();
      for (Eigen::Index r = 0; r < n_real; ++r) {
        const double crit = crit_of(r);
        if (crit <= 0.0) res.first_crossing[static_cast<std::size_t>(r)] = 0;  // critical before injection
        (crit > 0.0 && bound(r) >= crit ? full : outputs_only).push_back(r);
      }
      g_out.resize(pts.size() * n_groups);
      for (std::size_t i = 0; i < pts.size(); ++i)
        for (std::size_t g = 0; g < n_groups; ++g) g_out[i * n_groups + g] = surrogate.table(pts[i], g)(out_rows, Eigen::all);
      block.resize(n_groups);
      for (const bool whole : {false, true}) {
        const auto& list = whole ? full : outputs_only;
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
              const Eigen::MatrixXd& t = whole ? surrogate.table(pts[i], g) : g_out[i * n_groups + g];
              if (g == 0) series.noalias() = t * block[g];
              else series.noalias() += t * block[g];
            }
            if (i == 0) best = series;
            else best = best.cwiseMax(series);
          }
          for (Eigen::Index c = 0; c < nb; ++c) {
            const Eigen::Index r = list[c0 + static_cast<std::size_t>(c)];
            if (!whole) {
              res.dp_at_output.col(r) = best.col(c);
              continue;
            }
            res.dp_at_output.col(r) = best(out_rows, c);
            const double crit = crit_of(r);
            for (std::size_t k = 0; k < n_times; ++k)
              if (best(static_cast<Eigen::Index>(k), c) >= crit) {
                res.first_crossing[static_cast<std::size_t>(r)] = static_cast<int>(k);
                break;
              }
          }
        }
      }
      visit(res);
    }
  }
}

}  // namespace slipscreen::probabilistic
