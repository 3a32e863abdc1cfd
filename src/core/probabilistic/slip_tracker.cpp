#include "core/probabilistic/slip_tracker.hpp"

#include <algorithm>
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
  const std::size_t last = output_index.empty() ? n_times - 1 : output_index.back();
  constexpr Eigen::Index kBlock = 256;  // realizations per block: keeps a block's Δp in cache

#pragma omp parallel
  {
    Eigen::MatrixXf m, out;
#pragma omp for schedule(dynamic, 1)
    for (std::size_t s = 0; s < n_seg; ++s) {
      SegmentOutcome res;
      res.segment = s;
      res.first_crossing.assign(static_cast<std::size_t>(n_real), -1);
      res.peak_dp.assign(static_cast<std::size_t>(n_real), 0.0f);
      res.dp_at_output.setZero(static_cast<Eigen::Index>(output_index.size()), n_real);
      const auto& pts = segment_points[s];
      for (Eigen::Index r0 = 0; r0 < n_real; r0 += kBlock) {
        const Eigen::Index nb = std::min(kBlock, n_real - r0);
        const auto basis = draws.basis.middleCols(r0, nb);
        const auto scale = draws.scale.middleCols(r0, nb);
        m.setZero(static_cast<Eigen::Index>(n_times), nb);
        for (std::size_t i = 0; i < pts.size(); ++i) {
          surrogate.evaluate(pts[i], basis, scale, out);
          if (i == 0) m = out;
          else m = m.cwiseMax(out);
        }
        for (Eigen::Index c = 0; c < nb; ++c) {
          const auto r = static_cast<std::size_t>(r0 + c);
          const float crit = dp_crit(static_cast<Eigen::Index>(s), r0 + c);
          const float* col = m.col(c).data();
          float peak = 0.0f;
          int first = -1;
          for (std::size_t k = 0; k <= last; ++k) {
            peak = std::max(peak, col[k]);
            if (first < 0 && col[k] >= crit) first = static_cast<int>(k);
          }
          if (first < 0) {  // the threshold may still be crossed after the last output time
            for (std::size_t k = last + 1; k < n_times; ++k)
              if (col[k] >= crit) {
                first = static_cast<int>(k);
                break;
              }
          }
          res.first_crossing[r] = first;
          res.peak_dp[r] = peak;
          for (std::size_t o = 0; o < output_index.size(); ++o)
            res.dp_at_output(static_cast<Eigen::Index>(o), r0 + c) = col[output_index[o]];
        }
      }
      visit(res);
    }
  }
}

}  // namespace slipscreen::probabilistic
