#pragma once
// Similarity table of one well's Theis superposition, for fast Monte Carlo pore pressure.
//
// Source: Theis (1935) line source with superposition in time; the Boltzmann similarity
// variable u = r²/(4 D t) makes the sum depend on r and D only through x = r²/(4 D):
//   H(x, t_k) = Σ_{j: t_j < t_k} Δq_j · E1( x / (t_k − t_j) )          [m³/s]
//   Δp(r, t_k) = μ / (4π k h) · H( r² / (4 D), t_k )
//
// Symbols: x = r²/(4D) [s] (code: x), t_j step times [s], Δq_j rate increments [m³/s],
// t_k tracking times [s], E1 the well function W(u).
//
// The table holds H on a uniform grid in ln x for every tracking time and interpolates with
// 4-point (cubic) Lagrange weights. Accuracy: with the default step of 0.05 in ln x the
// error (interpolation and single-precision storage) is below 1e-6 of max_x |H(x, t_k)| for
// u ≤ 10 at the earliest step
// (measured against direct summation in tests/core/hydro/similarity_table_test.cpp);
// values are stored in single precision (relative rounding 6e-8); terms with u > 745 are
// exactly zero in double precision and are skipped.
//
// Speed: when every step and tracking time is a whole number of days (dates, as in every
// scenario), all lags t_k − t_j are whole days and E1 is evaluated once per (node, lag) for all
// wells together (LagKernel); each table is then a sum of contiguous rows (build_tables()).
#include <array>
#include <cstddef>
#include <optional>
#include <utility>
#include <span>
#include <vector>

#include "core/util/work_share.hpp"

namespace slipscreen::hydro {

// Piecewise-constant rate history as step times and rate increments (q_j − q_{j−1}).
struct RateSteps {
  std::vector<double> time;        // t_j [s], strictly increasing
  std::vector<double> delta_rate;  // Δq_j [m³/s]
};

// The ln x grid of a table: nodes from ln_x_min − step to past ln_x_max.
struct SimilarityGrid {
  double ln_x_min = 0.0, ln_x_max = 1.0, step = 0.05;
  // c_L = D/B² [1/s] of a leaky formation: the tables hold W(x/θ, 2√(c_L x)) (Hantush & Jacob
  // 1955; r/B = 2√(c_L x) since x = r²/(4D)), one function of x for every D with the same c_L.
  // 0: Theis, E1(x/θ).
  double leakage_rate = 0.0;
  std::size_t node_count() const;
  double ln_x(std::size_t i) const { return ln_x_min + (static_cast<double>(i) - 1.0) * step; }
};

// E1(x_i / lag) for every node of a grid and every lag that is a whole number of `quantum`
// seconds up to max_lag quanta, stored lag-major: row(lag)[i].
class LagKernel {
 public:
  LagKernel(const SimilarityGrid& grid, double quantum, std::size_t max_lag);
  const float* row(std::size_t lag) const { return &values_[lag * n_nodes_]; }
  double quantum() const { return quantum_; }
  std::size_t max_lag() const { return max_lag_; }

