#pragma once
// Bounds on a realization's Δp over a chunk of tracking times at one check point, for pruning
// the searches that evaluate Δp series (slip_tracker.hpp, group_factors.hpp): a chunk whose upper
// bound stays below Δp_crit cannot hold a crossing, so its series need not be evaluated.
//
// Δp_p(t_k) = Σ_g s_g · I_g(t_k) with I_g(t_k) = Σ_d ℓ_d(D) · G_{p,g}(t_k, D_d) (pressure_model.hpp:
// s_g the realization's P·f_g, ℓ_d its surrogate basis, G the similarity tables at the nodes).
// Splitting ℓ_d = ℓ⁺_d − ℓ⁻_d (ℓ± ≥ 0), with G_max,d and G_min,d the largest and smallest table
// value of node d over the chunk (interval arithmetic):
//   Σ ℓ⁺ G_min − Σ ℓ⁻ G_max  ≤  I_g(t_k)  ≤  Σ ℓ⁺ G_max − Σ ℓ⁻ G_min    for every t_k in the chunk,
// and s_g·I_g lies between s_g times the two ends. This is much tighter than the triangle
// inequality Σ |ℓ_d| max |G_d| (the negative lobes of the basis then subtract instead of adding).
// Each end is widened by 1e-9 · |s_g| Σ_d |ℓ_d| max_k |G_d(t_k)|: the rounding of the series'
// own sums is below 1e-13 of that (nodes × groups terms), so the evaluated series stays within
// the bounds exactly as the exact one does.
#include <Eigen/Dense>
#include <cstddef>
#include <vector>

#include "core/hydro/pressure_surrogate.hpp"

namespace slipscreen::probabilistic {

// [ℓ⁺; ℓ⁻]: (2·nodes) × N from a basis (nodes × N).
Eigen::MatrixXd split_basis(const Eigen::MatrixXd& basis);

// Per chunk of `chunk` rows in [first_row, first_row + rows) of point `point`'s tables and per
// realization (the columns of `parts` = split_basis() columns and `scale` = their s_g): upper and
// (when `lower` is not null) lower bounds of Δp over the chunk, ceil(rows/chunk) × columns. With
// `only`, just those columns are bounded; the others get −∞ (upper) and +∞ (lower).
void chunk_bounds(const hydro::PressureSurrogate& surrogate, std::size_t point, Eigen::Index first_row, Eigen::Index rows,
                  Eigen::Index chunk, const Eigen::Ref<const Eigen::MatrixXd>& parts,
                  const Eigen::Ref<const Eigen::MatrixXd>& scale, Eigen::MatrixXd& upper, Eigen::MatrixXd* lower,
                  const std::vector<Eigen::Index>* only = nullptr);

// The same bounds over all the rows [first_row, first_row + rows) and every point of `points` at
// once (one chunk, the tables' extremes over the points): 1 × columns, a cheap first sieve before
// the bounds per point and chunk.
void span_bounds(const hydro::PressureSurrogate& surrogate, const std::vector<std::size_t>& points, Eigen::Index first_row,
                 Eigen::Index rows, const Eigen::Ref<const Eigen::MatrixXd>& parts,
                 const Eigen::Ref<const Eigen::MatrixXd>& scale, Eigen::RowVectorXd& upper, Eigen::RowVectorXd* lower);

}  // namespace slipscreen::probabilistic
