#pragma once
// Pore-pressure surrogate for Monte Carlo: Δp at fixed observation points and tracking times
// as a function of the hydraulic diffusivity D, prepared once for all realizations.
//
// Source: Theis (1935) with superposition in time and space; across realizations the
// hydrogeology enters only through D = k/(μ φ c_t) and the prefactor P = μ/(4π k h):
//   Δp_p(t_k) = P · Σ_g f_g · G_{p,g}(t_k, D),  G_{p,g} = Σ_{w in group g} s_w H_w(r_pw²/(4D), t_k)
// where H_w is the well's similarity table, s_w = +1 for wells and no-flow images, −1 for
// constant-pressure images, and f_g the rate factor of rate group g.
// G is tabulated at Chebyshev–Lobatto nodes in ln D over the sampled range and interpolated
// with the barycentric formula (Berrut & Trefethen 2004, SIAM Review 46:501).
//
// Symbols: D (diffusivity, m²/s), P (prefactor, Pa per m³/s), G (m³/s), f_g (rate factor, 1).
// Accuracy: the interpolation error over [D_min, D_max] is estimated at construction by
// comparing the interpolant with exact table sums at the midpoints between nodes
// (max_relative_error()); with 16 nodes over two decades of D it is below 1e-5 of the
// point's maximum Δp (tests/core/hydro/pressure_surrogate_test.cpp).
#include <Eigen/Dense>
#include <cstddef>
#include <memory>
#include <optional>
#include <span>
#include <vector>

#include "core/hydro/similarity_table.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::hydro {

struct ObservationPoint {
  double x = 0.0, y = 0.0;  // working CRS [m]
};

// A source of pressure: a well or one of its images, sharing the well's similarity table.
struct PressureSource {
  double x = 0.0, y = 0.0;   // location [m]
  double radius = 0.1;       // well radius r_w [m]; distances below it are clamped to it
  std::size_t table = 0;     // index of the well's SimilarityTable
  double sign = 1.0;         // +1 injector or no-flow image, −1 constant-pressure image
  std::size_t group = 0;     // rate group (a rate factor per group)
};

// The points given to a surrogate as items [first, first + count) of a larger set of `total`
// points (a part of a split run holds only its own segments' check points, docs/cluster.md).
// The error estimate then samples the same points of the whole set as a surrogate of all of
// them, so the largest of the parts' estimates is the whole's.
struct PointRange {
  std::size_t first = 0, total = 0;
};

class PressureSurrogate {
 public:
  // Tabulates G for every point and rate group at `nodes` Chebyshev nodes in
  // [ln d_min, ln d_max] (one node when d_min == d_max). OpenMP over points. With an active
  // `share` each part tabulates its range of points (util::part_range) and the parts exchange
  // them, so every part holds the whole surrogate, bit for bit that of one process (a point's G
  // sums the sources in the same order whatever the other points). With `range` (not shared) the
  // points are a range of a larger set (PointRange).
  PressureSurrogate(const std::vector<SimilarityTable>& tables, std::span<const PressureSource> sources,
                    std::span<const ObservationPoint> points, std::size_t group_count, double d_min,
                    double d_max, std::size_t nodes = 16, const util::WorkShare* share = nullptr,
                    std::optional<PointRange> range = std::nullopt);

  // The same surrogate built from blocks of tables (hydro::TableBuilder::blocks), so that only one
  // block need exist at a time: construct with the points (G zero), add() every block of
  // consecutive wells in order, then finish(). Each point still adds the sources in their order,
  // so the result is bit for bit the one-block surrogate's when the sources are ordered by table
  // (checked). The error estimate keeps the exact sums of its sampled points across the blocks.
  PressureSurrogate(std::span<const ObservationPoint> points, std::size_t group_count, std::size_t time_count,
                    double d_min, double d_max, std::size_t nodes = 16, const util::WorkShare* share = nullptr,
                    std::optional<PointRange> range = std::nullopt);
  // Adds the sources whose table is one of `tables`, the tables of wells [first_table,
  // first_table + tables.size()), right after the previous block's.
  void add(std::span<const SimilarityTable> tables, std::size_t first_table, std::span<const PressureSource> sources);
  // Once every one of `table_count` tables was added: the exchange of a shared build, the column
  // maxima and the error estimate.
  void finish(std::size_t table_count);

  ~PressureSurrogate();
  PressureSurrogate(PressureSurrogate&&) noexcept;
  PressureSurrogate& operator=(PressureSurrogate&&) noexcept;

  std::size_t point_count() const { return n_points_; }
  std::size_t group_count() const { return n_groups_; }
  std::size_t node_count() const { return ln_nodes_.size(); }
  std::size_t time_count() const { return n_times_; }

  // Barycentric basis ℓ_d(ln D) for one diffusivity, written into `basis` (node_count values).
  void basis(double diffusivity, double* basis) const;

  // G_{p,g} as an n_times × nodes matrix.
  const Eigen::MatrixXd& table(std::size_t point, std::size_t group) const {
    return g_[point * n_groups_ + group];
  }

  // Δp at point p for a block of realizations: out (n_times × n) =
  //   Σ_g G_{p,g} · (basis ∘ scale_g), where `basis` is nodes × n and `scale` is groups × n
  // holding P·f_g per realization.
  void evaluate(std::size_t point, const Eigen::MatrixXd& basis, const Eigen::MatrixXd& scale,
                Eigen::MatrixXd& out) const;

  // max_k |G_{p,g}(t_k, D_d)| for node d: with the basis, Σ_d |ℓ_d| · col_max bounds the
  // interpolated |Δp|/scale at every tracking time (triangle inequality).
  const double* column_max(std::size_t point, std::size_t group) const {
    return &col_max_[(point * n_groups_ + group) * ln_nodes_.size()];
  }

  // Largest |interpolant − exact| / max_k |exact| over points, groups, times and the midpoints
  // between nodes (0 with a single node).
  double max_relative_error() const { return max_error_; }

 private:
  std::size_t n_points_ = 0, n_groups_ = 0, n_times_ = 0;
  std::vector<double> ln_nodes_, bary_;
  std::vector<Eigen::MatrixXd> g_;
  std::vector<double> col_max_;
  double max_error_ = 0.0;
  struct Pending;
  std::unique_ptr<Pending> pending_;  // until finish()
};

}  // namespace slipscreen::hydro
