// Rudnicki (1986) fluid point source; see rudnicki.hpp for the formulas, symbols and accuracy.
#include "core/poro/rudnicki.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::poro {
namespace {

void require(bool ok, const char* field, double v, const char* expected) {
  if (!ok) throw InputError(field, util::number_text(v), expected);
}

}  // namespace

RudnickiConstants rudnicki_constants(const PoroelasticMedium& m) {
  require(std::isfinite(m.shear_modulus) && m.shear_modulus > 0.0, "shear_modulus", m.shear_modulus,
          "a finite positive shear modulus (Pa, e.g. '10 GPa')");
  require(std::isfinite(m.poisson_drained) && m.poisson_drained > -1.0 && m.poisson_drained < 0.5, "poisson_ratio",
          m.poisson_drained, "a drained Poisson's ratio in (-1, 0.5)");
  require(std::isfinite(m.poisson_undrained) && m.poisson_undrained > m.poisson_drained && m.poisson_undrained < 0.5,
          "undrained_poisson_ratio", m.poisson_undrained,
          "an undrained Poisson's ratio above the drained one and below 0.5");
  require(std::isfinite(m.biot) && m.biot > 0.0 && m.biot <= 1.0, "biot", m.biot, "a Biot coefficient in (0, 1]");
  require(std::isfinite(m.permeability) && m.permeability > 0.0, "permeability", m.permeability,
          "a finite positive permeability (m², e.g. '10 mD')");
  require(std::isfinite(m.viscosity) && m.viscosity > 0.0, "viscosity", m.viscosity,
          "a finite positive viscosity (Pa·s, e.g. '0.5 cP')");
  const double nu = m.poisson_drained, nu_u = m.poisson_undrained, a = m.biot;
  RudnickiConstants k;
  k.mobility = m.permeability / m.viscosity;
  k.diffusivity = 2.0 * k.mobility * m.shear_modulus * (1.0 - nu) * (nu_u - nu) /
                  (a * a * (1.0 - 2.0 * nu) * (1.0 - 2.0 * nu) * (1.0 - nu_u));
  k.stress_coefficient = a * (1.0 - 2.0 * nu) / (2.0 * (1.0 - nu));
  require(std::isfinite(k.diffusivity) && k.diffusivity > 0.0, "permeability", m.permeability,
          "a medium whose diffusivity 2κG(1−ν)(ν_u−ν)/(α²(1−2ν)²(1−ν_u)) is finite and positive");
  return k;
}

double rudnicki_g_over_xi2(double xi) {
  if (!(xi > 0.0)) return 0.0;
  if (xi < 0.5) {
    // g = (2/√π) Σ_{n≥1} (−1)^(n+1) 2n x^(2n+1) / (n! (2n+1)), x = ξ/2 (the series of erf less
    // that of x e^(−x²)); divided by ξ² = 4x²: (1/(2√π)) Σ (−1)^(n+1) 2n x^(2n−1)/(n!(2n+1)).
    const double x = 0.5 * xi, x2 = x * x;
    double power = x;  // x^(2n−1)/n!, n = 1
    double sum = 0.0;
    for (int n = 1; n < 30; ++n) {
      const double term = 2.0 * n * power / (2.0 * n + 1.0);
      sum += (n % 2 == 1) ? term : -term;
      if (term < 1e-17 * std::fabs(sum)) break;
      power *= x2 / (n + 1);
    }
    return sum / (2.0 * std::sqrt(std::numbers::pi));
  }
  const double g = std::erf(0.5 * xi) - xi / std::sqrt(std::numbers::pi) * std::exp(-0.25 * xi * xi);
  return g / (xi * xi);
}

double point_source_pressure(const RudnickiConstants& k, double r, double t) {
  if (!(t > 0.0)) return 0.0;
  const double xi = std::isinf(t) ? 0.0 : r / std::sqrt(k.diffusivity * t);
  return std::erfc(0.5 * xi) / (4.0 * std::numbers::pi * k.mobility * r);
}

PointResponse point_source_response(const RudnickiConstants& k, const Eigen::Vector3d& x, double t) {
  PointResponse out;
  if (!(t > 0.0)) return out;
  const double r = x.norm();
  const double xi = std::isinf(t) ? 0.0 : r / std::sqrt(k.diffusivity * t);
  const double ec = std::erfc(0.5 * xi);
  const double h = rudnicki_g_over_xi2(xi);
  const double p_scale = 1.0 / (4.0 * std::numbers::pi * k.mobility * r);  // q/(4π κ r), q = 1
  out.dp = p_scale * ec;
  const Eigen::Vector3d n = x / r;
  const double s = k.stress_coefficient * p_scale;
  // n nᵀ evaluated on its own first, so that the tensor is symmetric to the last bit
  const Eigen::Matrix3d nn = n * n.transpose();
  out.dstress = (s * (ec + 6.0 * h)) * nn;
  out.dstress.diagonal().array() += s * (ec - 2.0 * h);
  return out;
}

}  // namespace slipscreen::poro
