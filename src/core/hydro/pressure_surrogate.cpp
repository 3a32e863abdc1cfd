#include "core/hydro/pressure_surrogate.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <numeric>
#include <memory>
#include <optional>
#include <string>
#include <tuple>
#include <utility>

#include "core/errors.hpp"
#include "core/util/parallel_errors.hpp"
#include "core/util/word_codec.hpp"

namespace slipscreen::hydro {
namespace {
constexpr std::size_t kBlock = 32;       // points per build block (spatially close)
constexpr double kBlockCell = 5000.0;    // m: cell size used to order points spatially

struct Nodes {
  std::vector<double> ln_d, bary, inv4d;  // ln D_d, barycentric weight, 1/(4 D_d)
};

// Chebyshev–Lobatto nodes in ln D and their barycentric weights (−1)^d, halved at the ends.
Nodes place_nodes(double d_min, double d_max, std::size_t nodes) {
  const double lo = std::log(d_min), hi = std::log(d_max);
  const std::size_t n = (hi - lo < 1e-12) ? 1 : std::max<std::size_t>(nodes, 2);
  Nodes out{std::vector<double>(n), std::vector<double>(n), std::vector<double>(n)};
  for (std::size_t d = 0; d < n; ++d) {
    out.ln_d[d] = n == 1 ? lo
                         : 0.5 * (lo + hi) + 0.5 * (hi - lo) *
                               std::cos(std::numbers::pi * static_cast<double>(d) / static_cast<double>(n - 1));
    out.bary[d] = ((d % 2) ? -1.0 : 1.0) * ((d == 0 || d == n - 1) ? 0.5 : 1.0);
    out.inv4d[d] = 0.25 / std::exp(out.ln_d[d]);
  }
  return out;
}

// Point indices in spatial order (rows then columns of kBlockCell cells).
std::vector<std::size_t> spatial_order(std::span<const ObservationPoint> points) {
  std::vector<std::size_t> order(points.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    const auto ka = std::make_pair(std::floor(points[a].y / kBlockCell), std::floor(points[a].x / kBlockCell));
    const auto kb = std::make_pair(std::floor(points[b].y / kBlockCell), std::floor(points[b].x / kBlockCell));
    return ka < kb;
  });
  return order;
}

// Per-node table sums G_{p,g}(t_k, D_d) += Σ_w s_w H_w(r_pw²/(4 D_d), t_k) over the `sources` (whose
// tables are tables[s.table − first_table]) into g[p · n_groups + group] for the points `order`
// (indices into `points`, in spatial order). Built in blocks of that order: a block's
// points are close together, so for each source they read neighbouring rows of its similarity
// table (cache reuse). Each point adds its sources in their order, whatever the other points.
void sum_tables(std::span<const SimilarityTable> tables, std::size_t first_table, std::span<const PressureSource> sources,
                std::span<const ObservationPoint> points, const std::vector<std::size_t>& order, std::size_t n_groups,
                const std::vector<double>& inv4d, std::vector<Eigen::MatrixXd>& g) {
  const std::size_t n_points = order.size(), n = inv4d.size();
  const std::size_t n_blocks = (n_points + kBlock - 1) / kBlock;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t b = 0; b < n_blocks; ++b)
    errors.iteration(b, [&] {
      const std::size_t end = std::min(n_points, (b + 1) * kBlock);
      for (const auto& s : sources) {
        const auto& table = tables[s.table - first_table];
        const double sign = s.sign;
        for (std::size_t i = b * kBlock; i < end; ++i) {
          const std::size_t p = order[i];
          const double dx = points[p].x - s.x, dy = points[p].y - s.y;
          const double r2 = std::max(dx * dx + dy * dy, s.radius * s.radius);
          auto& m = g[p * n_groups + s.group];
          for (std::size_t d = 0; d < n; ++d)
            table.accumulate(table.tap(r2 * inv4d[d]), sign, m.col(static_cast<Eigen::Index>(d)).data());
        }
      }
    });
  errors.rethrow();
}

