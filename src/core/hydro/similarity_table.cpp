#include "core/hydro/similarity_table.hpp"


#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/hantush.hpp"
#include "core/hydro/well_function.hpp"
#include "core/util/number_text.hpp"
#include "core/util/parallel_errors.hpp"
#include "core/util/word_codec.hpp"

namespace slipscreen::hydro {
namespace {

// The kernel of the tables at nodes x[i] and arguments u[i] = x[i]/θ: E1 (batched), or the leaky
// W(u, 2√(c_L x)) when the grid has a leakage rate.
void node_well_function(const SimilarityGrid& g, const double* x, const double* u, double* w, std::size_t n) {
  if (g.leakage_rate > 0.0) {
    for (std::size_t i = 0; i < n; ++i) w[i] = leaky_well_function(u[i], 2.0 * std::sqrt(g.leakage_rate * x[i]));
  } else {
    well_function(u, w, n);
  }
}

constexpr double kUnderflow = 745.0;  // E1(u) == 0 in double precision beyond this u
constexpr double kDay = 86400.0;

// Number of nodes with u = x_i / lag below the underflow limit.
std::size_t live_nodes(const SimilarityGrid& g, std::size_t n_nodes, double lag) {
  const double last = (std::log(kUnderflow * lag) - g.ln_x(0)) / g.step;
  if (last < 0.0) return 0;
  return std::min(n_nodes, static_cast<std::size_t>(last) + 1);
}

bool whole_quanta(double t, double quantum) {
  const double q = t / quantum;
  return std::abs(q - std::round(q)) <= 1e-9 * std::max(1.0, std::abs(q));
}

// Stores one tracking time's column of H in the single-precision table (node-major). A value
// beyond single precision (about 3.4e38 m³/s) cannot be stored: NumericalError, never inf.
void store_column(const std::vector<double>& column, std::size_t k, std::size_t n_times, std::vector<float>& values) {
  for (std::size_t i = 0; i < column.size(); ++i) {
    if (!(std::fabs(column[i]) <= std::numeric_limits<float>::max()))
      throw NumericalError("Theis similarity table: the superposed rate sum reaches " + util::number_text(column[i], 3) +
                           " m3/s, beyond the single-precision range of the table (3.4e38); injection rates this "
                           "large are far outside the range of the pressure model");
    values[i * n_times + k] = static_cast<float>(column[i]);
  }
}

}  // namespace

std::size_t SimilarityGrid::node_count() const {
  // One node below and two above the range so every interior point has 4 Lagrange nodes.
  const double intervals = std::ceil((ln_x_max - ln_x_min) / step);
  // Checked before the cast (an infinite range, e.g. from a point 1e308 m away, is undefined as
  // an integer): the same refusal as SimilarityTable::check.
  if (!(intervals >= 0.0 && intervals < 1e9))
    throw InputError("similarity range", std::to_string(ln_x_min) + ".." + std::to_string(ln_x_max),
                     "a finite increasing range of ln x with a positive step");
  return static_cast<std::size_t>(intervals) + 4;
}

LagKernel::LagKernel(const SimilarityGrid& grid, double quantum, std::size_t max_lag)
    : n_nodes_(grid.node_count()), max_lag_(max_lag), quantum_(quantum) {
  values_.assign((max_lag + 1) * n_nodes_, 0.0f);
  std::vector<double> x(n_nodes_);
  for (std::size_t i = 0; i < n_nodes_; ++i) x[i] = std::exp(grid.ln_x(i));
  util::ParallelErrors errors;
#pragma omp parallel
  {
    std::vector<double> u, w;
    errors.setup([&] {
      u.resize(n_nodes_);
      w.resize(n_nodes_);
    });
#pragma omp for schedule(static)
    for (std::size_t lag = 1; lag <= max_lag; ++lag)
      errors.iteration(lag, [&] {
        const double dt = static_cast<double>(lag) * quantum;
        const std::size_t n = live_nodes(grid, n_nodes_, dt);
        for (std::size_t i = 0; i < n; ++i) u[i] = x[i] / dt;
        node_well_function(grid, x.data(), u.data(), w.data(), n);
        for (std::size_t i = 0; i < n; ++i) values_[lag * n_nodes_ + i] = static_cast<float>(w[i]);
      });
  }
  errors.rethrow();
}

void SimilarityTable::check(const RateSteps& steps, std::span<const double> tracking_times) const {
  if (tracking_times.empty())
    throw InputError("tracking times", "(none)", "at least one tracking time");
  if (!std::is_sorted(tracking_times.begin(), tracking_times.end()))
    throw InputError("tracking times", "unsorted", "increasing times");
  if (!(grid_.ln_x_max > grid_.ln_x_min) || !(grid_.step > 0.0) || !std::isfinite(grid_.ln_x_max - grid_.ln_x_min))
    throw InputError("similarity range", std::to_string(grid_.ln_x_min) + ".." + std::to_string(grid_.ln_x_max),
                     "a finite increasing range of ln x with a positive step");
  if (steps.time.size() != steps.delta_rate.size())
    throw InputError("rate steps", std::to_string(steps.time.size()), "one rate increment per step time");
  for (std::size_t j = 0; j < steps.delta_rate.size(); ++j)
    if (!std::isfinite(steps.time[j]) || !std::isfinite(steps.delta_rate[j]))
      throw InputError("rate step " + std::to_string(j + 1),
                       util::number_text(steps.time[j]) + " s, " + util::number_text(steps.delta_rate[j]) + " m3/s",
                       "a finite step time and rate change");
}

SimilarityTable::SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times,
                                 const SimilarityGrid& grid)
    : n_times_(tracking_times.size()), grid_(grid) {
  check(steps, tracking_times);
  n_nodes_ = grid.node_count();
  values_.assign(n_nodes_ * n_times_, 0.0f);
  std::vector<double> x(n_nodes_), u(n_nodes_), w(n_nodes_), column(n_nodes_);
  for (std::size_t i = 0; i < n_nodes_; ++i) x[i] = std::exp(grid.ln_x(i));
  for (std::size_t k = 0; k < n_times_; ++k) {
    const double t = tracking_times[k];
    std::fill(column.begin(), column.end(), 0.0);
    for (std::size_t j = 0; j < steps.time.size() && steps.time[j] < t; ++j) {
      const double dt = t - steps.time[j];
      const std::size_t n = live_nodes(grid_, n_nodes_, dt);
      for (std::size_t i = 0; i < n; ++i) u[i] = x[i] / dt;
      node_well_function(grid_, x.data(), u.data(), w.data(), n);
      const double dq = steps.delta_rate[j];
      for (std::size_t i = 0; i < n; ++i) column[i] += dq * w[i];
    }
    store_column(column, k, n_times_, values_);
  }
}

