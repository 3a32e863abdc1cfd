#include "core/hydro/pressure_grid.hpp"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/well_function.hpp"
#include "core/util/number_text.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::hydro {
namespace {

// max|f⁗(s)| ≤ 16 I C max|q| with I = kProfileFourthDerivativeIntegral (see the header), and
// the cubic Hermite error factor 1/384: |f − H| ≤ kHermiteFactor · h⁴ · C max|q|.
constexpr double kHermiteFactor = 16.0 * kProfileFourthDerivativeIntegral / 384.0;
constexpr std::size_t kTile = 16;        // pixels per tile side
constexpr std::size_t kStepChunk = 256;  // union steps per matrix product in the table build
constexpr double kMaxProfileNodes = 1e5;  // per source (typical rates need a few hundred)

using RowMatrix = Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;

using util::number_text;

// One line source seen by the grid: a real well or one of its images.
struct Source {
  double x, y;
  double rw2;     // clamp radius², the well's r_w²
  double scale;   // image sign × rate factor
  const std::vector<double>* start;  // step start times, s (strictly increasing)
  const std::vector<double>* rate;   // rates from each start, m³/s (before `scale`)
};

std::vector<Source> collect_sources(const PressureField& field, std::span<const double> factors) {
  const auto& wells = field.wells();
  if (!factors.empty() && factors.size() != wells.size())
    throw InputError("rate_factors", std::to_string(factors.size()) + " factors",
                     "one factor per well (" + std::to_string(wells.size()) + ")");
  for (std::size_t i = 0; i < factors.size(); ++i)
    if (!std::isfinite(factors[i]))
      throw InputError("rate_factors[" + std::to_string(i) + "]", number_text(factors[i]), "a finite factor");
  std::vector<Source> out;
  for (std::size_t w = 0; w < wells.size(); ++w) {
    const double f = factors.empty() ? 1.0 : factors[w];
    for (const ImageSource& img : field.sources(w))
      out.push_back({img.x, img.y, wells[w].well_radius * wells[w].well_radius, img.sign * f,
                     &wells[w].history.start_times(), &wells[w].history.rates()});
  }
  return out;
}

void validate_times(std::span<const double> times) {
  for (std::size_t k = 0; k < times.size(); ++k)
    if (!std::isfinite(times[k])) throw InputError("times[" + std::to_string(k) + "]", number_text(times[k]), "a finite time (s)");
}

// Pixels whose centre is on the wells' side of every boundary (1) or beyond one (0).
std::vector<char> region_mask(const GridGeometry& g, const PressureField& field) {
  std::vector<char> inside(g.nx * g.ny, 1);
  if (field.boundaries().empty() || field.wells().empty()) return inside;
  const double wx = field.wells()[0].x, wy = field.wells()[0].y;
  for (std::size_t j = 0; j < g.ny; ++j)
    for (std::size_t i = 0; i < g.nx; ++i)
      inside[j * g.nx + i] = same_region(field.boundaries(), wx, wy, g.centre_x(i), g.centre_y(j)) ? 1 : 0;
  return inside;
}

// The u at which E1(u) = target (bisection on ln u; E1 is decreasing): E1(result) ≤ target.
// Returns 0 when even E1(1e-300) ≤ target, and beyond the underflow end when target ≤ 0.
double e1_inverse(double target) {
  if (target <= 0.0) return 710.0;
  double lo = std::log(1e-300), hi = std::log(705.0);
  if (well_function(std::exp(lo)) <= target) return 0.0;
  for (int it = 0; it < 200 && hi - lo > 1e-13; ++it) {
    const double mid = 0.5 * (lo + hi);
    (well_function(std::exp(mid)) > target ? lo : hi) = mid;
  }
  return std::exp(hi);
}

// Per-(tile, source) accumulation: acc[p·nt + k] += Hermite interpolant of the source's
// profile tables at each pixel's ln r. Written once; compiled for AVX2+FMA and for the baseline.
struct TileJob {
  const double* px;       // pixel centre x, np values
  const double* py;       // pixel centre y
  std::size_t np;
  double sx, sy;          // source position
  double r2_min, r2_cut;  // clamp (r_w²) and cut-off radius² of the source
  double s0, inv_h;       // ln r_w and 1/h
  std::size_t nodes;      // profile nodes of the source (≥ 2)
  const double* table;    // nodes × (2 m): [f(t_k0..), h·f'(t_k0..)] per node, m = nt − k0
  std::size_t k0, nt;     // first output time (in the block) after the source's first step
  double* acc;            // np × nt
};

__attribute__((always_inline)) inline void accumulate_body(const TileJob& j) {
  const std::size_t nt = j.nt - j.k0, stride = 2 * nt;
  for (std::size_t p = 0; p < j.np; ++p) {
    const double dx = j.px[p] - j.sx, dy = j.py[p] - j.sy;
    const double r2 = dx * dx + dy * dy;
    if (r2 > j.r2_cut) continue;
    const double z = (0.5 * std::log(std::max(r2, j.r2_min)) - j.s0) * j.inv_h;
    std::size_t n = static_cast<std::size_t>(std::max(z, 0.0));
    if (n > j.nodes - 2) n = j.nodes - 2;
    const double th = std::min(z - double(n), 1.0);
    const double om = 1.0 - th;
    // Cubic Hermite basis on [0, 1]: h00, h10 (×h, folded into the table), h01, h11.
    const double w0 = (1.0 + 2.0 * th) * om * om, w1 = th * om * om;
    const double w2 = th * th * (3.0 - 2.0 * th), w3 = -th * th * om;
    const double* a = j.table + n * stride;
    const double* b = a + stride;
    double* out = j.acc + p * j.nt + j.k0;
#pragma omp simd
    for (std::size_t k = 0; k < nt; ++k)
      out[k] += w0 * a[k] + w1 * a[nt + k] + w2 * b[k] + w3 * b[nt + k];
  }
}

__attribute__((target("avx512f,avx512vl,avx2,fma"))) void accumulate_avx512(const TileJob& j) {
  accumulate_body(j);
}
__attribute__((target("avx2,fma"))) void accumulate_avx2(const TileJob& j) { accumulate_body(j); }
void accumulate_default(const TileJob& j) { accumulate_body(j); }

// Run-time dispatch on the CPU's vector units (the build itself stays portable x86-64).
using Kernel = void (*)(const TileJob&);
Kernel pick_kernel() {
  __builtin_cpu_init();
  const bool avx2 = __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
  if (avx2 && __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512vl")) return accumulate_avx512;
  if (avx2) return accumulate_avx2;
  return accumulate_default;
}
void accumulate(const TileJob& j) {
  static const Kernel kernel = pick_kernel();
  kernel(j);
}

PressureGrid empty_grid(const GridGeometry& g, std::span<const double> times) {
  PressureGrid out;
  out.geometry = g;
  out.times.assign(times.begin(), times.end());
  out.values.assign(g.nx * g.ny * times.size(), 0.0);
  return out;
}

void mask_outside(PressureGrid& out, const std::vector<char>& inside) {
  const std::size_t np = inside.size();
  for (std::size_t k = 0; k < out.times.size(); ++k)
    for (std::size_t p = 0; p < np; ++p)
      if (!inside[p]) out.values[k * np + p] = std::numeric_limits<double>::quiet_NaN();
}

}  // namespace

void validate(const GridGeometry& g) {
  if (!std::isfinite(g.origin_x)) throw InputError("origin_x", number_text(g.origin_x), "a finite coordinate (m)");
  if (!std::isfinite(g.origin_y)) throw InputError("origin_y", number_text(g.origin_y), "a finite coordinate (m)");
  if (!std::isfinite(g.cell_x) || g.cell_x <= 0.0)
    throw InputError("cell_x", number_text(g.cell_x), "a finite pixel width > 0 (m)");
  if (!std::isfinite(g.cell_y) || g.cell_y == 0.0)
    throw InputError("cell_y", number_text(g.cell_y), "a finite, non-zero pixel height (m; negative for north-up)");
  if (g.nx == 0 || g.ny == 0)
    throw InputError("size", std::to_string(g.nx) + "x" + std::to_string(g.ny), "at least 1x1 pixels");
}

PressureGrid pressure_grid_direct(const GridGeometry& geometry, const PressureField& field,
                                  const TheisParameters& params, std::span<const double> times,
                                  std::span<const double> rate_factors) {
  validate(geometry);
  validate(params);
  validate_times(times);
  collect_sources(field, rate_factors);  // validates the factors
  PressureGrid out = empty_grid(geometry, times);
  const std::vector<char> inside = region_mask(geometry, field);
  const std::size_t nx = geometry.nx, ny = geometry.ny, nt = times.size();
  // Row by row, so that the prepared distances stay small.
  for (std::size_t j = 0; j < ny; ++j) {
    std::vector<FieldPoint> pts;
    std::vector<std::size_t> col;
    for (std::size_t i = 0; i < nx; ++i)
      if (inside[j * nx + i]) {
        pts.push_back({geometry.centre_x(i), geometry.centre_y(j)});
        col.push_back(i);
      }
    if (pts.empty()) continue;
    const PressureResult r = field.evaluate(field.prepare(pts), times, params, rate_factors);
    for (std::size_t p = 0; p < pts.size(); ++p)
      for (std::size_t k = 0; k < nt; ++k) out.values[(k * ny + j) * nx + col[p]] = r.at(p, k);
  }
  mask_outside(out, inside);
  return out;
}

namespace {

void validate(const PressureGridOptions& options) {
  if (!std::isfinite(options.threshold) || options.threshold <= 0.0)
    throw InputError("threshold", number_text(options.threshold), "a finite pressure > 0 Pa");
  if (!std::isfinite(options.relative_tolerance) || options.relative_tolerance <= 0.0 ||
      options.relative_tolerance >= 1.0)
    throw InputError("relative_tolerance", number_text(options.relative_tolerance), "a number in (0, 1)");
  if (!std::isfinite(options.max_table_bytes) || options.max_table_bytes < 1e6)
    throw InputError("max_table_bytes", number_text(options.max_table_bytes), "at least 1e6 bytes");
}

// Rate scale per source and in total: max|q| over its steps (after `scale`) and its first step.
struct RateScales {
  std::vector<double> qmax;   // m³/s
  std::vector<double> first;  // s, start of the first step (0 without steps)
  double qsum = 0.0;          // Σ max|q|
};

RateScales rate_scales(const std::vector<Source>& sources) {
  const std::size_t ns = sources.size();
  RateScales out{std::vector<double>(ns, 0.0), std::vector<double>(ns, 0.0)};
  for (std::size_t w = 0; w < ns; ++w) {
    for (double q : *sources[w].rate) out.qmax[w] = std::max(out.qmax[w], std::abs(q * sources[w].scale));
    if (!sources[w].start->empty()) out.first[w] = sources[w].start->front();
  }
  out.qsum = std::accumulate(out.qmax.begin(), out.qmax.end(), 0.0);
  return out;
}

// The sources kept for the raster, in input order.
struct Reach {
  std::vector<char> reach;        // per source: 1 when kept
  std::vector<std::size_t> kept;  // the kept sources
  double qsum = 0.0;              // Σ max|q| over the kept sources
  double rw2_min = 0.0;           // smallest clamp radius² among them
};

// Sources whose cut-off radius at the last time does not reach the raster (pixel centres) are
// dropped altogether: each stays within its share of ε/4 everywhere on it.
Reach sources_in_reach(const GridGeometry& geometry, double d, const std::vector<Source>& sources,
                       const RateScales& scales, double u_cut, double t_last) {
  const std::size_t nx = geometry.nx, ny = geometry.ny, ns = sources.size();
  const double bx0 = std::min(geometry.centre_x(0), geometry.centre_x(nx - 1));
  const double bx1 = std::max(geometry.centre_x(0), geometry.centre_x(nx - 1));
  const double by0 = std::min(geometry.centre_y(0), geometry.centre_y(ny - 1));
  const double by1 = std::max(geometry.centre_y(0), geometry.centre_y(ny - 1));
  Reach out;
  out.reach.assign(ns, 0);
  for (std::size_t w = 0; w < ns; ++w) {
    const double theta = t_last - scales.first[w];
    if (scales.qmax[w] == 0.0 || sources[w].start->empty() || theta <= 0.0) continue;
    const Source& s = sources[w];
    const double gx = std::max({bx0 - s.x, 0.0, s.x - bx1}), gy = std::max({by0 - s.y, 0.0, s.y - by1});
    const double r2cut = 4.0 * d * theta * u_cut;
    if (gx * gx + gy * gy > r2cut || r2cut <= s.rw2) continue;
    out.reach[w] = 1;
    out.kept.push_back(w);
    out.qsum += scales.qmax[w];
    out.rw2_min = out.kept.size() == 1 ? s.rw2 : std::min(out.rw2_min, s.rw2);
  }
  return out;
}

// Profile nodes s_n = s0 + n h in ln r from the smallest well radius, and the cut-off radius² of
// each source at time t, R_w² = 4 D θ_w u* with θ_w the time since its first step.
struct NodeLayout {
  double s0, h, rw2_min;
  double d, u_cut;
  const RateScales& scales;
  const Reach& reach;

