#include "core/hydro/pressure_surrogate.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <numeric>
#include <optional>
#include <string>

#include "core/errors.hpp"
#include "core/util/parallel_errors.hpp"
#include "core/util/word_codec.hpp"

namespace slipscreen::hydro {
namespace {
constexpr std::size_t kBlock = 32;       // points per build block (spatially close)
constexpr double kBlockCell = 5000.0;    // m: cell size used to order points spatially

void check_inputs(const std::vector<SimilarityTable>& tables, std::span<const PressureSource> sources,
                  std::size_t group_count, double d_min, double d_max) {
  if (tables.empty()) throw InputError("wells", "(none)", "at least one well with a rate history");
  if (!(d_min > 0.0) || !(d_max >= d_min) || !std::isfinite(d_max))
    throw InputError("diffusivity range", std::to_string(d_min) + ".." + std::to_string(d_max),
                     "0 < D_min <= D_max (m2/s)");
  if (group_count == 0) throw InputError("rate groups", "0", "at least one rate group");
  for (const auto& s : sources) {
    if (s.table >= tables.size()) throw InputError("source table", std::to_string(s.table), "an existing well table");
    if (s.group >= group_count) throw InputError("source group", std::to_string(s.group), "an existing rate group");
  }
}

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

// Per-node table sums G_{p,g}(t_k, D_d) = Σ_w s_w H_w(r_pw²/(4 D_d), t_k) into g (points × groups,
// each zeroed n_times × nodes). Points in spatial order, built in blocks: a block's points are
// close together, so for each source they read neighbouring rows of its similarity table (cache reuse).
void sum_tables(const std::vector<SimilarityTable>& tables, std::span<const PressureSource> sources,
                std::span<const ObservationPoint> points, std::size_t n_groups, const std::vector<double>& inv4d,
                std::vector<Eigen::MatrixXd>& g) {
  const std::size_t n_points = points.size(), n = inv4d.size();
  const std::vector<std::size_t> order = spatial_order(points);
  const std::size_t n_blocks = (n_points + kBlock - 1) / kBlock;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t b = 0; b < n_blocks; ++b)
    errors.iteration(b, [&] {
      const std::size_t end = std::min(n_points, (b + 1) * kBlock);
      for (const auto& s : sources) {
        const auto& table = tables[s.table];
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

// sum_tables for this part's range of points, then every other part's range from the exchange.
void sum_tables_shared(const std::vector<SimilarityTable>& tables, std::span<const PressureSource> sources,
                       std::span<const ObservationPoint> points, std::size_t n_groups, const std::vector<double>& inv4d,
                       const util::WorkShare& share, std::vector<Eigen::MatrixXd>& g) {
  const auto [first, end] = util::part_range(points.size(), share.part, share.parts);
  std::vector<Eigen::MatrixXd> mine(g.begin() + static_cast<std::ptrdiff_t>(first * n_groups),
                                    g.begin() + static_cast<std::ptrdiff_t>(end * n_groups));
  sum_tables(tables, sources, points.subspan(first, end - first), n_groups, inv4d, mine);
  util::WordWriter out;
  std::size_t words = 2;
  for (const auto& m : mine) words += 1 + static_cast<std::size_t>(m.size());
  out.reserve(words);
  out.word(first);
  out.word(end);
  for (const auto& m : mine) out.doubles(std::span<const double>(m.data(), static_cast<std::size_t>(m.size())));
  std::move(mine.begin(), mine.end(), g.begin() + static_cast<std::ptrdiff_t>(first * n_groups));
  const auto all = share.all_gather(out.bytes());
  if (all.size() != share.parts)
    throw InputError("shared pressure surrogate", std::to_string(all.size()) + " parts", std::to_string(share.parts));
  for (std::size_t p = 0; p < all.size(); ++p) {
    if (p == share.part) continue;
    util::WordReader in(all[p], "the pressure surrogate of another process (pressure_surrogate.hpp)");
    const auto [pf, pe] = util::part_range(points.size(), p, share.parts);
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

// Error estimate at the midpoints (in ln D) between neighbouring nodes, on a sample of about
// 64 points spread through the list (per point it costs as much as the table itself).
double estimate_error(const PressureSurrogate& surrogate, const std::vector<SimilarityTable>& tables,
                      std::span<const PressureSource> sources, std::span<const ObservationPoint> points,
                      const std::vector<double>& ln_nodes, const PointRange& range) {
  const std::size_t n_points = points.size(), n_groups = surrogate.group_count(),
                    n_times = surrogate.time_count(), n = ln_nodes.size();
  double worst = 0.0;
  // Every stride-th point of the whole set, so that parts holding ranges of it sample the same
  // points as the whole (their maxima then give the whole's).
  const std::size_t stride = std::max<std::size_t>(1, range.total / 64);
  const std::size_t start = (stride - range.first % stride) % stride;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1) reduction(max : worst)
  for (std::size_t p = start; p < n_points; p += stride)
    errors.iteration(p, [&] {
      std::vector<std::vector<double>> exact(n_groups, std::vector<double>(n_times));
      std::vector<double> ell(n);
      for (std::size_t d = 0; d + 1 < n; ++d) {
        const double mid = std::exp(0.5 * (ln_nodes[d] + ln_nodes[d + 1]));
        for (auto& c : exact) std::fill(c.begin(), c.end(), 0.0);
        for (const auto& s : sources) {
          const double dx = points[p].x - s.x, dy = points[p].y - s.y;
          const double r2 = std::max(dx * dx + dy * dy, s.radius * s.radius);
          const auto& table = tables[s.table];
          table.accumulate(table.tap(r2 * 0.25 / mid), s.sign, exact[s.group].data());
        }
        surrogate.basis(mid, ell.data());
        // Error relative to the point's largest |Δp| over all rate groups (a group that barely
        // reaches the point must not inflate the estimate).
        double scale = 0.0, err = 0.0;
        for (std::size_t g = 0; g < n_groups; ++g) {
          const auto& m = surrogate.table(p, g);
          for (std::size_t k = 0; k < n_times; ++k) {
            double v = 0.0;
            for (std::size_t e = 0; e < n; ++e) v += ell[e] * m(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(e));
            scale = std::max(scale, std::abs(exact[g][k]));
            err = std::max(err, std::abs(v - exact[g][k]));
          }
        }
        if (scale > 0.0) worst = std::max(worst, err / scale);
      }
    });
  errors.rethrow();
  return worst;
}
}  // namespace

PressureSurrogate::PressureSurrogate(const std::vector<SimilarityTable>& tables,
                                     std::span<const PressureSource> sources,
                                     std::span<const ObservationPoint> points, std::size_t group_count,
                                     double d_min, double d_max, std::size_t nodes, const util::WorkShare* share,
                                     std::optional<PointRange> range)
    : n_points_(points.size()), n_groups_(group_count) {
  check_inputs(tables, sources, group_count, d_min, d_max);
  if (range && (share || range->first > range->total || range->total - range->first < points.size()))
    throw InputError("surrogate point range", std::to_string(range->first) + " + " + std::to_string(points.size()) + " of " +
                                                  std::to_string(range->total) + (share ? ", shared" : ""),
                     "a range inside the whole set of points, not shared");
  n_times_ = tables.front().time_count();
  Nodes placed = place_nodes(d_min, d_max, nodes);
  ln_nodes_ = std::move(placed.ln_d);
  bary_ = std::move(placed.bary);
  const std::size_t n = ln_nodes_.size();
  g_.assign(n_points_ * n_groups_,
            Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n_times_), static_cast<Eigen::Index>(n)));
  if (share && share->active())
    sum_tables_shared(tables, sources, points, n_groups_, placed.inv4d, *share, g_);
  else
    sum_tables(tables, sources, points, n_groups_, placed.inv4d, g_);
  col_max_ = column_maxima(g_, n);
  max_error_ = estimate_error(*this, tables, sources, points, ln_nodes_, range.value_or(PointRange{0, points.size()}));
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
