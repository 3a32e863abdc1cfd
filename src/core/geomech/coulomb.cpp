#include "core/geomech/coulomb.hpp"

#include <string>

#include "core/errors.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/frictional_limit.hpp"

namespace slipscreen::geomech {

void check(const Friction& f) {
  check_friction(f.mu);
  if (!std::isfinite(f.cohesion) || f.cohesion < 0.0)
    throw InputError("cohesion", std::to_string(f.cohesion / 1e6) + " MPa", "a cohesion >= 0");
}

const char* to_string(CriticalStatus s) {
  switch (s) {
    case CriticalStatus::below_failure: return "below failure";
    case CriticalStatus::already_critical: return "already critical";
    case CriticalStatus::never: return "never";
  }
  return "?";
}

CriticalPressure critical_pressure(double tau, double sigma_n, double p0, const Friction& f) {
  check(f);
  const double dp = critical_pressure_closed_form(tau, sigma_n, p0, f.mu, f.cohesion);
  return {dp, status_of(dp)};
}

double stress_path_coefficient(const PoroelasticPath& path) {
  if (!std::isfinite(path.biot) || path.biot < 0.0 || path.biot > 1.0)
    throw InputError("Biot coefficient", std::to_string(path.biot), "a value in [0, 1]");
  if (!std::isfinite(path.poisson) || path.poisson < 0.0 || path.poisson >= 0.5)
    throw InputError("Poisson's ratio", std::to_string(path.poisson), "a value in [0, 0.5)");
  return path.biot * (1.0 - 2.0 * path.poisson) / (1.0 - path.poisson);  // Engelder & Fischer (1994)
}

Eigen::Matrix3d poroelastic_stress_change(double kappa, double dp) {
  Eigen::Matrix3d d = Eigen::Matrix3d::Zero();
  d(0, 0) = d(1, 1) = kappa * dp;  // Δσh = κ Δp, Δσv = 0
  return d;
}

double critical_pressure_path_root(double tau0, double ab, double bb, double g0, double g1) {
  const PathQuadratic q = path_quadratic(tau0, ab, bb, g0, g1);
  return path_root_select(tau0, bb, g0, g1, q, std::sqrt(bb), std::sqrt(std::fmax(q.disc, 0.0)));
}

CriticalPressure critical_pressure_poroelastic(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n_in,
                                               const Friction& f, double kappa) {
  check(f);
  if (!std::isfinite(kappa) || kappa < 0.0 || kappa > 1.0)
    throw InputError("stress-path coefficient", std::to_string(kappa), "a value in [0, 1]");
  const Eigen::Vector3d n = n_in.normalized();
  const Eigen::Vector3d t = stress * n;
  const double sn = n.dot(t);
  const Eigen::Vector3d a = t - sn * n;
  if (kappa == 0.0) {
    const double dp = critical_pressure_closed_form(a.norm(), sn, p0, f.mu, f.cohesion);
    return {dp, status_of(dp)};
  }
  const Eigen::Vector3d dt(kappa * n(0), kappa * n(1), 0.0);  // ΔS n per unit Δp
  const double beta_n = n.dot(dt);                              // κ sin²δ
  const Eigen::Vector3d b = dt - beta_n * n;
  const double g0 = f.mu * (sn - p0) + f.cohesion;
  const double g1 = f.mu * (beta_n - 1.0);
  const double dp = critical_pressure_path_root(a.norm(), a.dot(b), b.squaredNorm(), g0, g1);
  return {dp, status_of(dp)};
}

double opening_pressure(const AndersonianStress& s, double kappa) {
  const double vertical = s.sv - s.pore_pressure;  // Δσv = 0
  const double horizontal = kappa < 1.0 ? (s.shmin - s.pore_pressure) / (1.0 - kappa) : INFINITY;
  return std::fmin(vertical, horizontal);
}

double coulomb_failure_function_after(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n,
                                      const Friction& f, double kappa, double dp) {
  const Eigen::Matrix3d s = stress + poroelastic_stress_change(kappa, dp);
  const NormalShear r = resolve_normal(s, n);
  return coulomb_failure_function(r.shear_stress, r.normal_stress, p0 + dp, f.mu, f.cohesion);
}

}  // namespace slipscreen::geomech
