#include "core/poro/rudnicki.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

#include "core/errors.hpp"
#include "support/poro_medium_fixture.hpp"
#include "support/python_reference.hpp"

using namespace slipscreen;
using namespace slipscreen::poro;

namespace {

PoroelasticMedium sandstone() { return test::sandstone_medium(); }

struct Reference {
  double p, a_delta, a_nn, err;
};

// tests/core/poro/rudnicki_reference.py under /usr/bin/python3: scipy quad of the
// instantaneous-source solution over time (nothing in closed form).
std::vector<Reference> scipy_reference(const RudnickiConstants& k, const std::vector<std::pair<double, double>>& rt) {
  std::vector<std::string> input;
  for (const auto& p : rt) {
    std::ostringstream line;
    line.precision(17);
    line << k.diffusivity << " " << k.mobility << " " << k.stress_coefficient << " " << p.first << " " << p.second;
    input.push_back(line.str());
  }
  std::vector<Reference> out;
  for (const std::string& line : test::python_reference("tests/core/poro/rudnicki_reference.py", input)) {
    Reference r{};
    std::istringstream ss(line);
    ss >> r.p >> r.a_delta >> r.a_nn >> r.err;
    if (ss) out.push_back(r);
  }
  REQUIRE(out.size() == rt.size());
  return out;
}

double max_abs(const Eigen::Matrix3d& m) { return m.cwiseAbs().maxCoeff(); }

}  // namespace

TEST_CASE("rudnicki: constants against the Biot-modulus route (Wang 2000, ch. 2 relations)") {
  const PoroelasticMedium m = sandstone();
  const RudnickiConstants k = rudnicki_constants(m);
  // S = 1/M + α²/(K + 4G/3), M = (K_u − K)/α², K = 2G(1+ν)/(3(1−2ν)), K_u the same with ν_u
  // (Wang 2000, Theory of Linear Poroelasticity, §2; a route that does not use the closed form).
  const double G = m.shear_modulus, a = m.biot;
  const double K = 2.0 * G * (1.0 + m.poisson_drained) / (3.0 * (1.0 - 2.0 * m.poisson_drained));
  const double Ku = 2.0 * G * (1.0 + m.poisson_undrained) / (3.0 * (1.0 - 2.0 * m.poisson_undrained));
  const double S = a * a / (Ku - K) + a * a / (K + 4.0 * G / 3.0);
  CHECK(std::fabs(k.mobility - 2e-11) <= 1e-26);
  CHECK(std::fabs(k.diffusivity - k.mobility / S) <= 1e-13 * k.diffusivity);
  CHECK(std::fabs(k.stress_coefficient - 0.8 * 0.6 / 1.6) <= 1e-15);
}

TEST_CASE("rudnicki: Δp and Δσ against scipy quad of the instantaneous source to 1e-10") {
  const RudnickiConstants k = rudnicki_constants(sandstone());
  // r from 10 m to 5 km, ξ = r/√(ct) from ~1e-4 (near steady) to ~60 (Δp underflows, stress
  // undrained)
  std::vector<std::pair<double, double>> rt;
  for (double r : {10.0, 300.0, 1000.0, 5000.0})
    for (double xi : {1e-4, 0.05, 0.7, 2.0, 5.0, 60.0}) rt.emplace_back(r, r * r / (xi * xi * k.diffusivity));
  const auto ref = scipy_reference(k, rt);
  const Eigen::Vector3d dir = Eigen::Vector3d(0.3, -0.5, 0.81).normalized();
  double worst = 0.0;
  for (std::size_t i = 0; i < rt.size(); ++i) {
    CAPTURE(rt[i].first);
    CAPTURE(rt[i].second);
    CHECK(ref[i].err <= 1e-12);  // the reference's own error estimate
    const PointResponse got = point_source_response(k, rt[i].first * dir, rt[i].second);
    const Eigen::Matrix3d want =
        ref[i].a_delta * Eigen::Matrix3d::Identity() + ref[i].a_nn * (dir * dir.transpose());
    const double scale = std::max(std::fabs(ref[i].a_delta), std::fabs(ref[i].a_nn));
    const double e_stress = max_abs(got.dstress - want) / scale;
    CHECK(e_stress <= 1e-10);
    const double e_p = std::fabs(got.dp - ref[i].p) / std::max(ref[i].p, 1e-300);
    if (ref[i].p > 1e-300) CHECK(e_p <= 1e-10);
    CHECK(std::fabs(point_source_pressure(k, rt[i].first, rt[i].second) - got.dp) <= 1e-15 * got.dp);
    worst = std::max({worst, e_stress, ref[i].p > 1e-300 ? e_p : 0.0});
  }
  MESSAGE("worst relative difference from scipy: " << worst);
}

