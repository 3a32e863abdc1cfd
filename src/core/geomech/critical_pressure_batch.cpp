#include "core/geomech/critical_pressure_batch.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::geomech {
namespace {

struct State {
  double sxx, syy, szz, sxy, sxz, syz, p0, mu, c, kappa;
};

State state_at(const StressBatch& b, std::size_t s) {
  return {b.sxx[s], b.syy[s], b.szz[s], b.sxy[s], b.sxz[s], b.syz[s], b.p0[s], b.mu[s], b.cohesion[s], b.kappa[s]};
}

// σn and the shear traction vector a = t − σn n (t = S n) of one plane under one state.
struct Traction {
  double sn, ax, ay, az;
};

inline Traction traction(double nx, double ny, double nz, const State& s) {
  const double tx = s.sxx * nx + s.sxy * ny + s.sxz * nz;
  const double ty = s.sxy * nx + s.syy * ny + s.syz * nz;
  const double tz = s.sxz * nx + s.syz * ny + s.szz * nz;
  const double sn = tx * nx + ty * ny + tz * nz;
  return {sn, tx - sn * nx, ty - sn * ny, tz - sn * nz};
}

// The closed form (κ = 0): straight-line code the vectoriser accepts.
inline double one(double nx, double ny, double nz, const State& s) {
  const Traction t = traction(nx, ny, nz, s);
  const double tau = std::sqrt(t.ax * t.ax + t.ay * t.ay + t.az * t.az);
  return critical_pressure_closed_form(tau, t.sn, s.p0, s.mu, s.c);
}

// The path inputs of one plane (κ > 0): τ0², a·b, |b|², g0, g1 (see coulomb.hpp).
struct PathInputs {
  double tau2, ab, bb, g0, g1;
};

inline PathInputs path_inputs(double nx, double ny, double nz, const State& s) {
  const Traction t = traction(nx, ny, nz, s);
  const double beta_n = s.kappa * (nx * nx + ny * ny);
  const double bx = s.kappa * nx - beta_n * nx, by = s.kappa * ny - beta_n * ny, bz = -beta_n * nz;
  return {t.ax * t.ax + t.ay * t.ay + t.az * t.az, t.ax * bx + t.ay * by + t.az * bz, bx * bx + by * by + bz * bz,
          s.mu * (t.sn - s.p0) + s.c, s.mu * (beta_n - 1.0)};
}

// The exact poroelastic root (κ > 0), as critical_pressure_poroelastic computes it.
inline double one_path(double nx, double ny, double nz, const State& s) {
  const PathInputs in = path_inputs(nx, ny, nz, s);
  return critical_pressure_path_root(std::sqrt(in.tau2), in.ab, in.bb, in.g0, in.g1);
}

// The closed form over one row of planes, in blocks that stay in L1: loop 1 (traction, τ²) and
// loop 3 (Δp_crit) vectorise in the AVX2 or SSE2 clone; the square roots go through Eigen's
// array sqrt (packet instructions), because std::sqrt's errno branch stops GCC vectorising a
// loop unless -fno-math-errno is set for the whole file.
__attribute__((target_clones("avx2", "default")))
void row_plain(const double* __restrict nx, const double* __restrict ny, const double* __restrict nz,
               std::size_t m, State s, double* __restrict out) {
  constexpr std::size_t kBlock = 256;
  alignas(64) double tau[kBlock];
  alignas(64) double sn_eff[kBlock];
  for (std::size_t b = 0; b < m; b += kBlock) {
    const std::size_t n = std::min(kBlock, m - b);
    for (std::size_t i = 0; i < n; ++i) {
      const Traction t = traction(nx[b + i], ny[b + i], nz[b + i], s);
      tau[i] = t.ax * t.ax + t.ay * t.ay + t.az * t.az;
      sn_eff[i] = t.sn - s.p0;
    }
    Eigen::Map<Eigen::ArrayXd> tau_block(tau, static_cast<Eigen::Index>(n));
    tau_block = tau_block.sqrt();
    for (std::size_t i = 0; i < n; ++i) out[b + i] = sn_eff[i] - (tau[i] - s.c) / s.mu;  // Hubbert & Rubey (1959)
  }
}

// The poroelastic path over one row, blocked like row_plain: three Eigen square-root passes
// (τ0, √|b|², √disc) between branch-free loops.
__attribute__((target_clones("avx2", "default")))
void row_path(const double* __restrict nx, const double* __restrict ny, const double* __restrict nz,
              std::size_t m, State s, double* __restrict out) {
  constexpr std::size_t kBlock = 256;
  alignas(64) double tau[kBlock], ab[kBlock], bb[kBlock], g0[kBlock], g1[kBlock], sbb[kBlock], sd[kBlock];
  for (std::size_t b = 0; b < m; b += kBlock) {
    const std::size_t n = std::min(kBlock, m - b);
    const auto en = static_cast<Eigen::Index>(n);
    for (std::size_t i = 0; i < n; ++i) {
      const PathInputs in = path_inputs(nx[b + i], ny[b + i], nz[b + i], s);
      tau[i] = in.tau2;
      ab[i] = in.ab;
      bb[i] = in.bb;
      g0[i] = in.g0;
      g1[i] = in.g1;
    }
    Eigen::Map<Eigen::ArrayXd>(tau, en) = Eigen::Map<Eigen::ArrayXd>(tau, en).sqrt();
    Eigen::Map<Eigen::ArrayXd>(sbb, en) = Eigen::Map<Eigen::ArrayXd>(bb, en).sqrt();
    for (std::size_t i = 0; i < n; ++i) {
      const double d = path_quadratic(tau[i], ab[i], bb[i], g0[i], g1[i]).disc;
      sd[i] = d > 0.0 ? d : 0.0;
    }
    Eigen::Map<Eigen::ArrayXd>(sd, en) = Eigen::Map<Eigen::ArrayXd>(sd, en).sqrt();
    for (std::size_t i = 0; i < n; ++i)
      out[b + i] = path_root_select(tau[i], bb[i], g0[i], g1[i], path_quadratic(tau[i], ab[i], bb[i], g0[i], g1[i]),
                                    sbb[i], sd[i]);
  }
}

void check_sizes(const PlaneBatch& p, const StressBatch& s, std::size_t out, std::size_t expected) {
  if (p.ny.size() != p.size() || p.nz.size() != p.size())
    throw InputError("plane batch", std::to_string(p.size()), "equal-length normal arrays");
  if (out != expected)
    throw InputError("output size", std::to_string(out), std::to_string(expected) + " elements");
  (void)s;
}

}  // namespace

