#include "core/geomech/orientation_search.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <optional>
#include <string>

#include "core/errors.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::geomech {
namespace {
constexpr double kPi = std::numbers::pi;
constexpr double kDeg = kPi / 180.0;

void check_step(const char* field, double step) {
  if (!std::isfinite(step) || step <= 0.0 || step > kPi / 2)
    throw InputError(field, std::to_string(step / kDeg) + " deg", "a step in (0, 90] deg");
}

// Evaluates a strike × dip window (dip clamped to [0, 90°]) and returns the best node.
DangerousOrientation search_window(const StressBatch& state, double strike0, double dip0, double half_width,
                                   int half_count) {
  PlaneBatch planes;
  std::vector<std::pair<double, double>> nodes;
  const double step = half_width / half_count;
  for (int i = -half_count; i <= half_count; ++i) {
    for (int j = -half_count; j <= half_count; ++j) {
      const double dip = std::clamp(dip0 + j * step, 0.0, kPi / 2);
      const auto plane = FaultPlane::from_strike_dip(strike0 + i * step, dip);
      planes.push_back(plane);
      nodes.emplace_back(plane.strike(), plane.dip());
    }
  }
  std::vector<double> dp(planes.size());
  critical_pressure_grid(planes, state, dp);
  const auto best = static_cast<std::size_t>(std::min_element(dp.begin(), dp.end()) - dp.begin());
  return {FaultPlane::from_strike_dip(nodes[best].first, nodes[best].second), dp[best]};
}

// The most critical plane of a stress tensor, the one that maximises τ − μ σn: it contains the
// S2 axis and its normal lies at ψ = π/4 + ½·atan μ from S1 towards S3, so the plane makes
// ½·atan(1/μ) with S1 (Jaeger, Cook & Zimmerman 2007 ch. 4). With two equal principal
// stresses any axis of their plane serves (every such plane is equally critical).
Eigen::Vector3d optimal_normal(const Eigen::Matrix3d& stress, double mu) {
  const PrincipalStresses p = principal_stresses(stress);
  const double psi = kPi / 4 + 0.5 * std::atan(mu);
  return std::cos(psi) * p.directions.col(0) + std::sin(psi) * p.directions.col(2);
}

// max over all planes of CFF after a pore-pressure change x along the stress path: on the
// outer Mohr circle (centre σm, radius r of S1 and S3 of S + ΔS(κ, x)) the largest
// τ − μ (σn − p) is r √(1 + μ²) − μ (σm − p); Jaeger, Cook & Zimmerman (2007) ch. 4.
double max_cff(const Eigen::Matrix3d& stress, double p0, const Friction& f, double kappa, double x) {
  const Eigen::Matrix3d s = stress + poroelastic_stress_change(kappa, x);
  const Eigen::SelfAdjointEigenSolver<Eigen::Matrix3d> solver(s, Eigen::EigenvaluesOnly);
  if (solver.info() != Eigen::Success) throw NumericalError("most dangerous orientation: eigenvalues failed");
  const double s1 = solver.eigenvalues()(2), s3 = solver.eigenvalues()(0);
  const double centre = 0.5 * (s1 + s3), radius = 0.5 * (s1 - s3);
  return radius * std::sqrt(1.0 + f.mu * f.mu) - f.mu * (centre - (p0 + x)) - f.cohesion;
}

// The pressure change x at which the most critical plane reaches CFF = 0 along the path: the
// root of max_cff nearest 0 on the side the state lies (x > 0 when every plane is below failure
// at p0, x ≤ 0 otherwise), by bracketing outwards in doubling steps and bisection to rounding.
// nullopt when no root lies within kReach × the stress scale.
std::optional<double> path_crossing(const Eigen::Matrix3d& stress, double p0, const Friction& f, double kappa) {
  constexpr double kReach = 1e6;
  const auto g = [&](double x) { return max_cff(stress, p0, f, kappa, x); };
  const double g0 = g(0.0);
  if (g0 == 0.0) return 0.0;
  const double scale = std::max({stress.cwiseAbs().maxCoeff(), std::fabs(p0), f.cohesion / f.mu, 1.0});
  const double dir = g0 < 0.0 ? 1.0 : -1.0;
  const auto same_side = [&](double v) { return (v < 0.0) == (g0 < 0.0); };
  double inner = 0.0, outer = dir * 1e-3 * scale;
  while (same_side(g(outer))) {
    if (std::fabs(outer) > kReach * scale) return std::nullopt;
    inner = outer;
    outer *= 2.0;
  }
  // g(inner) on the state's side, g(outer) across: halve down to rounding of the stresses.
  while (std::fabs(outer - inner) > 1e-16 * scale) {
    const double mid = 0.5 * (inner + outer);
    if (mid == inner || mid == outer) break;
    (same_side(g(mid)) ? inner : outer) = mid;
  }
  return outer;
}

// Whether CFF rises with the pore pressure on every plane along the path, so that each plane
// has one crossing and the most critical plane at the path crossing holds the minimum Δp_crit
// also for an already critical state. Per plane the rate is μ(1 − κ sin²δ) ∓ |b| with
// |b| = κ sinδ cosδ (coulomb.hpp); its minimum over δ is μ(1 − κ/2) − (κ/2)√(1 + μ²).
bool cff_rises_everywhere(double mu, double kappa) {
  return mu * (1.0 - 0.5 * kappa) - 0.5 * kappa * std::sqrt(1.0 + mu * mu) >= 0.0;
}

// Δp_crit of one plane by the one-plane code (coulomb.hpp; the closed form when κ = 0).
DangerousOrientation evaluate(const Eigen::Matrix3d& stress, double p0, const Friction& f, double kappa,
                              const Eigen::Vector3d& normal) {
  const FaultPlane plane = FaultPlane::from_normal(normal);
  return {plane, critical_pressure_poroelastic(stress, p0, plane.normal(), f, kappa).dp};
}

// The grid search: a 2° grid, then four successively finer 41 × 41 windows (steps 0.2°, 0.02°,
// 0.002°, 0.0002°) around the best node.
DangerousOrientation grid_search(const StressBatch& state) {
  static const OrientationGrid coarse = make_orientation_grid(2 * kDeg, 2 * kDeg);
  std::vector<double> dp = tabulate_critical_pressure(coarse, state);
  const auto best = static_cast<std::size_t>(std::min_element(dp.begin(), dp.end()) - dp.begin());
  const std::size_t nd = coarse.dips.size();
  DangerousOrientation d{FaultPlane::from_strike_dip(coarse.strikes[best / nd], coarse.dips[best % nd]), dp[best]};
  double half = 4 * kDeg;
  for (int level = 0; level < 4; ++level) {
    d = search_window(state, d.plane.strike(), d.plane.dip(), half, 20);
    half /= 10.0;
  }
  return d;
}

void check_finite(const Eigen::Matrix3d& stress, double p0) {
  if (!stress.allFinite()) throw InputError("stress tensor", "a non-finite component", "finite stresses (Pa)");
  if (!std::isfinite(p0)) throw InputError("pore pressure", util::number_text(p0), "a finite pressure (Pa)");
}

}  // namespace