SimilarityTable::SimilarityTable(const RateSteps& steps, std::span<const double> tracking_times,
                                 const SimilarityGrid& grid, const LagKernel& kernel)
    : n_times_(tracking_times.size()), grid_(grid) {
  check(steps, tracking_times);
  n_nodes_ = grid.node_count();
  values_.assign(n_nodes_ * n_times_, 0.0f);
  const double q = kernel.quantum();
  for (double t : steps.time)
    if (!whole_quanta(t, q)) throw InputError("step time", std::to_string(t), "a whole number of lattice quanta");
  std::vector<double> column(n_nodes_);
  for (std::size_t k = 0; k < n_times_; ++k) {
    const double t = tracking_times[k];
    if (!whole_quanta(t, q)) throw InputError("tracking time", std::to_string(t), "a whole number of lattice quanta");
    std::fill(column.begin(), column.end(), 0.0);
    for (std::size_t j = 0; j < steps.time.size() && steps.time[j] < t; ++j) {
      const auto lag = static_cast<std::size_t>(std::llround((t - steps.time[j]) / q));
      if (lag > kernel.max_lag()) throw InputError("lag", std::to_string(lag), "a lag within the kernel");
      const float* e = kernel.row(lag);
      const double dq = steps.delta_rate[j];
      for (std::size_t i = 0; i < n_nodes_; ++i) column[i] += dq * e[i];
    }
    store_column(column, k, n_times_, values_);
  }
}

SimilarityTap SimilarityTable::tap(double x) const { return similarity_tap(grid_, n_nodes_, x); }

