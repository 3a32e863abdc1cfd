#include "core/hydro/pressure_grid.hpp"

#include <Eigen/Dense>
#include <algorithm>
#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <numeric>
#include <sstream>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::hydro {
namespace {

// max|f⁗(s)| ≤ 16 I C max|q| with I = ∫₀^∞ e^{−x} |x³ − 6x² + 7x − 1| dx (see the header), and
// the cubic Hermite error factor 1/384: |f − H| ≤ kHermiteFactor · h⁴ · C max|q|.
constexpr double kHermiteFactor = 16.0 * kProfileFourthDerivativeIntegral / 384.0;
constexpr std::size_t kTile = 16;        // pixels per tile side
constexpr std::size_t kStepChunk = 256;  // union steps per matrix product in the table build

using RowMatrix = Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;

// E1 for a batch of arguments (placeholder until the project's well function is merged).
void e1_batch(const double* u, double* out, std::size_t n) {
  for (std::size_t i = 0; i < n; ++i)
    out[i] = u[i] > 700.0 ? 0.0 : boost::math::expint(1, u[i]);
}
double e1(double u) { return u > 700.0 ? 0.0 : boost::math::expint(1, u); }

std::string str(double v) {
  std::ostringstream s;
  s.precision(17);
  s << v;
  return s.str();
}

void validate_geometry(const GridGeometry& g) {
  auto finite = [](double v) { return std::isfinite(v); };
  if (!finite(g.origin_x)) throw InputError("origin_x", str(g.origin_x), "a finite coordinate in m");
  if (!finite(g.origin_y)) throw InputError("origin_y", str(g.origin_y), "a finite coordinate in m");
  if (!finite(g.cell_x) || g.cell_x <= 0.0)
    throw InputError("cell_x", str(g.cell_x), "a finite pixel width > 0 m");
  if (!finite(g.cell_y) || g.cell_y == 0.0)
    throw InputError("cell_y", str(g.cell_y), "a finite, non-zero pixel height in m (negative for north-up)");
  if (g.nx == 0 || g.ny == 0)
    throw InputError("size", std::to_string(g.nx) + "x" + std::to_string(g.ny), "at least 1x1 pixels");
}

void validate(const GridFormation& f, std::span<const GridSource> sources, std::span<const double> times) {
  auto finite = [](double v) { return std::isfinite(v); };
  if (!finite(f.prefactor) || f.prefactor <= 0.0)
    throw InputError("prefactor", str(f.prefactor), "a finite μ/(4π k h) > 0 Pa per m³/s");
  if (!finite(f.diffusivity) || f.diffusivity <= 0.0)
    throw InputError("diffusivity", str(f.diffusivity), "a finite diffusivity k/(μ φ c_t) > 0 m²/s");
  if (!finite(f.well_radius) || f.well_radius <= 0.0)
    throw InputError("well_radius", str(f.well_radius), "a finite well radius > 0 m");
  for (std::size_t w = 0; w < sources.size(); ++w) {
    const GridSource& s = sources[w];
    const std::string tag = "sources[" + std::to_string(w) + "].";
    if (!finite(s.x) || !finite(s.y))
      throw InputError(tag + "x/y", str(s.x) + " " + str(s.y), "finite coordinates in m");
    if (s.start.size() != s.rate.size())
      throw InputError(tag + "rate", std::to_string(s.rate.size()) + " values",
                       std::to_string(s.start.size()) + " values, one per step start");
    for (std::size_t j = 0; j < s.start.size(); ++j) {
      if (!finite(s.start[j]))
        throw InputError(tag + "start[" + std::to_string(j) + "]", str(s.start[j]), "a finite time in s");
      if (!finite(s.rate[j]))
        throw InputError(tag + "rate[" + std::to_string(j) + "]", str(s.rate[j]), "a finite rate in m³/s");
      if (j > 0 && !(s.start[j] > s.start[j - 1]))
        throw InputError(tag + "start[" + std::to_string(j) + "]", str(s.start[j]),
                         "a start later than the previous step's (" + str(s.start[j - 1]) +
                             " s): rate steps must be sorted and not overlap");
    }
  }
  for (std::size_t k = 0; k < times.size(); ++k)
    if (!finite(times[k])) throw InputError("times[" + std::to_string(k) + "]", str(times[k]), "a finite time in s");
}

// Σ_j Δq_j E1(r²/(4 D (t − τ_j))) for one source: the direct superposition in time.
double source_sum(const GridSource& s, double r2, double d, double t, std::vector<double>& u,
                  std::vector<double>& e) {
  std::size_t n = 0;
  while (n < s.start.size() && s.start[n] < t) ++n;
  if (n == 0) return 0.0;
  u.resize(n);
  e.resize(n);
  for (std::size_t j = 0; j < n; ++j) u[j] = r2 / (4.0 * d * (t - s.start[j]));
  e1_batch(u.data(), e.data(), n);
  double sum = 0.0, prev = 0.0;
  for (std::size_t j = 0; j < n; ++j) {
    sum += (s.rate[j] - prev) * e[j];
    prev = s.rate[j];
  }
  return sum;
}

// The u at which E1(u) = target (bisection on ln u; E1 is decreasing). Returns 0 when E1 never
// falls to the target... i.e. target ≥ E1(1e-300), and the underflow end when target ≤ 0.
double e1_inverse(double target) {
  if (target <= 0.0) return 710.0;
  double lo = std::log(1e-300), hi = std::log(705.0);
  if (e1(std::exp(lo)) <= target) return 0.0;
  for (int it = 0; it < 200 && hi - lo > 1e-13; ++it) {
    const double mid = 0.5 * (lo + hi);
    (e1(std::exp(mid)) > target ? lo : hi) = mid;
  }
  return std::exp(hi);  // E1(hi) ≤ target
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

}  // namespace

std::vector<double> pressure_direct_at(const GridFormation& formation,
                                       std::span<const GridSource> sources, double x, double y,
                                       std::span<const double> times) {
  validate(formation, sources, times);
  std::vector<double> out(times.size(), 0.0), u, e;
  const double r2_min = formation.well_radius * formation.well_radius;
  for (std::size_t k = 0; k < times.size(); ++k) {
    double sum = 0.0;
    for (const GridSource& s : sources) {
      const double r2 = std::max((x - s.x) * (x - s.x) + (y - s.y) * (y - s.y), r2_min);
      sum += source_sum(s, r2, formation.diffusivity, times[k], u, e);
    }
    out[k] = formation.prefactor * sum;
  }
  return out;
}

PressureGrid pressure_grid_direct(const GridGeometry& geometry, const GridFormation& formation,
                                  std::span<const GridSource> sources, std::span<const double> times) {
  validate_geometry(geometry);
  validate(formation, sources, times);
  PressureGrid out = empty_grid(geometry, times);
  const std::size_t nx = geometry.nx, ny = geometry.ny;
#pragma omp parallel for schedule(dynamic)
  for (std::size_t j = 0; j < ny; ++j) {
    std::vector<double> u, e;
    const double r2_min = formation.well_radius * formation.well_radius;
    for (std::size_t i = 0; i < nx; ++i) {
      const double x = geometry.centre_x(i), y = geometry.centre_y(j);
      for (std::size_t k = 0; k < times.size(); ++k) {
        double sum = 0.0;
        for (const GridSource& s : sources) {
          const double r2 = std::max((x - s.x) * (x - s.x) + (y - s.y) * (y - s.y), r2_min);
          sum += source_sum(s, r2, formation.diffusivity, times[k], u, e);
        }
        out.values[(k * ny + j) * nx + i] = formation.prefactor * sum;
      }
    }
  }
  return out;
}

PressureGrid pressure_grid(const GridGeometry& geometry, const GridFormation& formation,
                           std::span<const GridSource> sources, std::span<const double> times,
                           const PressureGridOptions& options) {
  validate_geometry(geometry);
  validate(formation, sources, times);
  if (!std::isfinite(options.threshold) || options.threshold <= 0.0)
    throw InputError("threshold", str(options.threshold), "a finite pressure > 0 Pa");
  if (!std::isfinite(options.relative_tolerance) || options.relative_tolerance <= 0.0 ||
      options.relative_tolerance >= 1.0)
    throw InputError("relative_tolerance", str(options.relative_tolerance), "a number in (0, 1)");
  if (!std::isfinite(options.max_table_bytes) || options.max_table_bytes < 1e6)
    throw InputError("max_table_bytes", str(options.max_table_bytes), "at least 1e6 bytes");

  PressureGrid out = empty_grid(geometry, times);
  const double eps = options.relative_tolerance * options.threshold;
  out.error_bound = eps;
  const std::size_t nx = geometry.nx, ny = geometry.ny, ns = sources.size();
  const double c = formation.prefactor, d = formation.diffusivity, rw = formation.well_radius;

  // Rate scale per source and in total.
  std::vector<double> qmax(ns, 0.0);
  for (std::size_t w = 0; w < ns; ++w)
    for (double q : sources[w].rate) qmax[w] = std::max(qmax[w], std::abs(q));
  const double qsum = std::accumulate(qmax.begin(), qmax.end(), 0.0);
  if (qsum == 0.0 || times.empty()) return out;

  // Cut-off: source w is dropped beyond R_w with C max|q_w| E1(R_w²/(4 D θ_w)) = ε/4 · max|q_w|/Σ max|q|,
  // i.e. E1(u*) = ε/(4 C Σ max|q|), the same u* for every source.
  const double u_cut = e1_inverse(0.25 * eps / (c * qsum));
  std::vector<double> first(ns, 0.0);
  for (std::size_t w = 0; w < ns; ++w)
    if (!sources[w].start.empty()) first[w] = sources[w].start.front();
  const double t_last = *std::max_element(times.begin(), times.end());
  // Sources whose cut-off radius at the last time does not reach the raster (pixel centres) are
  // dropped altogether: each stays within its share of ε/4 everywhere on it.
  const double bx0 = std::min(geometry.centre_x(0), geometry.centre_x(nx - 1));
  const double bx1 = std::max(geometry.centre_x(0), geometry.centre_x(nx - 1));
  const double by0 = std::min(geometry.centre_y(0), geometry.centre_y(ny - 1));
  const double by1 = std::max(geometry.centre_y(0), geometry.centre_y(ny - 1));
  std::vector<char> reach(ns, 0);
  double qsum_reach = 0.0;
  for (std::size_t w = 0; w < ns; ++w) {
    const double theta = t_last - first[w];
    if (qmax[w] == 0.0 || sources[w].start.empty() || theta <= 0.0) continue;
    const double gx = std::max({bx0 - sources[w].x, 0.0, sources[w].x - bx1});
    const double gy = std::max({by0 - sources[w].y, 0.0, sources[w].y - by1});
    if (gx * gx + gy * gy > 4.0 * d * theta * u_cut) continue;
    reach[w] = 1;
    qsum_reach += qmax[w];
  }
  if (qsum_reach == 0.0) return out;

  // Node spacing in ln r: Σ_w kHermiteFactor h⁴ C max|q_w| ≤ ε/2 over the sources kept.
  const double h = std::min(0.05, std::pow(0.5 * eps / (kHermiteFactor * c * qsum_reach), 0.25));
  out.node_spacing = h;
  const double s0 = std::log(rw);

  // Union of the kept sources' step times, and their rate increments on it (row r: kept[r]).
  std::vector<std::size_t> kept;
  for (std::size_t w = 0; w < ns; ++w)
    if (reach[w]) kept.push_back(w);
  std::vector<double> tau;
  for (std::size_t w : kept) tau.insert(tau.end(), sources[w].start.begin(), sources[w].start.end());
  std::sort(tau.begin(), tau.end());
  tau.erase(std::unique(tau.begin(), tau.end()), tau.end());
  Eigen::MatrixXd dq = Eigen::MatrixXd::Zero(Eigen::Index(kept.size()), Eigen::Index(tau.size()));
  for (std::size_t r = 0; r < kept.size(); ++r) {
    double prev = 0.0;
    const GridSource& s = sources[kept[r]];
    for (std::size_t j = 0; j < s.start.size(); ++j) {
      const auto col = std::lower_bound(tau.begin(), tau.end(), s.start[j]) - tau.begin();
      dq(Eigen::Index(r), col) += s.rate[j] - prev;
      prev = s.rate[j];
    }
  }

  // Output times in increasing order, processed in blocks that keep the tables in memory bounds.
  std::vector<std::size_t> order(times.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return times[a] < times[b]; });

