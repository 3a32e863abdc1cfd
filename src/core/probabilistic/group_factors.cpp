// The critical factors of a group of wells; see group_factors.hpp.
#include "core/probabilistic/group_factors.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <string>

#include "core/errors.hpp"
#include "core/probabilistic/critical_factor.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr std::size_t kBlock = 256;  // realizations per matrix product
constexpr Eigen::Index kChunk = 24;  // tracking times per chunk of the first-crossing search
constexpr double kInf = std::numeric_limits<double>::infinity();

// Σ over the groups on one side (apart or not) of table rows [0, K] times basis · scale_g, for
// the realizations `cols`: (K + 1) × cols.size().
Eigen::MatrixXd side_series(const PressureModel& pm, const std::vector<char>& apart, std::size_t point, bool side,
                            Eigen::Index rows, const std::vector<Eigen::Index>& cols, Eigen::Index first_row = 0) {
  Eigen::MatrixXd out = Eigen::MatrixXd::Zero(rows, static_cast<Eigen::Index>(cols.size()));
  Eigen::MatrixXd block(pm.draws.basis.rows(), static_cast<Eigen::Index>(cols.size()));
  for (std::size_t g = 0; g < pm.groups; ++g) {
    if (static_cast<bool>(apart[g]) != side) continue;
    for (std::size_t c = 0; c < cols.size(); ++c)
      block.col(static_cast<Eigen::Index>(c)) =
          pm.draws.basis.col(cols[c]) * pm.draws.scale(static_cast<Eigen::Index>(g), cols[c]);
    out.noalias() += pm.surrogate->table(point, g).middleRows(first_row, rows) * block;
  }
  return out;
}

// Bound on |Δp| over t_k ≤ T of one side at one point, per realization.
Eigen::VectorXd side_bound(const PressureModel& pm, const std::vector<char>& apart, std::size_t point, bool side,
                           Eigen::Index rows, const Eigen::MatrixXd& abs_basis) {
  Eigen::VectorXd b = Eigen::VectorXd::Zero(abs_basis.cols());
  for (std::size_t g = 0; g < pm.groups; ++g) {
    if (static_cast<bool>(apart[g]) != side) continue;
    const Eigen::RowVectorXd colmax = pm.surrogate->table(point, g).topRows(rows).cwiseAbs().colwise().maxCoeff();
    b.array() += (colmax * abs_basis).transpose().array() * pm.draws.scale.row(static_cast<Eigen::Index>(g)).transpose().array().abs();
  }
  return b;
}