SimilarityTap similarity_tap(const SimilarityGrid& grid, std::size_t nodes, double x) {
  SimilarityTap t;
  const double s = (std::log(x) - grid.ln_x(0)) / grid.step;  // fractional node position
  const double s_max = static_cast<double>(nodes - 3);
  if (!(s < s_max)) return t;                 // past the table: every term has underflowed
  const double sc = std::max(s, 1.0);         // clamp below (x smaller than the well radius allows)
  const auto i1 = static_cast<std::size_t>(sc);
  const double f = sc - static_cast<double>(i1);  // position between node i1 and i1+1
  t.first = i1 - 1;
  // Cubic Lagrange weights on nodes -1, 0, 1, 2 relative to i1.
  t.weight[0] = static_cast<float>(-f * (f - 1.0) * (f - 2.0) / 6.0);
  t.weight[1] = static_cast<float>((f + 1.0) * (f - 1.0) * (f - 2.0) / 2.0);
  t.weight[2] = static_cast<float>(-(f + 1.0) * f * (f - 2.0) / 2.0);
  t.weight[3] = static_cast<float>((f + 1.0) * f * (f - 1.0) / 6.0);
  return t;
}

void SimilarityTable::accumulate(const SimilarityTap& t, double scale, double* __restrict out) const {
  const double w0 = scale * t.weight[0], w1 = scale * t.weight[1];
  const double w2 = scale * t.weight[2], w3 = scale * t.weight[3];
  if (w0 == 0.0 && w1 == 0.0 && w2 == 0.0 && w3 == 0.0) return;
  const float* __restrict r0 = &values_[t.first * n_times_];
  const float* __restrict r1 = r0 + n_times_;
  const float* __restrict r2 = r1 + n_times_;
  const float* __restrict r3 = r2 + n_times_;
  for (std::size_t k = 0; k < n_times_; ++k)
    out[k] += w0 * double(r0[k]) + w1 * double(r1[k]) + w2 * double(r2[k]) + w3 * double(r3[k]);
}

std::vector<float> SimilarityTable::nodes_at(std::size_t k) const {
  std::vector<float> v(n_nodes_);
  for (std::size_t i = 0; i < n_nodes_; ++i) v[i] = values_[i * n_times_ + k];
  return v;
}

double SimilarityTable::scale(std::size_t k) const {
  float m = 0.0f;
  for (std::size_t i = 0; i < n_nodes_; ++i) m = std::max(m, std::abs(values_[i * n_times_ + k]));
  return m;
}

double SimilarityTable::direct(const RateSteps& steps, double x, double t, double leakage_rate) {
  double h = 0.0;
  const double beta = 2.0 * std::sqrt(leakage_rate * x);
  for (std::size_t j = 0; j < steps.time.size() && steps.time[j] < t; ++j)
    h += steps.delta_rate[j] * (leakage_rate > 0.0 ? leaky_well_function(x / (t - steps.time[j]), beta)
                                                   : hydro::well_function(x / (t - steps.time[j])));
  return h;
}

SimilarityTable SimilarityTable::from_values(const SimilarityGrid& grid, std::size_t nodes, std::size_t times,
                                             std::vector<float> values) {
  if (values.size() != nodes * times)
    throw InputError("similarity table values", std::to_string(values.size()),
                     std::to_string(nodes) + " nodes x " + std::to_string(times) + " times");
  SimilarityTable t;
  t.grid_ = grid;
  t.n_nodes_ = nodes;
  t.n_times_ = times;
  t.values_ = std::move(values);
  return t;
}

TableBuilder::TableBuilder(const std::vector<RateSteps>& steps, std::span<const double> tracking_times,
                           const SimilarityGrid& grid)
    : TableBuilder(steps, tracking_times, grid, {}) {
  times_.assign(tracking_times.begin(), tracking_times.end());
}

TableBuilder::TableBuilder(const std::vector<RateSteps>& steps, std::span<const double> tracking_times,
                           const SimilarityGrid& grid, std::span<const std::size_t> own)
    : steps_(&steps), grid_(grid) {
  for (std::size_t k = 0; k < own.size(); ++k) {
    if (own[k] >= tracking_times.size() || (k > 0 && !(own[k] > own[k - 1])))
      throw InputError("own tracking times", std::to_string(own[k]),
                       "increasing indices below " + std::to_string(tracking_times.size()));
    times_.push_back(tracking_times[own[k]]);
  }
  bool lattice = !tracking_times.empty();
  double earliest = tracking_times.empty() ? 0.0 : tracking_times.back();
  for (double t : tracking_times) lattice = lattice && whole_quanta(t, kDay);
  for (const auto& s : steps)  // every well's steps decide the lattice and its lags, whatever the block
    for (double t : s.time) {
      lattice = lattice && whole_quanta(t, kDay);
      earliest = std::min(earliest, t);
    }
  if (lattice)
    kernel_.emplace(grid, kDay, static_cast<std::size_t>(std::llround((tracking_times.back() - earliest) / kDay)) + 1);
}