  // Profile nodes for cut-off radius² r2cut (≥ 2 nodes; node K−1 at or beyond R), as a double
  // (unbounded: check_table_size bounds it before any cast).
  double node_estimate(double r2cut) const {
    const double smax = 0.5 * std::log(std::max(r2cut, rw2_min));
    return std::floor((smax - s0) / h) + 2.0;
  }
  std::size_t nodes_for(double r2cut) const { return static_cast<std::size_t>(node_estimate(r2cut)); }
  double cut_radius2(std::size_t w, double t) const {
    const double theta = t - scales.first[w];
    if (!reach.reach[w] || theta <= 0.0) return -1.0;  // inactive
    return 4.0 * d * theta * u_cut;
  }
};

// Union of the kept sources' step times, and their rate increments on it (row r: kept[r]).
struct UnionSteps {
  std::vector<double> tau;  // s, increasing
  Eigen::MatrixXd dq;       // m³/s, kept × tau
};

UnionSteps union_steps(const std::vector<Source>& sources, const std::vector<std::size_t>& kept) {
  UnionSteps out;
  std::vector<double>& tau = out.tau;
  for (std::size_t w : kept) tau.insert(tau.end(), sources[w].start->begin(), sources[w].start->end());
  std::sort(tau.begin(), tau.end());
  tau.erase(std::unique(tau.begin(), tau.end()), tau.end());
  out.dq = Eigen::MatrixXd::Zero(Eigen::Index(kept.size()), Eigen::Index(tau.size()));
  for (std::size_t r = 0; r < kept.size(); ++r) {
    const Source& src = sources[kept[r]];
    double prev = 0.0;
    for (std::size_t j = 0; j < src.start->size(); ++j) {
      const auto col = std::lower_bound(tau.begin(), tau.end(), (*src.start)[j]) - tau.begin();
      out.dq(Eigen::Index(r), col) += src.scale * ((*src.rate)[j] - prev);
      prev = (*src.rate)[j];
    }
  }
  return out;
}

// Refuses tables that cannot fit before anything is allocated: the node spacing that reaches ε
// shrinks as (ε / (C Σ max|q|))^¼, so absurd rates ask for millions of nodes per source. Bounds:
// kMaxProfileNodes per source (each thread's scratch holds about 8 (2 sources + 513) bytes per
// node) and one output time's tables within max_table_bytes (a block holds at least one time).
void check_table_size(const NodeLayout& layout, double t_last, double max_table_bytes, double eps) {
  double worst = 0.0, total = 0.0;
  for (std::size_t w : layout.reach.kept) {
    const double n = layout.node_estimate(layout.cut_radius2(w, t_last));
    worst = std::max(worst, n);
    total += n;
  }
  const double bytes = 16.0 * total;
  if (worst <= kMaxProfileNodes && bytes <= max_table_bytes) return;
  throw NumericalError("pressure grid: reaching its error bound of " + number_text(eps, 3) + " Pa with injection rates of " +
                       number_text(layout.reach.qsum, 3) + " m3/s in total needs " + number_text(worst, 3) +
                       " profile nodes per source and " + number_text(bytes, 3) +
                       " bytes of tables per output time (limits " + number_text(kMaxProfileNodes, 3) + " nodes and " +
                       number_text(max_table_bytes, 3) +
                       " bytes); rates this large are far outside the range of the pressure model");
}

// Output times in increasing order (equal times keep their input order).
std::vector<std::size_t> time_order(std::span<const double> times) {
  std::vector<std::size_t> order(times.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return times[a] < times[b]; });
  return order;
}

// Output times per block, so that one block's tables stay within max_table_bytes.
std::size_t times_per_block(const NodeLayout& layout, double t_last, std::size_t n_times,
                            double max_table_bytes) {
  double bytes_per_time = 0.0;
  for (std::size_t w : layout.reach.kept) bytes_per_time += 16.0 * double(layout.nodes_for(layout.cut_radius2(w, t_last)));
  return std::max<std::size_t>(
      1, std::min<std::size_t>(n_times, std::size_t(max_table_bytes / std::max(bytes_per_time, 1.0))));
}

// One block of output times, times[order[b0 + kk]] for kk < nt, and per source: its cut-off
// radius² at the block's last time, its profile nodes (0: nothing to add in this block), its
// first output time after its first step, and where its table starts in the block's array.
struct TimeBlock {
  std::span<const double> times;
  const std::vector<std::size_t>& order;
  std::size_t b0, nt;
  std::vector<double> r2cut;
  std::vector<std::size_t> nodes, offset, k0;
  std::size_t k_max = 2;  // nodes of the longest profile