 private:
  std::size_t n_nodes_ = 0, max_lag_ = 0;
  double quantum_ = 0.0;
  std::vector<float> values_;
};

// The 4 interpolation nodes and weights for one value of ln x, shared by all tracking times.
struct SimilarityTap {
  std::size_t first = 0;           // index of the first of the 4 nodes
  std::array<float, 4> weight{};   // Lagrange weights; all zero when x is past the table
};

// The tap of x on a grid of `nodes` nodes (SimilarityTable::tap, for a table whose values are
// held elsewhere).
SimilarityTap similarity_tap(const SimilarityGrid& grid, std::size_t nodes, double x);

class SimilarityTable {
 public:
  SimilarityTable() = default;
  // Direct build: E1 evaluated for every node, tracking time and earlier step.
  SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times, const SimilarityGrid& grid);
  // Lattice build: every step and tracking time must be a whole number of kernel quanta
  // (checked; InputError otherwise) and every lag within the kernel.
  SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times, const SimilarityGrid& grid,
                  const LagKernel& kernel);

  // Weights for x (clamped to the table's lower end; zero past the upper end).
  SimilarityTap tap(double x) const;

  // Interpolated H at tracking-time index k.
  double value(const SimilarityTap& t, std::size_t k) const {
    const float* row = &values_[t.first * n_times_];
    return double(t.weight[0]) * row[k] + double(t.weight[1]) * row[k + n_times_] +
           double(t.weight[2]) * row[k + 2 * n_times_] + double(t.weight[3]) * row[k + 3 * n_times_];
  }

  // H at every node for tracking time k (node order), and the interpolated H from such a
  // column: the same value as value(t, k), for many taps at one time (contiguous nodes).
  std::vector<float> nodes_at(std::size_t k) const;
  static double value_from_nodes(const SimilarityTap& t, const float* nodes) {
    const float* n = nodes + t.first;
    return double(t.weight[0]) * n[0] + double(t.weight[1]) * n[1] + double(t.weight[2]) * n[2] +
           double(t.weight[3]) * n[3];
  }

  // Adds scale · H(x, t_k) for every tracking time k to out[k] (the hot loop of table builds).
  void accumulate(const SimilarityTap& t, double scale, double* out) const;

  // The table's values (node-major) and a table rebuilt from them on the same grid: how tables
  // built by another process arrive (build_tables with a WorkShare).
  const std::vector<float>& raw_values() const { return values_; }
  static SimilarityTable from_values(const SimilarityGrid& grid, std::size_t nodes, std::size_t times,
                                     std::vector<float> values);

  std::size_t time_count() const { return n_times_; }
  std::size_t node_count() const { return n_nodes_; }
  // max_i |H(x_i, t_k)| over the nodes: the scale of the stated accuracy at tracking time k.
  double scale(std::size_t k) const;

  // H summed directly (no table): the reference the table is checked against (leakage_rate as
  // in SimilarityGrid).
  static double direct(const RateSteps& steps, double x, double t, double leakage_rate = 0.0);

 private:
  void check(const RateSteps& steps, std::span<const double> tracking_times) const;
  std::size_t n_nodes_ = 0, n_times_ = 0;
  SimilarityGrid grid_;
  std::vector<float> values_;  // node-major: values_[i * n_times_ + k]
};

// The tables of many wells sharing one grid and tracking times, built for all wells at once or
// for a block of consecutive wells at a time, so that a statewide review holds one block of
// tables instead of every well's (W · n_x · G floats, 4.5–5 GB; docs/cluster.md). Whether the
// lattice build applies, and its lag kernel, are decided from every well's steps at
// construction, so a well's table is bit for bit the same whichever block builds it. Uses the
// lattice build when every time is a whole number of days, the direct build otherwise.
class TableBuilder {
 public:
  // `steps` must outlive the builder.
  TableBuilder(const std::vector<RateSteps>& steps, std::span<const double> tracking_times, const SimilarityGrid& grid);
  // Tables at the tracking times `own` only (increasing indices into tracking_times): column k of
  // a table is bit for bit column own[k] of the full table, as the lattice and its lag kernel are
  // still decided from every tracking time. How processes share a screen's tables by time
  // (screen/deterministic_screen.cpp).
  TableBuilder(const std::vector<RateSteps>& steps, std::span<const double> tracking_times, const SimilarityGrid& grid,
               std::span<const std::size_t> own);

  std::size_t well_count() const { return steps_->size(); }
  const SimilarityGrid& grid() const { return grid_; }
  // Bytes of one well's table.
  double table_bytes() const;
  // Consecutive blocks [first, second) of wells covering every well, each holding at most
  // `budget` bytes of tables (at least one well per block).
  std::vector<std::pair<std::size_t, std::size_t>> blocks(double budget) const;

  // Tables of the wells [first, end), element i being well first + i (OpenMP over wells). With an
  // active `share` (several processes) each part builds its range of them (util::part_range) and
  // the parts exchange them: every part ends with every table of the block, bit for bit those of
  // one process (a table depends on its own well's steps only).
  std::vector<SimilarityTable> build(std::size_t first, std::size_t end, const util::WorkShare* share = nullptr) const;

 private:
  void build_range(std::size_t first, std::size_t end, std::size_t offset, std::vector<SimilarityTable>& tables) const;
  const std::vector<RateSteps>* steps_;
  std::vector<double> times_;  // the tracking times of the tables built
  SimilarityGrid grid_;
  std::optional<LagKernel> kernel_;  // with the lattice build
};

// Tables held at a time by the screens that build them by blocks of wells (TableBuilder::blocks):
// 256 MiB, a few blocks for a statewide review, one for a regional one.
inline constexpr double kTableBlockBytes = 256.0 * 1024.0 * 1024.0;

// Every well's table: TableBuilder(steps, tracking_times, grid).build(0, wells, share).
std::vector<SimilarityTable> build_tables(const std::vector<RateSteps>& steps,
                                          std::span<const double> tracking_times, const SimilarityGrid& grid,
                                          const util::WorkShare* share = nullptr);

}  // namespace slipscreen::hydro
