#include "core/geomech/stress_state.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geomech {
namespace {

std::string pa(double v) { return std::to_string(v / 1e6) + " MPa"; }

void check_stress(const char* field, double v, double p) {
  if (!std::isfinite(v)) throw InputError(field, pa(v), "a finite stress");
  if (!(v > p))
    throw InputError(field, pa(v), "a stress above the pore pressure (" + pa(p) + "); Coulomb screening needs compressive effective stress");
}

}  // namespace

void check(const AndersonianStress& s) {
  if (!std::isfinite(s.pore_pressure) || s.pore_pressure < 0.0)
    throw InputError("pore pressure", pa(s.pore_pressure), "a pore pressure >= 0");
  if (!std::isfinite(s.shmax_azimuth))
    throw InputError("SHmax azimuth", std::to_string(s.shmax_azimuth) + " rad", "a finite angle");
  check_stress("Sv", s.sv, s.pore_pressure);
  check_stress("SHmax", s.shmax, s.pore_pressure);
  check_stress("Shmin", s.shmin, s.pore_pressure);
  if (s.shmin > s.shmax)
    throw InputError("Shmin", pa(s.shmin), "Shmin <= SHmax (" + pa(s.shmax) + ")");
}

Eigen::Matrix3d stress_tensor_ned(const AndersonianStress& s) {
  // Zoback (2007) ch. 1: S = SHmax h1h1ᵀ + Shmin h2h2ᵀ + Sv e3e3ᵀ, written out element by
  // element so the tensor is exactly symmetric.
  const double c = std::cos(s.shmax_azimuth), sn = std::sin(s.shmax_azimuth);
  Eigen::Matrix3d t = Eigen::Matrix3d::Zero();
  t(0, 0) = s.shmax * c * c + s.shmin * sn * sn;
  t(1, 1) = s.shmax * sn * sn + s.shmin * c * c;
  t(0, 1) = t(1, 0) = (s.shmax - s.shmin) * sn * c;
  t(2, 2) = s.sv;
  return t;
}

const char* to_string(FaultingRegime r) {
  switch (r) {
    case FaultingRegime::normal: return "normal";
    case FaultingRegime::strike_slip: return "strike-slip";
    case FaultingRegime::reverse: return "reverse";
  }
  return "?";
}

FaultingRegime classify_regime(const AndersonianStress& s) {
  if (s.sv >= s.shmax) return FaultingRegime::normal;     // Anderson (1951): Sv = S1
  if (s.shmin >= s.sv) return FaultingRegime::reverse;    // Sv = S3
  return FaultingRegime::strike_slip;                     // Sv = S2
}

PrincipalStresses principal_stresses(const Eigen::Matrix3d& tensor) {
  const Eigen::SelfAdjointEigenSolver<Eigen::Matrix3d> solver(tensor);
  if (solver.info() != Eigen::Success) throw NumericalError("principal stresses: eigen-decomposition failed");
  PrincipalStresses p;
  for (int i = 0; i < 3; ++i) {  // Eigen sorts ascending; S1 is the largest
    p.values(i) = solver.eigenvalues()(2 - i);
    Eigen::Vector3d v = solver.eigenvectors().col(2 - i).normalized();
    if (v(2) < 0.0 || (v(2) == 0.0 && (v(0) < 0.0 || (v(0) == 0.0 && v(1) < 0.0)))) v = -v;
    p.directions.col(i) = v;
  }
  return p;
}

AxisOrientation axis_orientation(const Eigen::Vector3d& axis) {
  Eigen::Vector3d v = axis.normalized();
  if (v(2) < 0.0) v = -v;
  double trend = std::atan2(v(1), v(0));
  if (trend < 0.0) trend += 2.0 * std::numbers::pi;
  return {trend, std::asin(std::fmin(1.0, v(2)))};
}

StressInvariants invariants(const Eigen::Matrix3d& tensor) {
  // Jaeger, Cook & Zimmerman (2007) ch. 2.
  const double i1 = tensor.trace();
  const Eigen::Matrix3d dev = tensor - (i1 / 3.0) * Eigen::Matrix3d::Identity();
  const double j2 = 0.5 * (dev.array() * dev.array()).sum();
  return {i1, j2, i1 / 3.0, std::sqrt(3.0 * j2)};
}

RegimeOfTensor classify_regime(const Eigen::Matrix3d& tensor) {
  const auto p = principal_stresses(tensor);
  int vertical = 0;
  for (int i = 1; i < 3; ++i)
    if (std::fabs(p.directions(2, i)) > std::fabs(p.directions(2, vertical))) vertical = i;
  const FaultingRegime r = vertical == 0 ? FaultingRegime::normal
                           : vertical == 1 ? FaultingRegime::strike_slip
                                           : FaultingRegime::reverse;
  return {r, axis_orientation(p.directions.col(vertical)).plunge};
}

}  // namespace slipscreen::geomech