  double time(std::size_t kk) const { return times[order[b0 + kk]]; }
};

TimeBlock time_block(const NodeLayout& layout, const std::vector<Source>& sources,
                     std::span<const double> times, const std::vector<std::size_t>& order,
                     std::size_t b0, std::size_t block) {
  const std::size_t ns = sources.size(), nt = std::min(block, order.size() - b0);
  TimeBlock tb{times, order, b0, nt, std::vector<double>(ns), std::vector<std::size_t>(ns, 0),
               std::vector<std::size_t>(ns + 1, 0), std::vector<std::size_t>(ns, nt)};
  const double t_hi = tb.time(nt - 1);
  for (std::size_t w = 0; w < ns; ++w) {
    tb.r2cut[w] = layout.cut_radius2(w, t_hi);
    // A source that stays below its share even at the well face contributes nothing here.
    if (tb.r2cut[w] > sources[w].rw2) tb.nodes[w] = layout.nodes_for(tb.r2cut[w]);
    tb.k0[w] = 0;
    while (tb.k0[w] < nt && tb.time(tb.k0[w]) <= layout.scales.first[w]) ++tb.k0[w];
    if (tb.k0[w] == nt) tb.nodes[w] = 0;
    tb.offset[w + 1] = tb.offset[w] + tb.nodes[w] * 2 * (nt - tb.k0[w]);
    tb.k_max = std::max(tb.k_max, tb.nodes[w]);
  }
  return tb;
}

// Tables: for each output time, E1 and its s-derivative at every node and union step, then
// matrix products with the rate increments give every kept source's profile. Steps are taken
// in chunks to bound the scratch memory when the union of step times is long.
// Source w's table (at tb.offset[w]): per node, [C f(t_k0..), C h f'(t_k0..)] (see TileJob).
std::vector<double> profile_tables(const TimeBlock& tb, const NodeLayout& layout, const UnionSteps& steps,
                                   double c) {
  std::vector<double> table(tb.offset.back(), 0.0);
  const std::vector<double>& tau = steps.tau;
  const std::vector<std::size_t>& kept = layout.reach.kept;
  const std::size_t nt = tb.nt, k_max = tb.k_max;
  const double s0 = layout.s0, h = layout.h, d = layout.d;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic)
  for (std::size_t kk = 0; kk < nt; ++kk)
    errors.iteration(kk, [&] {
      const double t = tb.time(kk);
      const std::size_t nj = static_cast<std::size_t>(std::lower_bound(tau.begin(), tau.end(), t) - tau.begin());
      if (nj == 0) return;
      const auto cols = static_cast<Eigen::Index>(k_max);
      Eigen::MatrixXd f = Eigen::MatrixXd::Zero(steps.dq.rows(), cols), fd = Eigen::MatrixXd::Zero(steps.dq.rows(), cols);
      std::vector<double> r2n(k_max);
      for (std::size_t n = 0; n < k_max; ++n) r2n[n] = std::exp(2.0 * (s0 + double(n) * h));
      for (std::size_t c0 = 0; c0 < nj; c0 += kStepChunk) {
        const std::size_t nc = std::min(kStepChunk, nj - c0);
        RowMatrix e(static_cast<Eigen::Index>(nc), cols), g(static_cast<Eigen::Index>(nc), cols);
        for (std::size_t jj = 0; jj < nc; ++jj) {
          const double a = 1.0 / (4.0 * d * (t - tau[c0 + jj]));
          double* er = e.data() + jj * k_max;
          double* gr = g.data() + jj * k_max;
          for (std::size_t n = 0; n < k_max; ++n) gr[n] = r2n[n] * a;  // u
          well_function(gr, er, k_max);
          for (std::size_t n = 0; n < k_max; ++n) gr[n] = -2.0 * h * std::exp(-gr[n]);  // h · dE1/ds
        }
        const auto block_cols = steps.dq.middleCols(static_cast<Eigen::Index>(c0), static_cast<Eigen::Index>(nc));
        f.noalias() += block_cols * e;
        fd.noalias() += block_cols * g;
      }
      for (std::size_t r = 0; r < kept.size(); ++r) {
        const std::size_t w = kept[r];
        if (kk < tb.k0[w] || tb.nodes[w] == 0) continue;
        const std::size_t m = nt - tb.k0[w], col = kk - tb.k0[w];
        double* tw = table.data() + tb.offset[w];
        for (std::size_t n = 0; n < tb.nodes[w]; ++n) {
          tw[n * 2 * m + col] = c * f(Eigen::Index(r), Eigen::Index(n));
          tw[n * 2 * m + m + col] = c * fd(Eigen::Index(r), Eigen::Index(n));
        }
      }
    });
  errors.rethrow();
  return table;
}

