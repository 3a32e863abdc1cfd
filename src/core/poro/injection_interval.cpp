// Wells of the 3-D poroelastic model; see injection_interval.hpp.
#include "core/poro/injection_interval.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::poro {
namespace {

// The offset from source to point, its length clamped to the well radius.
Eigen::Vector3d clamped_offset(const Eigen::Vector3d& x, const Eigen::Vector3d& source, double radius) {
  Eigen::Vector3d d = x - source;
  const double r = d.norm();
  if (r >= radius) return d;
  if (r == 0.0) return Eigen::Vector3d(0.0, 0.0, radius);
  return d * (radius / r);
}

}  // namespace

void gauss_legendre(int n, std::vector<double>& nodes, std::vector<double>& weights) {
  if (n < 1) throw InputError("quadrature points", std::to_string(n), "at least 1");
  nodes.assign(static_cast<std::size_t>(n), 0.0);
  weights.assign(static_cast<std::size_t>(n), 0.0);
  for (int i = 0; i < (n + 1) / 2; ++i) {
    // Initial guess (Abramowitz & Stegun 1964, 22.16.6) and Newton on P_n.
    double z = std::cos(std::numbers::pi * (i + 0.75) / (n + 0.5));
    double dp = 1.0;
    for (int it = 0; it < 100; ++it) {
      double p0 = 1.0, p1 = z;
      for (int j = 2; j <= n; ++j) {
        const double p2 = ((2.0 * j - 1.0) * z * p1 - (j - 1.0) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      if (n == 1) p0 = 1.0;
      // P_n = p1, P_{n−1} = p0; P_n' = n (z P_n − P_{n−1})/(z² − 1)
      dp = n * (z * p1 - p0) / (z * z - 1.0);
      const double step = p1 / dp;
      z -= step;
      if (std::fabs(step) < 1e-16) break;
    }
    if (n == 1) {
      z = 0.0;
      dp = 1.0;
    }
    const double w = 2.0 / ((1.0 - z * z) * dp * dp);
    nodes[static_cast<std::size_t>(i)] = -z;
    nodes[static_cast<std::size_t>(n - 1 - i)] = z;
    weights[static_cast<std::size_t>(i)] = w;
    weights[static_cast<std::size_t>(n - 1 - i)] = w;
  }
  if (n % 2 == 1) nodes[static_cast<std::size_t>(n / 2)] = 0.0;
}

std::vector<SourcePoint> open_interval_points(double x, double y, double top, double bottom, int n) {
  if (!(std::isfinite(top) && std::isfinite(bottom) && top >= 0.0 && bottom >= top))
    throw InputError("open interval", util::number_text(top) + " to " + util::number_text(bottom),
                     "finite depths with 0 <= top <= bottom (m)");
  std::vector<double> nodes, weights;
  gauss_legendre(n, nodes, weights);
  std::vector<SourcePoint> out;
  const double mid = 0.5 * (top + bottom), half = 0.5 * (bottom - top);
  for (std::size_t i = 0; i < nodes.size(); ++i)
    out.push_back({Eigen::Vector3d(x, y, mid + half * nodes[i]), 0.5 * weights[i]});
  return out;
}

PointResponse superposed_response(const RudnickiConstants& k, std::span<const InjectionSource> wells,
                                  const Eigen::Vector3d& x, double t, std::span<const double> factors) {
  PointResponse sum;
  for (std::size_t w = 0; w < wells.size(); ++w) {
    const double f = factors.empty() ? 1.0 : factors[w];
    for (const SourcePoint& s : wells[w].points) {
      const Eigen::Vector3d d = clamped_offset(x, s.position, wells[w].radius);
      for (const hydro::RateChange& c : wells[w].changes) {
        if (!(c.time < t)) break;
        const PointResponse r = point_source_response(k, d, t - c.time);
        const double scale = f * s.weight * c.delta;
        sum.dp += scale * r.dp;
        sum.dstress += scale * r.dstress;
      }
    }
  }
  return sum;
}

double superposed_pressure(const RudnickiConstants& k, std::span<const InjectionSource> wells, const Eigen::Vector3d& x,
                           double t, std::span<const double> factors) {
  double sum = 0.0;
  for (std::size_t w = 0; w < wells.size(); ++w) {
    const double f = factors.empty() ? 1.0 : factors[w];
    for (const SourcePoint& s : wells[w].points) {
      const double r = clamped_offset(x, s.position, wells[w].radius).norm();
      for (const hydro::RateChange& c : wells[w].changes) {
        if (!(c.time < t)) break;
        sum += f * s.weight * c.delta * point_source_pressure(k, r, t - c.time);
      }
    }
  }
  return sum;
}

}  // namespace slipscreen::poro
