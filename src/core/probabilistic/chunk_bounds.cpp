// Bounds on Δp over chunks of tracking times; see chunk_bounds.hpp.
#include "core/probabilistic/chunk_bounds.hpp"

#include <algorithm>
#include <limits>

namespace slipscreen::probabilistic {
namespace {
constexpr double kWiden = 1e-9;  // chunk_bounds.hpp: against the rounding of the series' sums
}  // namespace

Eigen::MatrixXd split_basis(const Eigen::MatrixXd& basis) {
  Eigen::MatrixXd parts(2 * basis.rows(), basis.cols());
  parts.topRows(basis.rows()) = basis.cwiseMax(0.0);
  parts.bottomRows(basis.rows()) = (-basis).cwiseMax(0.0);
  return parts;
}

namespace {
// Adds s_g times [iu, il] (the group's bounds of I_g) to the bounds, by the sign of s_g.
template <class U, class L>
void add_scaled(const Eigen::MatrixXd& iu, const Eigen::MatrixXd& il, const Eigen::RowVectorXd& s, U& upper, L* lower) {
  const Eigen::RowVectorXd s_pos = s.cwiseMax(0.0), s_neg = s.cwiseMin(0.0);
  upper.array() += iu.array().rowwise() * s_pos.array() + il.array().rowwise() * s_neg.array();
  if (lower) lower->array() += il.array().rowwise() * s_pos.array() + iu.array().rowwise() * s_neg.array();
}

// The rows of [G_max + w·G_abs, −G_min + w·G_abs] (upper) and [G_min − w·G_abs, −G_max − w·G_abs]
// (lower) from a chunk's extremes per node.
void bound_rows(const Eigen::RowVectorXd& gmax, const Eigen::RowVectorXd& gmin, Eigen::Index q, Eigen::MatrixXd& hu,
                Eigen::MatrixXd& hl) {
  const Eigen::RowVectorXd w = kWiden * gmax.cwiseAbs().cwiseMax(gmin.cwiseAbs());
  hu.row(q) << gmax + w, -gmin + w;
  hl.row(q) << gmin - w, -gmax - w;
}
}  // namespace

void chunk_bounds(const hydro::PressureSurrogate& surrogate, std::size_t point, Eigen::Index first_row, Eigen::Index rows,
                  Eigen::Index chunk, const Eigen::Ref<const Eigen::MatrixXd>& parts,
                  const Eigen::Ref<const Eigen::MatrixXd>& scale, Eigen::MatrixXd& upper, Eigen::MatrixXd* lower,
                  const std::vector<Eigen::Index>* only) {
  const Eigen::Index n_chunks = (rows + chunk - 1) / chunk;
  const auto nodes = static_cast<Eigen::Index>(surrogate.node_count());
  // The columns bounded: all, or `only` gathered.
  Eigen::MatrixXd sub_parts, sub_scale;
  if (only) {
    sub_parts = parts(Eigen::all, *only);
    sub_scale = scale(Eigen::all, *only);
  }
  const Eigen::Ref<const Eigen::MatrixXd> p = only ? Eigen::Ref<const Eigen::MatrixXd>(sub_parts) : parts;
  const Eigen::Ref<const Eigen::MatrixXd> sc = only ? Eigen::Ref<const Eigen::MatrixXd>(sub_scale) : scale;
  Eigen::MatrixXd up = Eigen::MatrixXd::Zero(n_chunks, p.cols()), lo;
  if (lower) lo.setZero(n_chunks, p.cols());
  Eigen::MatrixXd hu(n_chunks, 2 * nodes), hl(n_chunks, 2 * nodes), iu, il;
  for (std::size_t g = 0; g < surrogate.group_count(); ++g) {
    const Eigen::MatrixXd& t = surrogate.table(point, g);
    for (Eigen::Index q = 0; q < n_chunks; ++q) {
      const auto block = t.middleRows(first_row + q * chunk, std::min(chunk, rows - q * chunk));
      bound_rows(block.colwise().maxCoeff(), block.colwise().minCoeff(), q, hu, hl);
    }
    iu.noalias() = hu * p;
    il.noalias() = hl * p;
    add_scaled(iu, il, sc.row(static_cast<Eigen::Index>(g)), up, lower ? &lo : nullptr);
  }
  if (!only) {
    upper = std::move(up);
    if (lower) *lower = std::move(lo);
    return;
  }
  constexpr double inf = std::numeric_limits<double>::infinity();
  upper.setConstant(n_chunks, parts.cols(), -inf);
  if (lower) lower->setConstant(n_chunks, parts.cols(), inf);
  for (std::size_t j = 0; j < only->size(); ++j) {
    upper.col((*only)[j]) = up.col(static_cast<Eigen::Index>(j));
    if (lower) lower->col((*only)[j]) = lo.col(static_cast<Eigen::Index>(j));
  }
}

void span_bounds(const hydro::PressureSurrogate& surrogate, const std::vector<std::size_t>& points, Eigen::Index first_row,
                 Eigen::Index rows, const Eigen::Ref<const Eigen::MatrixXd>& parts,
                 const Eigen::Ref<const Eigen::MatrixXd>& scale, Eigen::RowVectorXd& upper, Eigen::RowVectorXd* lower) {
  const auto nodes = static_cast<Eigen::Index>(surrogate.node_count());
  upper.setZero(parts.cols());
  if (lower) lower->setZero(parts.cols());
  Eigen::MatrixXd hu(1, 2 * nodes), hl(1, 2 * nodes), iu, il;
  for (std::size_t g = 0; g < surrogate.group_count(); ++g) {
    Eigen::RowVectorXd gmax, gmin;
    for (std::size_t i = 0; i < points.size(); ++i) {
      const auto block = surrogate.table(points[i], g).middleRows(first_row, rows);
      const Eigen::RowVectorXd mx = block.colwise().maxCoeff(), mn = block.colwise().minCoeff();
      gmax = i == 0 ? mx : gmax.cwiseMax(mx);
      gmin = i == 0 ? mn : gmin.cwiseMin(mn);
    }
    bound_rows(gmax, gmin, 0, hu, hl);
    iu.noalias() = hu * parts;
    il.noalias() = hl * parts;
    add_scaled(iu, il, scale.row(static_cast<Eigen::Index>(g)), upper, lower);
  }
}

}  // namespace slipscreen::probabilistic