// Pixels: tiles in parallel; each pixel sums its sources in input order (deterministic).
void evaluate_tiles(const GridGeometry& geometry, const std::vector<Source>& sources, const TimeBlock& tb,
                    const NodeLayout& layout, const std::vector<double>& table, std::vector<double>& values) {
  const std::size_t nx = geometry.nx, ny = geometry.ny, ns = sources.size(), nt = tb.nt;
  const std::size_t tiles_x = (nx + kTile - 1) / kTile, tiles_y = (ny + kTile - 1) / kTile;
  const double s0 = layout.s0, h = layout.h;
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic)
  for (std::size_t tile = 0; tile < tiles_x * tiles_y; ++tile)
    errors.iteration(tile, [&] {
      const std::size_t i0 = (tile % tiles_x) * kTile, j0 = (tile / tiles_x) * kTile;
      const std::size_t i1 = std::min(i0 + kTile, nx), j1 = std::min(j0 + kTile, ny);
      const std::size_t np = (i1 - i0) * (j1 - j0);
      std::vector<double> px(np), py(np), acc(np * nt, 0.0);
      for (std::size_t j = j0, p = 0; j < j1; ++j)
        for (std::size_t i = i0; i < i1; ++i, ++p) {
          px[p] = geometry.centre_x(i);
          py[p] = geometry.centre_y(j);
        }
      const double xlo = std::min(px.front(), px.back()), xhi = std::max(px.front(), px.back());
      const double ylo = std::min(py.front(), py.back()), yhi = std::max(py.front(), py.back());
      for (std::size_t w = 0; w < ns; ++w) {
        if (tb.nodes[w] == 0) continue;
        const Source& s = sources[w];
        const double gx = std::max({xlo - s.x, 0.0, s.x - xhi}), gy = std::max({ylo - s.y, 0.0, s.y - yhi});
        if (gx * gx + gy * gy > tb.r2cut[w]) continue;  // the whole tile is beyond the cut-off
        accumulate(TileJob{px.data(), py.data(), np, s.x, s.y, s.rw2, tb.r2cut[w], s0, 1.0 / h,
                           tb.nodes[w], table.data() + tb.offset[w], tb.k0[w], nt, acc.data()});
      }
      for (std::size_t kk = 0; kk < nt; ++kk) {
        const std::size_t k = tb.order[tb.b0 + kk];
        for (std::size_t j = j0, p = 0; j < j1; ++j)
          for (std::size_t i = i0; i < i1; ++i, ++p) values[(k * ny + j) * nx + i] = acc[p * nt + kk];
      }
    });
  errors.rethrow();
}