OrientationGrid make_orientation_grid(double strike_step, double dip_step) {
  check_step("strike step", strike_step);
  check_step("dip step", dip_step);
  OrientationGrid g;
  const auto ns = static_cast<std::size_t>(std::lround(2 * kPi / strike_step));
  const auto nd = static_cast<std::size_t>(std::lround(kPi / 2 / dip_step)) + 1;
  for (std::size_t i = 0; i < ns; ++i) g.strikes.push_back(2 * kPi * static_cast<double>(i) / static_cast<double>(ns));
  for (std::size_t j = 0; j < nd; ++j) g.dips.push_back(kPi / 2 * static_cast<double>(j) / static_cast<double>(nd - 1));
  g.planes.reserve(ns * nd);
  for (double s : g.strikes)
    for (double d : g.dips) g.planes.push_back(FaultPlane::from_strike_dip(s, d));
  return g;
}

std::vector<double> tabulate_critical_pressure(const OrientationGrid& grid, const StressBatch& states) {
  std::vector<double> out(grid.planes.size() * states.size());
  critical_pressure_grid(grid.planes, states, out);
  return out;
}

DangerousOrientation most_dangerous_orientation(const Eigen::Matrix3d& stress, double p0, const Friction& f,
                                                double kappa) {
  check_finite(stress, p0);
  StressBatch state;
  state.push_back(stress, p0, f, kappa);  // validates μ, c and κ
  if (kappa == 0.0) return evaluate(stress, p0, f, kappa, optimal_normal(stress, f.mu));
  const std::optional<double> x = path_crossing(stress, p0, f, kappa);
  if (!x) return grid_search(state);
  const DangerousOrientation exact =
      evaluate(stress, p0, f, kappa, optimal_normal(stress + poroelastic_stress_change(kappa, *x), f.mu));
  if (*x > 0.0 || cff_rises_everywhere(f.mu, kappa)) return exact;
  const DangerousOrientation searched = grid_search(state);
  return searched.dp_crit < exact.dp_crit ? searched : exact;
}

}  // namespace slipscreen::geomech