TEST_CASE("rudnicki: steady state at t = inf and the approach to it") {
  const RudnickiConstants k = rudnicki_constants(sandstone());
  const Eigen::Vector3d x(400.0, -300.0, 1200.0);
  const double r = x.norm();
  const Eigen::Vector3d n = x / r;
  const double p_ss = 1.0 / (4.0 * std::numbers::pi * k.mobility * r);  // Rudnicki (1986), t → ∞
  const Eigen::Matrix3d s_ss =
      k.stress_coefficient * p_ss * (Eigen::Matrix3d::Identity() + n * n.transpose());
  const PointResponse inf = point_source_response(k, x, std::numeric_limits<double>::infinity());
  CHECK(std::fabs(inf.dp - p_ss) <= 1e-15 * p_ss);
  CHECK(max_abs(inf.dstress - s_ss) <= 1e-15 * max_abs(s_ss));
  // ξ = 1e-6: the leading corrections are erfc(ξ/2) − 1 ≈ −ξ/√π and g/ξ² ≈ ξ/(6√π) (series),
  // so the relative gap is below 1e-6
  const double t = r * r / (1e-12 * k.diffusivity);
  const PointResponse late = point_source_response(k, x, t);
  CHECK(std::fabs(late.dp - p_ss) <= 1e-6 * p_ss);
  CHECK(std::fabs(late.dp - p_ss) >= 1e-7 * p_ss);  // but not equal: the time is finite
  CHECK(max_abs(late.dstress - s_ss) <= 2e-6 * max_abs(s_ss));
}

TEST_CASE("rudnicki: early time is the undrained centre of dilatation of the injected fluid") {
  const PoroelasticMedium m = sandstone();
  const RudnickiConstants k = rudnicki_constants(m);
  // Outside the diffused zone p = 0 and the solid responds elastically to a centre of
  // dilatation of volume ΔV = q t (ν_u − ν)/(α(1 − 2ν)(1 − ν_u)) = q t B(1+ν_u)/(3(1−ν_u))
  // (Rudnicki 1986): Δσ_rr = 4GΔV/(4πr³), Δσ_θθ = Δσ_φφ = −2GΔV/(4πr³) (compression positive;
  // Love's centre of dilatation, e.g. Timoshenko & Goodier 1970, §136). Built from G and ν_u
  // directly, not from c or η.
  const double r = 3000.0, t = r * r / (40.0 * 40.0 * k.diffusivity);  // ξ = 40
  const double dV = t * (m.poisson_undrained - m.poisson_drained) /
                    (m.biot * (1.0 - 2.0 * m.poisson_drained) * (1.0 - m.poisson_undrained));
  const double s0 = m.shear_modulus * dV / (4.0 * std::numbers::pi * r * r * r);
  const Eigen::Vector3d n(0.0, 0.6, 0.8);
  const PointResponse got = point_source_response(k, r * n, t);
  CHECK(got.dp <= 1e-160);  // erfc(20) ≈ 5e-176 times q/(4πκr) ≈ 1.3e6 Pa: nothing
  const Eigen::Matrix3d want = -2.0 * s0 * Eigen::Matrix3d::Identity() + 6.0 * s0 * (n * n.transpose());
  // g(40) = 1 − 40/√π e^(−400): equal to rounding
  CHECK(max_abs(got.dstress - want) <= 1e-14 * 4.0 * s0);
  CHECK(std::fabs(got.dstress.trace()) <= 1e-14 * 4.0 * s0);
}