double TableBuilder::table_bytes() const {
  return static_cast<double>(grid_.node_count()) * static_cast<double>(times_.size()) * sizeof(float);
}

std::vector<std::pair<std::size_t, std::size_t>> TableBuilder::blocks(double budget) const {
  const std::size_t n = well_count();
  const double per = std::max(1.0, std::floor(budget / std::max(table_bytes(), 1.0)));
  const std::size_t size = per >= static_cast<double>(n) ? std::max<std::size_t>(n, 1) : static_cast<std::size_t>(per);
  std::vector<std::pair<std::size_t, std::size_t>> out;
  for (std::size_t first = 0; first < n; first += size) out.emplace_back(first, std::min(n, first + size));
  return out;
}

// Tables of the wells [first, end) into tables[first − offset .. end − offset).
void TableBuilder::build_range(std::size_t first, std::size_t end, std::size_t offset,
                               std::vector<SimilarityTable>& tables) const {
  util::ParallelErrors errors;
  const auto& steps = *steps_;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t w = first; w < end; ++w)
    errors.iteration(w, [&] {
      tables[w - offset] = kernel_ ? SimilarityTable(steps[w], times_, grid_, *kernel_)
                                   : SimilarityTable(steps[w], times_, grid_);
    });
  errors.rethrow();
}

std::vector<SimilarityTable> TableBuilder::build(std::size_t first, std::size_t end, const util::WorkShare* share) const {
  if (first > end || end > well_count())
    throw InputError("table block", std::to_string(first) + " to " + std::to_string(end),
                     "a range of the " + std::to_string(well_count()) + " wells");
  std::vector<SimilarityTable> tables(end - first);
  if (!share || !share->active()) {
    build_range(first, end, first, tables);
    return tables;
  }
  const auto part = [&](std::size_t p) {
    const auto [a, b] = util::part_range(end - first, p, share->parts);
    return std::pair<std::size_t, std::size_t>{first + a, first + b};
  };
  const auto [mine_first, mine_end] = part(share->part);
  build_range(mine_first, mine_end, first, tables);
  util::WordWriter out;
  out.word(mine_first);
  out.word(mine_end);
  for (std::size_t w = mine_first; w < mine_end; ++w) {
    out.word(tables[w - first].node_count());
    out.word(tables[w - first].time_count());
    out.floats(tables[w - first].raw_values());
  }
  const auto all = share->all_gather(std::move(out).bytes());
  if (all.size() != share->parts)
    throw InputError("shared similarity tables", std::to_string(all.size()) + " parts", std::to_string(share->parts));
  for (std::size_t p = 0; p < all.size(); ++p) {
    if (p == share->part) continue;
    util::WordReader in(all[p], "the similarity tables of another process (similarity_table.hpp TableBuilder)");
    const auto [pf, pe] = part(p);
    if (in.word() != pf || in.word() != pe) in.fail("a well range other than part " + std::to_string(p) + "'s");
    for (std::size_t w = pf; w < pe; ++w) {
      const std::size_t nodes = in.word(), times = in.word();
      std::vector<float> v = in.floats();
      if (v.size() != nodes * times || times != times_.size()) in.fail("a table of " + std::to_string(v.size()) + " values");
      tables[w - first] = SimilarityTable::from_values(grid_, nodes, times, std::move(v));
    }
    if (!in.done()) in.fail("words after the end");
  }
  return tables;
}

std::vector<SimilarityTable> build_tables(const std::vector<RateSteps>& steps,
                                          std::span<const double> tracking_times, const SimilarityGrid& grid,
                                          const util::WorkShare* share) {
  return TableBuilder(steps, tracking_times, grid).build(0, steps.size(), share);
}

}  // namespace slipscreen::hydro