// Every other part's range of points from the exchange, after this part summed its own range.
void exchange_ranges(std::size_t n_points, std::size_t n_groups, const util::WorkShare& share,
                     std::vector<Eigen::MatrixXd>& g) {
  const auto [first, end] = util::part_range(n_points, share.part, share.parts);
  util::WordWriter out;
  std::size_t words = 2;
  for (std::size_t i = first * n_groups; i < end * n_groups; ++i) words += 1 + static_cast<std::size_t>(g[i].size());
  out.reserve(words);
  out.word(first);
  out.word(end);
  for (std::size_t i = first * n_groups; i < end * n_groups; ++i)
    out.doubles(std::span<const double>(g[i].data(), static_cast<std::size_t>(g[i].size())));
  const auto all = share.all_gather(std::move(out).bytes());
  if (all.size() != share.parts)
    throw InputError("shared pressure surrogate", std::to_string(all.size()) + " parts", std::to_string(share.parts));
  for (std::size_t p = 0; p < all.size(); ++p) {
    if (p == share.part) continue;
    util::WordReader in(all[p], "the pressure surrogate of another process (pressure_surrogate.hpp)");
    const auto [pf, pe] = util::part_range(n_points, p, share.parts);
    if (in.word() != pf || in.word() != pe) in.fail("a point range other than part " + std::to_string(p) + "'s");
    for (std::size_t i = pf * n_groups; i < pe * n_groups; ++i) {
      const std::vector<double> v = in.doubles();
      if (v.size() != static_cast<std::size_t>(g[i].size())) in.fail("a table of " + std::to_string(v.size()) + " values");
      std::copy(v.begin(), v.end(), g[i].data());
    }
    if (!in.done()) in.fail("words after the end");
  }
}

// max_k |G_{p,g}(t_k, D_d)| per (point, group) and node d.
std::vector<double> column_maxima(const std::vector<Eigen::MatrixXd>& g, std::size_t n) {
  std::vector<double> col_max(g.size() * n);
  for (std::size_t pg = 0; pg < g.size(); ++pg)
    for (std::size_t d = 0; d < n; ++d)
      col_max[pg * n + d] = g[pg].col(static_cast<Eigen::Index>(d)).cwiseAbs().maxCoeff();
  return col_max;
}

// The points of the error estimate: every stride-th point of the whole set, about 64 of them
// (per point the estimate costs as much as the table itself), so that parts holding ranges of
// it sample the same points as the whole (their maxima then give the whole's).
std::vector<std::size_t> error_samples(std::size_t n_points, const PointRange& range) {
  const std::size_t stride = std::max<std::size_t>(1, range.total / 64);
  std::vector<std::size_t> out;
  for (std::size_t p = (stride - range.first % stride) % stride; p < n_points; p += stride) out.push_back(p);
  return out;
}

}  // namespace

// What a surrogate holds while its blocks of tables are added (PressureSurrogate::add).
struct PressureSurrogate::Pending {
  std::vector<ObservationPoint> points;
  std::vector<double> inv4d;
  const util::WorkShare* share = nullptr;     // active: this part sums its range of points
  std::size_t first = 0, end = 0;             // the points this process sums
  std::vector<std::size_t> order;             // those points in spatial order
  std::vector<std::size_t> samples;           // the error estimate's points
  std::vector<double> exact;                  // their exact sums at the midpoints between nodes:
                                              // [((sample · (n − 1) + d) · groups + g) · times + k]
  std::size_t next_table = 0;                 // the first table of the next block
};

PressureSurrogate::PressureSurrogate(const std::vector<SimilarityTable>& tables,
                                     std::span<const PressureSource> sources,
                                     std::span<const ObservationPoint> points, std::size_t group_count,
                                     double d_min, double d_max, std::size_t nodes, const util::WorkShare* share,
                                     std::optional<PointRange> range)
    : PressureSurrogate(points, group_count, tables.empty() ? 0 : tables.front().time_count(), d_min, d_max, nodes,
                        share, range) {
  if (tables.empty()) throw InputError("wells", "(none)", "at least one well with a rate history");
  add(tables, 0, sources);
  finish(tables.size());
}

