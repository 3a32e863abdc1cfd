#include "core/probabilistic/slip_tracker.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::probabilistic {

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
      d.scale(g, r) = static_cast<float>(prefactor[i] * rate_factor(g, r));
  }
  return d;
}

void track_slip(const PressureSurrogate& surrogate, const std::vector<std::vector<std::size_t>>& segment_points,
                const PressureDraws& draws, const Eigen::MatrixXf& dp_crit,
                std::span<const std::size_t> output_index,
                const std::function<void(const SegmentOutcome&)>& visit) {
  const Eigen::Index n_real = draws.basis.cols();
  const auto n_seg = segment_points.size();
  if (dp_crit.rows() != static_cast<Eigen::Index>(n_seg) || dp_crit.cols() != n_real)
    throw InputError("dp_crit", std::to_string(dp_crit.rows()) + "x" + std::to_string(dp_crit.cols()),
                     "one Δp_crit per segment and realization");
  const std::size_t n_times = surrogate.time_count();
  for (std::size_t o : output_index)
    if (o >= n_times) throw InputError("output index", std::to_string(o), "a tracking-time index");
  const std::size_t n_groups = surrogate.group_count();
  const auto n_nodes = static_cast<Eigen::Index>(surrogate.node_count());
  const std::vector<Eigen::Index> out_rows(output_index.begin(), output_index.end());
  const Eigen::MatrixXf abs_basis = draws.basis.cwiseAbs();

#pragma omp parallel
  {
    Eigen::MatrixXf g_out, dp_out, series;
    Eigen::VectorXf bound, col, best;
#pragma omp for schedule(dynamic, 1)
    for (std::size_t s = 0; s < n_seg; ++s) {
      SegmentOutcome res;
      res.segment = s;
      res.first_crossing.assign(static_cast<std::size_t>(n_real), -1);
      res.dp_at_output.setZero(static_cast<Eigen::Index>(output_index.size()), n_real);
      bound.setZero(n_real);
      const auto& pts = segment_points[s];
      // Δp at output times for all realizations, and the bound on Δp over all tracking times.
      for (std::size_t i = 0; i < pts.size(); ++i) {
        dp_out.setZero(static_cast<Eigen::Index>(output_index.size()), n_real);
        Eigen::VectorXf b = Eigen::VectorXf::Zero(n_real);
        for (std::size_t g = 0; g < n_groups; ++g) {
          g_out = surrogate.table(pts[i], g)(out_rows, Eigen::all);
          const Eigen::RowVectorXf scale = draws.scale.row(static_cast<Eigen::Index>(g));
          series.noalias() = g_out * draws.basis;
          series.array().rowwise() *= scale.array();
          dp_out += series;
          const Eigen::Map<const Eigen::RowVectorXf> cmax(surrogate.column_max(pts[i], g), n_nodes);
          const Eigen::RowVectorXf bg = cmax * abs_basis;
          b += (bg.array() * scale.array().abs()).matrix().transpose();
        }
        res.dp_at_output = i == 0 ? dp_out : res.dp_at_output.cwiseMax(dp_out);
        bound = i == 0 ? b : bound.cwiseMax(b);
      }
      // Full tracking series only where the threshold can be reached.
      for (Eigen::Index r = 0; r < n_real; ++r) {
        const float crit = dp_crit(static_cast<Eigen::Index>(s), r);
        if (crit <= 0.0f) {  // already critical before any injection
          res.first_crossing[static_cast<std::size_t>(r)] = 0;
          continue;
        }
        if (bound(r) < crit) continue;
        best.setZero(static_cast<Eigen::Index>(n_times));
        for (std::size_t i = 0; i < pts.size(); ++i) {
          col.setZero(static_cast<Eigen::Index>(n_times));
          for (std::size_t g = 0; g < n_groups; ++g)
            col.noalias() += surrogate.table(pts[i], g) * draws.basis.col(r) * draws.scale(static_cast<Eigen::Index>(g), r);
          best = i == 0 ? col : best.cwiseMax(col);
        }
        for (std::size_t k = 0; k < n_times; ++k)
          if (best(static_cast<Eigen::Index>(k)) >= crit) {
            res.first_crossing[static_cast<std::size_t>(r)] = static_cast<int>(k);
            break;
          }
      }
      visit(res);
    }
  }
}

}  // namespace slipscreen::probabilistic