// The fast path proper, on validated input; pixels with inside == 0 become NaN.
PressureGrid fast_grid(const GridGeometry& geometry, double c, double d, const std::vector<Source>& sources,
                       std::span<const double> times, const PressureGridOptions& options,
                       const std::vector<char>& inside) {
  PressureGrid out = empty_grid(geometry, times);
  const double eps = options.relative_tolerance * options.threshold;
  out.error_bound = eps;
  const RateScales scales = rate_scales(sources);
  if (scales.qsum == 0.0 || times.empty()) {
    mask_outside(out, inside);
    return out;
  }

  // Cut-off: source w is dropped beyond R_w with C max|q_w| E1(R_w²/(4 D θ_w)) = ε/4 · max|q_w|/Σ max|q|,
  // i.e. E1(u*) = ε/(4 C Σ max|q|), the same u* for every source.
  const double u_cut = e1_inverse(0.25 * eps / (c * scales.qsum));
  const double t_last = *std::max_element(times.begin(), times.end());
  const Reach reach = sources_in_reach(geometry, d, sources, scales, u_cut, t_last);
  if (reach.kept.empty()) {
    mask_outside(out, inside);
    return out;
  }

  // Node spacing in ln r: Σ_w kHermiteFactor h⁴ C max|q_w| ≤ ε/2 over the sources kept; nodes
  // from the smallest well radius.
  const double h = std::min(0.05, std::pow(0.5 * eps / (kHermiteFactor * c * reach.qsum), 0.25));
  out.node_spacing = h;
  const NodeLayout layout{0.5 * std::log(reach.rw2_min), h, reach.rw2_min, d, u_cut, scales, reach};
  check_table_size(layout, t_last, options.max_table_bytes, eps);
  const UnionSteps steps = union_steps(sources, reach.kept);

  // Output times in increasing order, processed in blocks that keep the tables in memory bounds.
  const std::vector<std::size_t> order = time_order(times);
  const std::size_t block = times_per_block(layout, t_last, times.size(), options.max_table_bytes);
  for (std::size_t b0 = 0; b0 < order.size(); b0 += block) {
    const TimeBlock tb = time_block(layout, sources, times, order, b0, block);
    for (std::size_t nodes : tb.nodes) out.profile_nodes += nodes;
    const std::vector<double> table = profile_tables(tb, layout, steps, c);
    evaluate_tiles(geometry, sources, tb, layout, table, out.values);
  }
  mask_outside(out, inside);
  return out;
}

}  // namespace

