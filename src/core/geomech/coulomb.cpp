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
  constexpr double inf = std::numeric_limits<double>::infinity();
  const double cff0 = tau0 - g0;
  // For large Δp, CFF grows at |b| − g1 = |b| + μ (1 − κ sin²δ) per unit Δp. Below 1e-12 the
  // plane never reaches failure by raising the pressure (κ = 1 on a vertical plane, say).
  if (cff0 < 0.0 && std::sqrt(bb) - g1 <= 1e-12) return inf;
  // |a + b x|² = (g0 + g1 x)²  ⇔  A x² + 2 B x + C = 0
  const double A = bb - g1 * g1;
  const double B = ab - g0 * g1;
  const double C = cff0 * (tau0 + g0);  // = τ0² − g0², without cancellation
  double roots[2];
  int count = 0;
  const double scale = std::fabs(bb) + g1 * g1;
  if (std::fabs(A) <= 1e-14 * scale) {  // linear
    if (B != 0.0) roots[count++] = -C / (2.0 * B);
  } else {
    double disc = B * B - A * C;
    if (disc < 0.0 && disc > -1e-12 * B * B) disc = 0.0;
    if (disc >= 0.0) {
      const double q = -(B + std::copysign(std::sqrt(disc), B));
      if (q != 0.0) {
        roots[count++] = q / A;
        roots[count++] = C / q;
      } else {
        roots[count++] = 0.0;  // B = 0 and disc = 0 ⇒ C = 0
      }
    }
  }
  const bool rising = cff0 < 0.0;
  double best = rising ? inf : -inf;
  for (int i = 0; i < count; ++i) {
    const double x = roots[i];
    const double g = g0 + g1 * x;
    if (g < -1e-9 * (std::fabs(g0) + std::fabs(g1 * x))) continue;  // spurious: |a+bx| = −g
    if (rising ? (x > 0.0 && x < best) : (x <= 0.0 && x > best)) best = x;
  }
  return best;
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

double coulomb_failure_function_after(const Eigen::Matrix3d& stress, double p0, const Eigen::Vector3d& n,
                                      const Friction& f, double kappa, double dp) {
  const Eigen::Matrix3d s = stress + poroelastic_stress_change(kappa, dp);
  const NormalShear r = resolve_normal(s, n);
  return coulomb_failure_function(r.shear_stress, r.normal_stress, p0 + dp, f.mu, f.cohesion);
}

}  // namespace slipscreen::geomech
