#include "core/geomech/a_phi.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/geomech/frictional_limit.hpp"

namespace slipscreen::geomech {
namespace {
std::string pa(double v) { return std::to_string(v / 1e6) + " MPa"; }
}  // namespace

void check_a_phi(double a) {
  if (!std::isfinite(a) || a < 0.0 || a > 3.0)
    throw InputError("A_phi", std::to_string(a), "a value in [0, 3] (0-1 normal, 1-2 strike-slip, 2-3 reverse faulting)");
}

double a_phi(double sv, double shmax, double shmin) {
  if (!std::isfinite(sv) || !std::isfinite(shmax) || !std::isfinite(shmin))
    throw InputError("stress", "non-finite", "finite stresses");
  if (shmin > shmax) throw InputError("Shmin", pa(shmin), "Shmin <= SHmax (" + pa(shmax) + ")");
  const double s1 = std::max(sv, shmax);
  const double s3 = std::min(sv, shmin);
  if (!(s1 > s3)) throw InputError("stress", "S1 = S3 = " + pa(s1), "an anisotropic stress (S1 > S3); A_phi is undefined otherwise");
  int n;
  double s2;
  if (sv >= shmax) { n = 0; s2 = shmax; }       // Sv = S1: normal
  else if (shmin >= sv) { n = 2; s2 = shmin; }  // Sv = S3: reverse
  else { n = 1; s2 = sv; }                      // Sv = S2: strike-slip
  const double phi = (s2 - s3) / (s1 - s3);     // Simpson (1997) eq. for φ
  const double sign = n == 1 ? -1.0 : 1.0;
  return (n + 0.5) + sign * (phi - 0.5);        // Simpson (1997): A_φ = (n+0.5) + (−1)^n (φ−0.5)
}

FaultingRegime regime_of_a_phi(double a) {
  check_a_phi(a);
  if (a <= 1.0) return FaultingRegime::normal;
  if (a < 2.0) return FaultingRegime::strike_slip;
  return FaultingRegime::reverse;
}

HorizontalStresses horizontal_stresses_from_a_phi(double a, double sv, double p0, double mu) {
  check_a_phi(a);
  const double q = frictional_limit_ratio(mu);  // checks μ
  if (!std::isfinite(p0) || p0 < 0.0) throw InputError("pore pressure", pa(p0), "a pore pressure >= 0");
  if (!std::isfinite(sv) || !(sv > p0))
    throw InputError("Sv", pa(sv), "a vertical stress above the pore pressure (" + pa(p0) + ")");
  const double sv_eff = sv - p0;
  switch (regime_of_a_phi(a)) {
    case FaultingRegime::normal: {  // φ = A_φ; S1 = Sv
      const double phi = a;
      const double s3 = p0 + sv_eff / q;
      return {s3 + phi * (sv - s3), s3};
    }
    case FaultingRegime::strike_slip: {  // φ = 2 − A_φ; S2 = Sv
      const double phi = 2.0 - a;
      const double s3_eff = sv_eff / (1.0 + phi * (q - 1.0));
      return {p0 + q * s3_eff, p0 + s3_eff};
    }
    case FaultingRegime::reverse: {  // φ = A_φ − 2; S3 = Sv
      const double phi = a - 2.0;
      const double s1 = p0 + q * sv_eff;
      return {s1, sv + phi * (s1 - sv)};
    }
  }
  throw NumericalError("A_phi: unreachable regime");
}

}  // namespace slipscreen::geomech