PressureSurrogate::PressureSurrogate(std::span<const ObservationPoint> points, std::size_t group_count,
                                     std::size_t time_count, double d_min, double d_max, std::size_t nodes,
                                     const util::WorkShare* share, std::optional<PointRange> range)
    : n_points_(points.size()), n_groups_(group_count), n_times_(time_count) {
  if (!(d_min > 0.0) || !(d_max >= d_min) || !std::isfinite(d_max))
    throw InputError("diffusivity range", std::to_string(d_min) + ".." + std::to_string(d_max),
                     "0 < D_min <= D_max (m2/s)");
  if (group_count == 0) throw InputError("rate groups", "0", "at least one rate group");
  if (range && (share || range->first > range->total || range->total - range->first < points.size()))
    throw InputError("surrogate point range", std::to_string(range->first) + " + " + std::to_string(points.size()) + " of " +
                                                  std::to_string(range->total) + (share ? ", shared" : ""),
                     "a range inside the whole set of points, not shared");
  Nodes placed = place_nodes(d_min, d_max, nodes);
  ln_nodes_ = std::move(placed.ln_d);
  bary_ = std::move(placed.bary);
  const std::size_t n = ln_nodes_.size();
  g_.assign(n_points_ * n_groups_,
            Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n_times_), static_cast<Eigen::Index>(n)));
  pending_ = std::make_unique<Pending>();
  Pending& q = *pending_;
  q.points.assign(points.begin(), points.end());
  q.inv4d = std::move(placed.inv4d);
  q.share = share && share->active() ? share : nullptr;
  std::tie(q.first, q.end) = q.share ? util::part_range(n_points_, share->part, share->parts)
                                     : std::pair<std::size_t, std::size_t>{0, n_points_};
  const std::vector<std::size_t> local = spatial_order(std::span(q.points).subspan(q.first, q.end - q.first));
  for (std::size_t i : local) q.order.push_back(q.first + i);
  q.samples = error_samples(n_points_, range.value_or(PointRange{0, n_points_}));
  q.exact.assign(q.samples.size() * (n > 1 ? n - 1 : 0) * n_groups_ * n_times_, 0.0);
}

PressureSurrogate::~PressureSurrogate() = default;
PressureSurrogate::PressureSurrogate(PressureSurrogate&&) noexcept = default;
PressureSurrogate& PressureSurrogate::operator=(PressureSurrogate&&) noexcept = default;

void PressureSurrogate::add(std::span<const SimilarityTable> tables, std::size_t first_table,
                            std::span<const PressureSource> sources) {
  if (!pending_) throw InputError("pressure surrogate", "finished", "tables added before finish()");
  Pending& q = *pending_;
  const std::size_t end_table = first_table + tables.size();
  if (first_table != q.next_table || tables.empty())
    throw InputError("surrogate table block", std::to_string(first_table) + " to " + std::to_string(end_table),
                     "consecutive blocks of tables starting at " + std::to_string(q.next_table));
  for (const auto& t : tables)
    if (t.time_count() != n_times_)
      throw InputError("similarity table times", std::to_string(t.time_count()), std::to_string(n_times_));
  // The block's sources: all of them with a single block; with several, sources ordered by table
  // so that each block's are a run of them and every point still adds them in their order.
  const bool sorted = std::is_sorted(sources.begin(), sources.end(),
                                     [](const PressureSource& a, const PressureSource& b) { return a.table < b.table; });
  if (!sorted && first_table != 0)
    throw InputError("pressure sources", "not ordered by well", "sources ordered by table when tables come in blocks");
  const auto lo = sorted ? std::partition_point(sources.begin(), sources.end(),
                                                [&](const PressureSource& s) { return s.table < first_table; })
                         : sources.begin();
  const auto hi = sorted ? std::partition_point(lo, sources.end(), [&](const PressureSource& s) { return s.table < end_table; })
                         : sources.end();
  const std::span<const PressureSource> block(lo, hi);
  for (const auto& s : block) {
    if (s.table < first_table || s.table >= end_table)
      throw InputError("source table", std::to_string(s.table), "a table of this block or an earlier one");
    if (s.group >= n_groups_) throw InputError("source group", std::to_string(s.group), "an existing rate group");
  }
  q.next_table = end_table;
  sum_tables(tables, first_table, block, q.points, q.order, n_groups_, q.inv4d, g_);
  // The error estimate's exact sums at the midpoints, source by source in the same order.
  const std::size_t n = ln_nodes_.size();
  if (n < 2) return;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t i = 0; i < q.samples.size(); ++i)
    errors.iteration(i, [&] {
      const ObservationPoint& pt = q.points[q.samples[i]];
      for (std::size_t d = 0; d + 1 < n; ++d) {
        const double mid = std::exp(0.5 * (ln_nodes_[d] + ln_nodes_[d + 1]));
        double* at = &q.exact[(i * (n - 1) + d) * n_groups_ * n_times_];
        for (const auto& s : block) {
          const double dx = pt.x - s.x, dy = pt.y - s.y;
          const double r2 = std::max(dx * dx + dy * dy, s.radius * s.radius);
          const auto& table = tables[s.table - first_table];
          table.accumulate(table.tap(r2 * 0.25 / mid), s.sign, at + s.group * n_times_);
        }
      }
    });
  errors.rethrow();
}

