#include "core/probabilistic/similarity_table.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/well_function.hpp"

namespace slipscreen::probabilistic {

SimilarityTable::SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times,
                                 double ln_x_min, double ln_x_max, double step)
    : n_times_(tracking_times.size()), ln_x0_(ln_x_min), step_(step) {
  if (tracking_times.empty())
    throw InputError("tracking times", "(none)", "at least one tracking time");
  if (!std::is_sorted(tracking_times.begin(), tracking_times.end()))
    throw InputError("tracking times", "unsorted", "increasing times");
  if (!(ln_x_max > ln_x_min) || !(step > 0.0) || !std::isfinite(ln_x_max - ln_x_min))
    throw InputError("similarity range", std::to_string(ln_x_min) + ".." + std::to_string(ln_x_max),
                     "a finite increasing range of ln x with a positive step");
  if (steps.time.size() != steps.delta_rate.size())
    throw InputError("rate steps", std::to_string(steps.time.size()), "one rate increment per step time");
  // One node below and two above the range so every interior point has 4 Lagrange nodes.
  ln_x0_ = ln_x_min - step;
  n_nodes_ = static_cast<std::size_t>(std::ceil((ln_x_max - ln_x_min) / step)) + 4;
  values_.assign(n_nodes_ * n_times_, 0.0);

  std::vector<double> x(n_nodes_), u(n_nodes_), w(n_nodes_);
  for (std::size_t i = 0; i < n_nodes_; ++i) x[i] = std::exp(ln_x0_ + static_cast<double>(i) * step_);
  constexpr double kUnderflow = 745.0;  // E1(u) == 0 in double precision beyond this u
  std::vector<double> column(n_nodes_);
  for (std::size_t k = 0; k < n_times_; ++k) {
    const double t = tracking_times[k];
    std::fill(column.begin(), column.end(), 0.0);
    for (std::size_t j = 0; j < steps.time.size() && steps.time[j] < t; ++j) {
      const double dt = t - steps.time[j];
      // Only nodes with u = x/dt below the underflow limit contribute.
      const double last = (std::log(kUnderflow * dt) - ln_x0_) / step_;
      if (last < 0.0) continue;
      const std::size_t n = std::min(n_nodes_, static_cast<std::size_t>(last) + 1);
      const double inv_dt = 1.0 / dt;
      for (std::size_t i = 0; i < n; ++i) u[i] = x[i] * inv_dt;
      hydro::well_function(u.data(), w.data(), n);
      const double dq = steps.delta_rate[j];
      for (std::size_t i = 0; i < n; ++i) column[i] += dq * w[i];
    }
    for (std::size_t i = 0; i < n_nodes_; ++i) values_[i * n_times_ + k] = column[i];
  }
}

SimilarityTap SimilarityTable::tap(double x) const {
  SimilarityTap t;
  const double s = (std::log(x) - ln_x0_) / step_;  // fractional node position
  const double s_max = static_cast<double>(n_nodes_ - 3);
  if (!(s < s_max)) return t;                 // past the table: every term has underflowed
  const double sc = std::max(s, 1.0);         // clamp below (x smaller than the well radius allows)
  const auto i1 = static_cast<std::size_t>(sc);
  const double f = sc - static_cast<double>(i1);  // position between node i1 and i1+1
  t.first = i1 - 1;
  // Cubic Lagrange weights on nodes -1, 0, 1, 2 relative to i1.
  t.weight[0] = -f * (f - 1.0) * (f - 2.0) / 6.0;
  t.weight[1] = (f + 1.0) * (f - 1.0) * (f - 2.0) / 2.0;
  t.weight[2] = -(f + 1.0) * f * (f - 2.0) / 2.0;
  t.weight[3] = (f + 1.0) * f * (f - 1.0) / 6.0;
  return t;
}

void SimilarityTable::accumulate(const SimilarityTap& t, double scale, double* out) const {
  const double w0 = scale * t.weight[0], w1 = scale * t.weight[1];
  const double w2 = scale * t.weight[2], w3 = scale * t.weight[3];
  if (w0 == 0.0 && w1 == 0.0 && w2 == 0.0 && w3 == 0.0) return;
  const double* r0 = &values_[t.first * n_times_];
  const double* r1 = r0 + n_times_;
  const double* r2 = r1 + n_times_;
  const double* r3 = r2 + n_times_;
  for (std::size_t k = 0; k < n_times_; ++k) out[k] += w0 * r0[k] + w1 * r1[k] + w2 * r2[k] + w3 * r3[k];
}

double SimilarityTable::direct(const RateSteps& steps, double x, double t) {
  double h = 0.0;
  for (std::size_t j = 0; j < steps.time.size() && steps.time[j] < t; ++j)
    h += steps.delta_rate[j] * hydro::well_function(x / (t - steps.time[j]));
  return h;
}

}  // namespace slipscreen::probabilistic
