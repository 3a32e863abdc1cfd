#pragma once
// Similarity table of one well's Theis superposition, for fast Monte Carlo pore pressure.
//
// Source: Theis (1935) line source with superposition in time; the Boltzmann similarity
// variable u = r²/(4 D t) makes the sum depend on r and D only through x = r²/(4 D):
//   H(x, t_k) = Σ_{j: t_j < t_k} Δq_j · E1( x / (t_k − t_j) )          [m³/s]
//   Δp(r, t_k) = μ / (4π k h) · H( r² / (4 D), t_k )
//
// Symbols: x = r²/(4D) [m²·s/s = m²/(m²/s) = s]  (code: x, "similarity time"), t_j step times
// [s], Δq_j rate increments [m³/s], t_k tracking times [s], E1 the well function W(u).
//
// The table holds H on a uniform grid in ln x for every tracking time and interpolates with
// 4-point (cubic) Lagrange weights. Accuracy: with the default step of 0.05 in ln x the
// interpolation error is below 1e-6 of the largest rate for u ≤ 10 at the earliest step
// (measured against direct summation in tests/core/probabilistic/similarity_table_test.cpp);
// terms with u > 745 are exactly zero in double precision and are skipped.
#include <array>
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::probabilistic {

// Piecewise-constant rate history as step times and rate increments (q_j − q_{j−1}).
struct RateSteps {
  std::vector<double> time;        // t_j [s], strictly increasing
  std::vector<double> delta_rate;  // Δq_j [m³/s]
};

// The 4 interpolation nodes and weights for one value of ln x, shared by all tracking times.
struct SimilarityTap {
  std::size_t first = 0;             // index of the first of the 4 nodes
  std::array<double, 4> weight{};    // Lagrange weights; all zero when x is past the table
};

class SimilarityTable {
 public:
  // Tabulates H for ln x in [ln_x_min, ln_x_max] with spacing `step`. Tracking times must be
  // increasing. Throws InputError for an empty or unsorted time list or a bad range.
  SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times,
                  double ln_x_min, double ln_x_max, double step = 0.05);

  // Weights for x (clamped to the table's lower end; zero past the upper end).
  SimilarityTap tap(double x) const;

  // Interpolated H at tracking-time index k.
  double value(const SimilarityTap& t, std::size_t k) const {
    const double* row = &values_[t.first * n_times_];
    return t.weight[0] * row[k] + t.weight[1] * row[k + n_times_] +
           t.weight[2] * row[k + 2 * n_times_] + t.weight[3] * row[k + 3 * n_times_];
  }

  // Adds scale · H(x, t_k) for every tracking time k to out[k] (the hot loop of table builds).
  void accumulate(const SimilarityTap& t, double scale, double* out) const;

  std::size_t time_count() const { return n_times_; }
  std::size_t node_count() const { return n_nodes_; }

  // H summed directly (no table): the reference the table is checked against.
  static double direct(const RateSteps& steps, double x, double t);

 private:
  std::size_t n_nodes_ = 0, n_times_ = 0;
  double ln_x0_ = 0.0, step_ = 0.0;
  std::vector<double> values_;  // node-major: values_[i * n_times_ + k]
};

}  // namespace slipscreen::probabilistic