TEST_CASE("rudnicki: symmetric tensor, trace 4ηΔp, and equilibrium div Δσ = 0 by finite differences") {
  const RudnickiConstants k = rudnicki_constants(sandstone());
  const double t = 3.0e7;  // √(ct) ≈ 2.2 km: every point below is inside the diffused zone
  for (const Eigen::Vector3d& x : {Eigen::Vector3d(800.0, 200.0, 500.0), Eigen::Vector3d(-50.0, 30.0, -90.0),
                                  Eigen::Vector3d(4000.0, -3000.0, 1000.0)}) {
    CAPTURE(x.transpose());
    const PointResponse c = point_source_response(k, x, t);
    CHECK(max_abs(c.dstress - c.dstress.transpose()) == 0.0);
    CHECK(std::fabs(c.dstress.trace() - 4.0 * k.stress_coefficient * c.dp) <= 1e-13 * max_abs(c.dstress));
    // Σ_j ∂σ_ij/∂x_j by central differences, step h = 1e-3 r: truncation ~ (h/r)² |σ|/r
    const double h = 1e-3 * x.norm();
    Eigen::Vector3d div = Eigen::Vector3d::Zero();
    for (int j = 0; j < 3; ++j) {
      Eigen::Vector3d e = Eigen::Vector3d::Zero();
      e[j] = h;
      const Eigen::Matrix3d d =
          (point_source_response(k, x + e, t).dstress - point_source_response(k, x - e, t).dstress) / (2.0 * h);
      div += d.col(j);
    }
    const double scale = max_abs(c.dstress) / x.norm();
    CHECK(div.norm() <= 1e-5 * scale);
    // the check can fail: the gradient of the trace alone is of order |σ|/r
    Eigen::Vector3d grad_trace;
    for (int j = 0; j < 3; ++j) {
      Eigen::Vector3d e = Eigen::Vector3d::Zero();
      e[j] = h;
      grad_trace[j] = (point_source_response(k, x + e, t).dstress.trace() -
                       point_source_response(k, x - e, t).dstress.trace()) / (2.0 * h);
    }
    CHECK(grad_trace.norm() >= 0.1 * scale);
  }
}

TEST_CASE("rudnicki: before the rate starts nothing changes; g/ξ² series meets the closed form") {
  const RudnickiConstants k = rudnicki_constants(sandstone());
  CHECK(point_source_pressure(k, 100.0, 0.0) == 0.0);
  CHECK(point_source_response(k, Eigen::Vector3d(100.0, 0.0, 0.0), -5.0).dstress.isZero(0.0));
  // both branches at the switch ξ = 0.5 agree (the closed form loses at most 1/ξ² = 4 ulps there)
  const double below = rudnicki_g_over_xi2(std::nextafter(0.5, 0.0));
  const double at = rudnicki_g_over_xi2(0.5);
  CHECK(std::fabs(below - at) <= 1e-14 * at);
  // leading term ξ/(6√π) at small ξ (the series' first term)
  CHECK(std::fabs(rudnicki_g_over_xi2(1e-8) - 1e-8 / (6.0 * std::sqrt(std::numbers::pi))) <= 1e-15 * 1e-8);
  CHECK(rudnicki_g_over_xi2(0.0) == 0.0);
}

TEST_CASE("rudnicki: invalid media are named") {
  auto field_of = [](PoroelasticMedium m) {
    try {
      rudnicki_constants(m);
    } catch (const InputError& e) {
      return e.field();
    }
    return std::string("none");
  };
  PoroelasticMedium m = sandstone();
  m.shear_modulus = 0.0;
  CHECK(field_of(m) == "shear_modulus");
  m = sandstone();
  m.poisson_undrained = m.poisson_drained;
  CHECK(field_of(m) == "undrained_poisson_ratio");
  m = sandstone();
  m.poisson_drained = 0.5;
  CHECK(field_of(m) == "poisson_ratio");
  m = sandstone();
  m.biot = 1.2;
  CHECK(field_of(m) == "biot");
  m = sandstone();
  m.permeability = std::nan("");
  CHECK(field_of(m) == "permeability");
  m = sandstone();
  m.viscosity = -1.0;
  CHECK(field_of(m) == "viscosity");
  CHECK(field_of(sandstone()) == "none");
}