PressureGrid pressure_grid(const GridGeometry& geometry, const PressureField& field,
                           const TheisParameters& params, std::span<const double> times,
                           std::span<const double> rate_factors, const PressureGridOptions& options) {
  validate(geometry);
  validate(params);
  validate_times(times);
  validate(options);
  const std::vector<Source> sources = collect_sources(field, rate_factors);
  return fast_grid(geometry, params.pressure_per_rate, params.diffusivity, sources, times, options,
                   region_mask(geometry, field));
}

PressureGrid pressure_grid(const GridGeometry& geometry, const GridFormation& formation,
                           std::span<const GridSource> sources, std::span<const double> times,
                           const PressureGridOptions& options) {
  validate(geometry);
  if (!std::isfinite(formation.prefactor) || formation.prefactor <= 0.0)
    throw InputError("prefactor", number_text(formation.prefactor), "a finite μ/(4π k h) > 0 (Pa per m³/s)");
  if (!std::isfinite(formation.diffusivity) || formation.diffusivity <= 0.0)
    throw InputError("diffusivity", number_text(formation.diffusivity), "a finite k/(μ φ c_t) > 0 (m²/s)");
  if (!std::isfinite(formation.well_radius) || formation.well_radius <= 0.0)
    throw InputError("well_radius", number_text(formation.well_radius), "a finite well radius > 0 (m)");
  validate_times(times);
  validate(options);
  std::vector<Source> list;
  const double rw2 = formation.well_radius * formation.well_radius;
  for (std::size_t w = 0; w < sources.size(); ++w) {
    const GridSource& s = sources[w];
    const std::string tag = "sources[" + std::to_string(w) + "].";
    if (!std::isfinite(s.x) || !std::isfinite(s.y))
      throw InputError(tag + "x/y", number_text(s.x) + ", " + number_text(s.y), "finite coordinates (m)");
    if (s.start.size() != s.rate.size())
      throw InputError(tag + "rate", std::to_string(s.rate.size()) + " values",
                       std::to_string(s.start.size()) + " values, one per step start");
    for (std::size_t j = 0; j < s.start.size(); ++j) {
      if (!std::isfinite(s.start[j]) || (j > 0 && !(s.start[j] > s.start[j - 1])))
        throw InputError(tag + "start[" + std::to_string(j) + "]", number_text(s.start[j]),
                         "a finite time after the previous step's (steps sorted, not overlapping)");
      if (!std::isfinite(s.rate[j]))
        throw InputError(tag + "rate[" + std::to_string(j) + "]", number_text(s.rate[j]), "a finite rate (m³/s)");
    }
    list.push_back({s.x, s.y, rw2, 1.0, &s.start, &s.rate});
  }
  return fast_grid(geometry, formation.prefactor, formation.diffusivity, list, times, options,
                   std::vector<char>(geometry.nx * geometry.ny, 1));
}

}  // namespace slipscreen::hydro
