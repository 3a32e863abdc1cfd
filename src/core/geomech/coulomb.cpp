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

namespace {

void check_kappa(double kappa) {
  if (!std::isfinite(kappa) || kappa < 0.0 || kappa > 1.0)
    throw InputError("stress-path coefficient", std::to_string(kappa), "a value in [0, 1]");
}

// The plane's terms on the path: σn, the shear traction a at Δp = 0, its change b per unit Δp
// and κ sin²δ (the normal stress change per unit Δp).
struct PathTerms {
  double sn, beta_n;
  Eigen::Vector3d a, b;
};

PathTerms path_terms(const Eigen::Matrix3d& stress, const Eigen::Vector3d& n_in, double kappa) {
  const Eigen::Vector3d n = n_in.normalized();
  const Eigen::Vector3d t = stress * n;
  PathTerms p;
  p.sn = n.dot(t);
  p.a = t - p.sn * n;
  const Eigen::Vector3d dt(kappa * n(0), kappa * n(1), 0.0);  // ΔS n per unit Δp
  p.beta_n = n.dot(dt);                                         // κ sin²δ
  p.b = dt - p.beta_n * n;
  return p;
}

}  // namespace

CriticalPressure critical_pressure_poroelastic(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n_in,
                                               const Friction& f, double kappa) {
  check(f);
  check_kappa(kappa);
  const PathTerms p = path_terms(stress, n_in, kappa);
  if (kappa == 0.0) {
    const double dp = critical_pressure_closed_form(p.a.norm(), p.sn, p0, f.mu, f.cohesion);
    return {dp, status_of(dp)};
  }
  const double g0 = f.mu * (p.sn - p0) + f.cohesion;
  const double g1 = f.mu * (p.beta_n - 1.0);
  const double dp = critical_pressure_path_root(p.a.norm(), p.a.dot(p.b), p.b.squaredNorm(), g0, g1);
  return {dp, status_of(dp)};
}

CoulombPathChange coulomb_path_change(const Eigen::Matrix3d& stress, const Eigen::Vector3d& n, double mu, double kappa) {
  check_friction(mu);
  check_kappa(kappa);
  const PathTerms p = path_terms(stress, n, kappa);
  return {p.a.norm(), p.a.dot(p.b), p.b.squaredNorm(), mu * (1.0 - p.beta_n)};
}

double CoulombPathChange::at(double dp) const {
  const double num = (2.0 * ab + bb * dp) * dp;  // |a + bΔp|² − |a|²
  const double den = std::sqrt(std::fmax(tau0 * tau0 + num, 0.0)) + tau0;
  return (den > 0.0 ? num / den : 0.0) + normal_rate * dp;
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