  // Profile nodes of source w for cut-off radius² r2cut (≥ 2 nodes; node K−1 at or beyond R).
  auto nodes_for = [&](double r2cut) {
    const double smax = 0.5 * std::log(std::max(r2cut, rw * rw));
    return static_cast<std::size_t>(std::floor((smax - s0) / h)) + 2;
  };
  auto cut_radius2 = [&](std::size_t w, double t) {
    const double theta = t - first[w];
    if (!reach[w] || theta <= 0.0) return -1.0;  // inactive
    return 4.0 * d * theta * u_cut;
  };
  double bytes_per_time = 0.0;
  for (std::size_t w = 0; w < ns; ++w)
    if (cut_radius2(w, t_last) >= 0.0) bytes_per_time += 16.0 * double(nodes_for(cut_radius2(w, t_last)));
  const std::size_t block = std::max<std::size_t>(
      1, std::min<std::size_t>(times.size(), std::size_t(options.max_table_bytes / std::max(bytes_per_time, 1.0))));

  // Pixel centres, tile by tile.
  const std::size_t tiles_x = (nx + kTile - 1) / kTile, tiles_y = (ny + kTile - 1) / kTile;

  for (std::size_t b0 = 0; b0 < order.size(); b0 += block) {
    const std::size_t nt = std::min(block, order.size() - b0);
    const double t_hi = times[order[b0 + nt - 1]];
    std::vector<double> r2cut(ns);
    std::vector<std::size_t> nodes(ns, 0), offset(ns + 1, 0), k0(ns, nt);
    std::size_t k_max = 2;
    for (std::size_t w = 0; w < ns; ++w) {
      r2cut[w] = cut_radius2(w, t_hi);
      // A source that stays below its share even at the well face contributes nothing here.
      if (r2cut[w] >= 0.0 && r2cut[w] > rw * rw) nodes[w] = nodes_for(r2cut[w]);
      k0[w] = 0;
      while (k0[w] < nt && times[order[b0 + k0[w]]] <= first[w]) ++k0[w];
      if (k0[w] == nt) nodes[w] = 0;
      offset[w + 1] = offset[w] + nodes[w] * 2 * (nt - k0[w]);
      k_max = std::max(k_max, nodes[w]);
      out.profile_nodes += nodes[w];
    }
    std::vector<double> table(offset[ns], 0.0);

    // Tables: for each output time, E1 and its s-derivative at every node and union step, then
    // matrix products with the rate increments give every kept source's profile. Steps are taken
    // in chunks to bound the scratch memory when the union of step times is long.
#pragma omp parallel for schedule(dynamic)
    for (std::size_t kk = 0; kk < nt; ++kk) {
      const double t = times[order[b0 + kk]];
      const std::size_t nj = static_cast<std::size_t>(std::lower_bound(tau.begin(), tau.end(), t) - tau.begin());
      if (nj == 0) continue;
      const auto cols = static_cast<Eigen::Index>(k_max);
      Eigen::MatrixXd f = Eigen::MatrixXd::Zero(dq.rows(), cols), fd = Eigen::MatrixXd::Zero(dq.rows(), cols);
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
          e1_batch(gr, er, k_max);
          for (std::size_t n = 0; n < k_max; ++n) gr[n] = -2.0 * h * std::exp(-gr[n]);  // h · dE1/ds
        }
        const auto block_cols = dq.middleCols(static_cast<Eigen::Index>(c0), static_cast<Eigen::Index>(nc));
        f.noalias() += block_cols * e;
        fd.noalias() += block_cols * g;
      }
      for (std::size_t r = 0; r < kept.size(); ++r) {
        const std::size_t w = kept[r];
        if (kk < k0[w] || nodes[w] == 0) continue;
        const std::size_t m = nt - k0[w], col = kk - k0[w];
        double* tw = table.data() + offset[w];
        for (std::size_t n = 0; n < nodes[w]; ++n) {
          tw[n * 2 * m + col] = c * f(Eigen::Index(r), Eigen::Index(n));
          tw[n * 2 * m + m + col] = c * fd(Eigen::Index(r), Eigen::Index(n));
        }
      }
    }

    // Pixels: tiles in parallel; each pixel sums its sources in input order (deterministic).
#pragma omp parallel for schedule(dynamic)
    for (std::size_t tile = 0; tile < tiles_x * tiles_y; ++tile) {
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
        if (nodes[w] == 0) continue;
        const GridSource& s = sources[w];
        const double gx = std::max({xlo - s.x, 0.0, s.x - xhi}), gy = std::max({ylo - s.y, 0.0, s.y - yhi});
        if (gx * gx + gy * gy > r2cut[w]) continue;  // the whole tile is beyond the cut-off
        accumulate(TileJob{px.data(), py.data(), np, s.x, s.y, rw * rw, r2cut[w], s0, 1.0 / h,
                           nodes[w], table.data() + offset[w], k0[w], nt, acc.data()});
      }
      for (std::size_t kk = 0; kk < nt; ++kk) {
        const std::size_t k = order[b0 + kk];
        for (std::size_t j = j0, p = 0; j < j1; ++j)
          for (std::size_t i = i0; i < i1; ++i, ++p) out.values[(k * ny + j) * nx + i] = acc[p * nt + kk];
      }
    }
  }
  return out;
}

}  // namespace slipscreen::hydro