void PressureSurrogate::finish(std::size_t table_count) {
  if (!pending_) throw InputError("pressure surrogate", "finished", "finish() once");
  Pending& q = *pending_;
  if (q.next_table != table_count)
    throw InputError("surrogate tables", std::to_string(q.next_table) + " added", "all " + std::to_string(table_count));
  if (q.share) exchange_ranges(n_points_, n_groups_, *q.share, g_);
  const std::size_t n = ln_nodes_.size();
  col_max_ = column_maxima(g_, n);
  // Error at the midpoints (in ln D) between neighbouring nodes, relative to the point's largest
  // |Δp| over all rate groups (a group that barely reaches the point must not inflate it).
  double worst = 0.0;
  std::vector<double> ell(n);
  for (std::size_t i = 0; i < q.samples.size() && n > 1; ++i)
    for (std::size_t d = 0; d + 1 < n; ++d) {
      basis(std::exp(0.5 * (ln_nodes_[d] + ln_nodes_[d + 1])), ell.data());
      const double* exact = &q.exact[(i * (n - 1) + d) * n_groups_ * n_times_];
      double scale = 0.0, err = 0.0;
      for (std::size_t g = 0; g < n_groups_; ++g) {
        const auto& m = table(q.samples[i], g);
        for (std::size_t k = 0; k < n_times_; ++k) {
          double v = 0.0;
          for (std::size_t e = 0; e < n; ++e) v += ell[e] * m(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(e));
          scale = std::max(scale, std::abs(exact[g * n_times_ + k]));
          err = std::max(err, std::abs(v - exact[g * n_times_ + k]));
        }
      }
      if (scale > 0.0) worst = std::max(worst, err / scale);
    }
  max_error_ = worst;
  pending_.reset();
}

void PressureSurrogate::basis(double diffusivity, double* out) const {
  const std::size_t n = ln_nodes_.size();
  if (n == 1) {
    out[0] = 1.0;
    return;
  }
  const double s = std::log(diffusivity);
  double denom = 0.0;
  for (std::size_t d = 0; d < n; ++d) {
    if (s == ln_nodes_[d]) {  // exactly on a node: the interpolant is that node's value
      for (std::size_t e = 0; e < n; ++e) out[e] = e == d ? 1.0 : 0.0;
      return;
    }
    denom += bary_[d] / (s - ln_nodes_[d]);
  }
  for (std::size_t d = 0; d < n; ++d) out[d] = bary_[d] / (s - ln_nodes_[d]) / denom;
}

void PressureSurrogate::evaluate(std::size_t point, const Eigen::MatrixXd& basis_block,
                                 const Eigen::MatrixXd& scale, Eigen::MatrixXd& out) const {
  if (n_groups_ == 1) {
    out.noalias() = table(point, 0) * basis_block;
    out.array().rowwise() *= scale.row(0).array();
    return;
  }
  out.setZero(static_cast<Eigen::Index>(n_times_), basis_block.cols());
  for (std::size_t g = 0; g < n_groups_; ++g)
    out.noalias() += table(point, g) *
                     (basis_block.array().rowwise() * scale.row(static_cast<Eigen::Index>(g)).array()).matrix();
}

}  // namespace slipscreen::hydro
