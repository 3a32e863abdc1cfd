#include "core/geomech/fault_stress.hpp"

#include <cmath>
#include <limits>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/geomech/stress_state.hpp"

namespace slipscreen::geomech {

const char* to_string(SlipSense s) {
  switch (s) {
    case SlipSense::none: return "none (no shear)";
    case SlipSense::normal: return "normal";
    case SlipSense::reverse: return "reverse";
    case SlipSense::left_lateral: return "strike-slip (left-lateral)";
    case SlipSense::right_lateral: return "strike-slip (right-lateral)";
    case SlipSense::oblique_normal: return "oblique (normal)";
    case SlipSense::oblique_reverse: return "oblique (reverse)";
  }
  return "?";
}

SlipSense slip_sense_from_rake(double rake) {
  if (!std::isfinite(rake)) return SlipSense::none;
  const double deg = rake * 180.0 / std::numbers::pi;
  const double a = std::fabs(deg);
  if (a <= 22.5) return SlipSense::left_lateral;
  if (a >= 157.5) return SlipSense::right_lateral;
  if (a >= 67.5 && a <= 112.5) return deg > 0 ? SlipSense::reverse : SlipSense::normal;
  return deg > 0 ? SlipSense::oblique_reverse : SlipSense::oblique_normal;
}

NormalShear resolve_normal(const Eigen::Matrix3d& stress, const Eigen::Vector3d& n_in) {
  const Eigen::Vector3d n = n_in.normalized();
  const Eigen::Vector3d t = stress * n;           // Cauchy: t = S n
  const double sn = n.dot(t);                     // σn = nᵀ S n
  return {sn, (t - sn * n).norm()};               // τ = |t − σn n|
}

ResolvedStress resolve(const Eigen::Matrix3d& stress, double p, const FaultPlane& plane) {
  ResolvedStress r;
  const Eigen::Vector3d n = plane.normal();
  r.traction = stress * n;
  r.normal_stress = n.dot(r.traction);
  const Eigen::Vector3d shear_up = r.traction - r.normal_stress * n;
  r.shear_stress = shear_up.norm();
  r.effective_normal_stress = r.normal_stress - p;
  if (!(r.effective_normal_stress > 0.0))
    throw InputError("pore pressure", std::to_string(p / 1e6) + " MPa",
                     "a pressure below the normal stress on the plane (" + std::to_string(r.normal_stress / 1e6) + " MPa)");
  const double scale = stress.cwiseAbs().maxCoeff();
  if (r.shear_stress > 1e-12 * scale) {
    // Hanging wall moves along the shear part of S n_d, n_d = −n (see header): u = −shear_up.
    r.slip_direction = -shear_up / r.shear_stress;
    // Aki & Richards (1980): u = cosλ s − sinλ d ⇒ λ = atan2(−u·d, u·s).
    r.rake = std::atan2(-r.slip_direction.dot(plane.dip_vector()), r.slip_direction.dot(plane.strike_vector()));
    if (r.rake < -std::numbers::pi + 1e-12) r.rake = std::numbers::pi;  // pure right-lateral is +180°
  } else {
    r.slip_direction.setZero();
    r.rake = std::numeric_limits<double>::quiet_NaN();
  }
  r.sense = slip_sense_from_rake(r.rake);
  r.slip_tendency = slip_tendency(r.shear_stress, r.normal_stress, p);
  const auto principal = principal_stresses(stress);
  r.dilation_tendency = dilation_tendency(r.normal_stress, principal.values(0), principal.values(2));
  return r;
}

}  // namespace slipscreen::geomech