void PlaneBatch::reserve(std::size_t n) {
  nx.reserve(n);
  ny.reserve(n);
  nz.reserve(n);
}

void PlaneBatch::push_back(const FaultPlane& p) { push_back(p.normal()); }

void PlaneBatch::push_back(const Eigen::Vector3d& n) {
  nx.push_back(n(0));
  ny.push_back(n(1));
  nz.push_back(n(2));
}

void StressBatch::reserve(std::size_t n) {
  for (auto* v : {&sxx, &syy, &szz, &sxy, &sxz, &syz, &p0, &mu, &cohesion, &kappa}) v->reserve(n);
}

void StressBatch::push_back(const Eigen::Matrix3d& s, double pore_pressure, const Friction& f, double k) {
  check(f);
  if (!std::isfinite(k) || k < 0.0 || k > 1.0)
    throw InputError("stress-path coefficient", std::to_string(k), "a value in [0, 1]");
  sxx.push_back(s(0, 0));
  syy.push_back(s(1, 1));
  szz.push_back(s(2, 2));
  sxy.push_back(0.5 * (s(0, 1) + s(1, 0)));
  sxz.push_back(0.5 * (s(0, 2) + s(2, 0)));
  syz.push_back(0.5 * (s(1, 2) + s(2, 1)));
  p0.push_back(pore_pressure);
  mu.push_back(f.mu);
  cohesion.push_back(f.cohesion);
  kappa.push_back(k);
}

void critical_pressure_grid(const PlaneBatch& planes, const StressBatch& states, std::span<double> out) {
  const std::size_t m = planes.size();
  const std::size_t k = states.size();
  check_sizes(planes, states, out.size(), m * k);
  const long long kk = static_cast<long long>(k);
  util::ParallelErrors errors;
#pragma omp parallel for schedule(static)
  for (long long s = 0; s < kk; ++s)
    errors.iteration(static_cast<std::size_t>(s), [&] {
      const State st = state_at(states, static_cast<std::size_t>(s));
      double* row = out.data() + static_cast<std::size_t>(s) * m;
      if (st.kappa == 0.0) row_plain(planes.nx.data(), planes.ny.data(), planes.nz.data(), m, st, row);
      else row_path(planes.nx.data(), planes.ny.data(), planes.nz.data(), m, st, row);
    });
  errors.rethrow();
}

void critical_pressure_paired(const PlaneBatch& planes, const StressBatch& states, std::span<double> out) {
  const std::size_t n = planes.size();
  if (states.size() != n) throw InputError("stress batch", std::to_string(states.size()), std::to_string(n) + " states (one per plane)");
  check_sizes(planes, states, out.size(), n);
  const long long nn = static_cast<long long>(n);
  util::ParallelErrors errors;
#pragma omp parallel for schedule(static)
  for (long long i = 0; i < nn; ++i)
    errors.iteration(static_cast<std::size_t>(i), [&] {
      const std::size_t j = static_cast<std::size_t>(i);
      const State st = state_at(states, j);
      out[j] = st.kappa == 0.0 ? one(planes.nx[j], planes.ny[j], planes.nz[j], st)
                               : one_path(planes.nx[j], planes.ny[j], planes.nz[j], st);
    });
  errors.rethrow();
}

}  // namespace slipscreen::geomech