SlipFactorCurve segment_curve(const PressureModel& pm, const std::vector<char>& apart, const Eigen::MatrixXf& dp_crit, const Eigen::MatrixXd& abs_basis,
                              std::size_t s, Eigen::Index rows, double f_max) {
  const Eigen::Index n = dp_crit.cols();
  const auto& pts = pm.segment_points[s];
  // The largest Δp any f ≤ f_max can reach, over the check points (a bound, slightly widened
  // against rounding in the bound's own sums).
  Eigen::VectorXd reach = Eigen::VectorXd::Zero(n);
  for (std::size_t i = 0; i < pts.size(); ++i) {
    const Eigen::VectorXd b = side_bound(pm, apart, pts[i], false, rows, abs_basis) + f_max * side_bound(pm, apart, pts[i], true, rows, abs_basis);
    reach = i == 0 ? b : reach.cwiseMax(b);
  }
  std::vector<double> f_crit;
  std::vector<Eigen::Index> evaluate;
  for (Eigen::Index r = 0; r < n; ++r) {
    const double crit = double(dp_crit(static_cast<Eigen::Index>(s), r));
    if (crit <= 0.0) continue;  // critical before injection: counted apart
    if (std::isinf(crit) || reach(r) * (1.0 + 1e-9) < crit) f_crit.push_back(kInf);
    else evaluate.push_back(r);
  }
  std::vector<Eigen::Index> cols;
  for (std::size_t c0 = 0; c0 < evaluate.size(); c0 += kBlock) {
    cols.assign(evaluate.begin() + static_cast<std::ptrdiff_t>(c0),
                evaluate.begin() + static_cast<std::ptrdiff_t>(std::min(evaluate.size(), c0 + kBlock)));
    std::vector<double> f(cols.size(), kInf);
    for (std::size_t i = 0; i < pts.size(); ++i) {
      const Eigen::MatrixXd rest = side_series(pm, apart, pts[i], false, rows, cols);
      const Eigen::MatrixXd group = side_series(pm, apart, pts[i], true, rows, cols);
      for (std::size_t c = 0; c < cols.size(); ++c) {
        const auto ci = static_cast<Eigen::Index>(c);
        const double crit = double(dp_crit(static_cast<Eigen::Index>(s), cols[c]));
        const auto len = static_cast<std::size_t>(rows);
        f[c] = std::min(f[c], critical_factor(std::span<const double>(rest.col(ci).data(), len),
                                              std::span<const double>(group.col(ci).data(), len), crit));
      }
    }
    f_crit.insert(f_crit.end(), f.begin(), f.end());
  }
  return SlipFactorCurve(std::move(f_crit), static_cast<std::uint64_t>(n));
}
// Bounds on |Δp_rest| + factor·|Δp_G| per chunk of kChunk tracking times (rows) and
// realization, max over the segment's check points (triangle inequality, as slip_tracker.hpp).
Eigen::MatrixXd chunk_bounds(const PressureModel& pm, const std::vector<char>& apart, const Eigen::MatrixXd& abs_basis,
                             std::size_t s, Eigen::Index rows, double factor) {
  const Eigen::Index n_chunks = (rows + kChunk - 1) / kChunk;
  Eigen::MatrixXd out;
  Eigen::MatrixXd chunk_max(n_chunks, abs_basis.rows());
  for (std::size_t i = 0; i < pm.segment_points[s].size(); ++i) {
    Eigen::MatrixXd b = Eigen::MatrixXd::Zero(n_chunks, abs_basis.cols());
    for (std::size_t g = 0; g < pm.groups; ++g) {
      const Eigen::MatrixXd& t = pm.surrogate->table(pm.segment_points[s][i], g);
      for (Eigen::Index q = 0; q < n_chunks; ++q)
        chunk_max.row(q) = t.middleRows(q * kChunk, std::min(kChunk, rows - q * kChunk)).cwiseAbs().colwise().maxCoeff();
      const double side = apart[g] ? factor : 1.0;
      b.noalias() += ((chunk_max * abs_basis).array().rowwise() *
                      (side * pm.draws.scale.row(static_cast<Eigen::Index>(g)).array().abs()))
                         .matrix();
    }
    out = i == 0 ? b : out.cwiseMax(b);
  }
  return out;
}

