#include "core/geomech/fault_plane.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geomech {
namespace {
constexpr double kPi = std::numbers::pi;
constexpr double kRadToDeg = 180.0 / kPi;
}  // namespace

double wrap_azimuth(double a) {
  double w = std::fmod(a, 2.0 * kPi);
  if (w < 0.0) w += 2.0 * kPi;
  if (w >= 2.0 * kPi) w = 0.0;  // fmod rounding of a tiny negative angle
  return w;
}

FaultPlane FaultPlane::from_strike_dip(double strike, double dip) {
  if (!std::isfinite(strike)) throw InputError("strike", std::to_string(strike), "a finite azimuth");
  constexpr double tol = 1e-12;
  if (!std::isfinite(dip) || dip < -tol || dip > kPi / 2 + tol)
    throw InputError("dip", std::to_string(dip * kRadToDeg) + " deg", "a dip in [0, 90] deg");
  return FaultPlane(wrap_azimuth(strike), std::fmin(std::fmax(dip, 0.0), kPi / 2));
}

FaultPlane FaultPlane::from_dip_direction(double dip_direction, double dip) {
  if (!std::isfinite(dip_direction))
    throw InputError("dip direction", std::to_string(dip_direction), "a finite azimuth");
  return from_strike_dip(dip_direction - kPi / 2, dip);  // right-hand rule
}

FaultPlane FaultPlane::from_normal(const Eigen::Vector3d& n_in) {
  const double len = n_in.norm();
  if (!(len > 0.0) || !std::isfinite(len)) throw InputError("normal", "zero or non-finite vector", "a non-zero normal");
  Eigen::Vector3d n = n_in / len;
  if (n(2) > 0.0) n = -n;  // upward normal
  const double dip = std::atan2(std::hypot(n(0), n(1)), -n(2));
  // n = (−sinδ sinφs, sinδ cosφs, ·) ⇒ φs = atan2(−n_N, n_E); arbitrary (0) for a horizontal plane
  const double strike = std::hypot(n(0), n(1)) > 0.0 ? std::atan2(-n(0), n(1)) : 0.0;
  return from_strike_dip(strike, dip);
}

double FaultPlane::dip_direction() const { return wrap_azimuth(strike_ + kPi / 2); }

Eigen::Vector3d FaultPlane::normal() const {
  return {-std::sin(dip_) * std::sin(strike_), std::sin(dip_) * std::cos(strike_), -std::cos(dip_)};
}

Eigen::Vector3d FaultPlane::strike_vector() const { return {std::cos(strike_), std::sin(strike_), 0.0}; }

Eigen::Vector3d FaultPlane::dip_vector() const {
  return {-std::cos(dip_) * std::sin(strike_), std::cos(dip_) * std::cos(strike_), std::sin(dip_)};
}

}  // namespace slipscreen::geomech