// First crossings with the group's rates times `factor`: chunk by chunk, in order, only where the
// chunk's bound reaches Δp_crit (the same result as evaluating every series).
std::vector<std::uint64_t> segment_variant(const PressureModel& pm, const std::vector<char>& apart,
                                           const Eigen::MatrixXf& dp_crit, const Eigen::MatrixXd& abs_basis,
                                           std::size_t s, const std::vector<std::size_t>& output_index, double factor) {
  const Eigen::Index n = dp_crit.cols();
  const auto rows = static_cast<Eigen::Index>(output_index.back() + 1);
  const Eigen::MatrixXd bound = chunk_bounds(pm, apart, abs_basis, s, rows, factor);
  const auto crit_of = [&](Eigen::Index r) { return double(dp_crit(static_cast<Eigen::Index>(s), r)); };
  std::vector<Eigen::Index> active, in_chunk;
  for (Eigen::Index r = 0; r < n; ++r) {
    const double crit = crit_of(r);
    if (crit > 0.0 && !std::isinf(crit) && bound.col(r).maxCoeff() * (1.0 + 1e-9) >= crit) active.push_back(r);
  }
  std::vector<std::uint64_t> slipped(output_index.size(), 0);
  const auto& pts = pm.segment_points[s];
  std::vector<Eigen::Index> cols;
  for (Eigen::Index q = 0; q * kChunk < rows && !active.empty(); ++q) {
    const Eigen::Index k0 = q * kChunk, len = std::min(kChunk, rows - k0);
    in_chunk.clear();
    for (Eigen::Index r : active)
      if (bound(q, r) * (1.0 + 1e-9) >= crit_of(r)) in_chunk.push_back(r);
    std::vector<char> crossed(static_cast<std::size_t>(n), 0);
    for (std::size_t c0 = 0; c0 < in_chunk.size(); c0 += kBlock) {
      cols.assign(in_chunk.begin() + static_cast<std::ptrdiff_t>(c0),
                  in_chunk.begin() + static_cast<std::ptrdiff_t>(std::min(in_chunk.size(), c0 + kBlock)));
      Eigen::MatrixXd best;
      for (std::size_t i = 0; i < pts.size(); ++i) {
        const Eigen::MatrixXd dp = side_series(pm, apart, pts[i], false, len, cols, k0) +
                                   factor * side_series(pm, apart, pts[i], true, len, cols, k0);
        best = i == 0 ? dp : best.cwiseMax(dp);
      }
      for (std::size_t c = 0; c < cols.size(); ++c) {
        const double crit = crit_of(cols[c]);
        for (Eigen::Index k = 0; k < len; ++k)
          if (best(k, static_cast<Eigen::Index>(c)) >= crit) {
            for (std::size_t t = 0; t < output_index.size(); ++t)
              if (output_index[t] >= static_cast<std::size_t>(k0 + k)) ++slipped[t];
            crossed[static_cast<std::size_t>(cols[c])] = 1;
            break;
          }
      }
    }
    std::erase_if(active, [&](Eigen::Index r) { return crossed[static_cast<std::size_t>(r)] != 0; });
  }
  return slipped;
}
void check_apart(const PressureModel& pm, const std::vector<char>& apart) {
  if (apart.size() != pm.groups)
    throw InputError("groups kept apart", std::to_string(apart.size()), "one flag per rate group (" + std::to_string(pm.groups) + ")");
}

// out[s] = one(s) for every segment (OpenMP over segments; the first failure is rethrown).
template <class T, class One>
void per_segment(std::vector<T>& out, const One& one) {
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t s = 0; s < out.size(); ++s) errors.iteration(s, [&] { out[s] = one(s); });
  errors.rethrow();
}
}  // namespace

std::vector<std::vector<std::uint64_t>> group_variant_slips(const PressureModel& pm, const std::vector<char>& apart,
                                                            const Eigen::MatrixXf& dp_crit,
                                                            const std::vector<std::size_t>& output_index, double factor) {
  if (!pm.surrogate || output_index.empty() || output_index.back() >= pm.surrogate->time_count())
    throw InputError("what-if output times", std::to_string(output_index.size()), "tracking-time indices");
  if (!(factor >= 0.0)) throw InputError("what-if factor", std::to_string(factor), "a factor >= 0");
  check_apart(pm, apart);
  const Eigen::MatrixXd abs_basis = pm.draws.basis.cwiseAbs();
  std::vector<std::vector<std::uint64_t>> out(pm.segment_points.size());
  per_segment(out, [&](std::size_t s) { return segment_variant(pm, apart, dp_crit, abs_basis, s, output_index, factor); });
  return out;
}

std::vector<SlipFactorCurve> group_factor_curves(const PressureModel& pm, const std::vector<char>& apart,
                                                 const Eigen::MatrixXf& dp_crit, std::size_t horizon, double f_max) {
  if (!pm.surrogate || horizon >= pm.surrogate->time_count())
    throw InputError("capacity horizon", std::to_string(horizon), "a tracking-time index");
  if (!(f_max > 0.0)) throw InputError("capacity f_max", std::to_string(f_max), "a factor > 0");
  check_apart(pm, apart);
  const Eigen::MatrixXd abs_basis = pm.draws.basis.cwiseAbs();
  const auto rows = static_cast<Eigen::Index>(horizon + 1);
  std::vector<SlipFactorCurve> curves(pm.segment_points.size(),
                                      SlipFactorCurve({}, std::max<std::uint64_t>(1, static_cast<std::uint64_t>(dp_crit.cols()))));
  per_segment(curves, [&](std::size_t s) { return segment_curve(pm, apart, dp_crit, abs_basis, s, rows, f_max); });
  return curves;
}

}  // namespace slipscreen::probabilistic
