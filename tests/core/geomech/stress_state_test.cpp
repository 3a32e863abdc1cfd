#include "core/geomech/stress_state.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>
#include <random>

#include "check_near.hpp"
#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;

Eigen::Matrix3d random_rotation(std::mt19937_64& rng) {
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::Quaterniond q(g(rng), g(rng), g(rng), g(rng));
  return q.normalized().toRotationMatrix();
}
}  // namespace

TEST_CASE("tensor in North-East-Down axes") {
  AndersonianStress s{60e6, 70e6, 40e6, 0.0, 30e6};
  // Zoback (2007): SHmax along north for θ = 0.
  Eigen::Matrix3d t = stress_tensor_ned(s);
  CHECK_NEAR(t(0, 0), 70e6, 1e-6);
  CHECK_NEAR(t(1, 1), 40e6, 1e-6);
  CHECK_NEAR(t(2, 2), 60e6, 1e-6);
  CHECK_NEAR(t(0, 1), 0.0, 1e-6);
  s.shmax_azimuth = 90 * kDeg;  // SHmax east
  t = stress_tensor_ned(s);
  CHECK_NEAR(t(0, 0), 40e6, 1e-6);
  CHECK_NEAR(t(1, 1), 70e6, 1e-6);
  // θ = 30°: Sxx = SHmax cos²θ + Shmin sin²θ = 70·0.75 + 40·0.25 = 62.5 MPa; Sxy = (SHmax − Shmin) sinθ cosθ
  // = 30·(√3/4) MPa (arithmetic).
  s.shmax_azimuth = 30 * kDeg;
  t = stress_tensor_ned(s);
  CHECK_NEAR(t(0, 0), 62.5e6, 1e-6);
  CHECK_NEAR(t(0, 1), 30e6 * std::sqrt(3.0) / 4.0, 1e-6);
  CHECK_NEAR(t(0, 1), t(1, 0), 0.0);
  const auto p = principal_stresses(t);
  CHECK_NEAR(p.values(0), 70e6, 1e-6);
  CHECK_NEAR(p.values(1), 60e6, 1e-6);
  CHECK_NEAR(p.values(2), 40e6, 1e-6);
  const auto o1 = axis_orientation(p.directions.col(0));
  const double trend = std::fmod(o1.trend, std::numbers::pi);  // an axis: 30° or 210°
  CHECK_NEAR(trend, 30 * kDeg, 1e-12);
  CHECK_NEAR(o1.plunge, 0.0, 1e-12);
  CHECK_NEAR(axis_orientation(p.directions.col(1)).plunge, 90 * kDeg, 1e-7);
}

TEST_CASE("invariants are unchanged by rotations; principal values reproduce the tensor") {
  std::mt19937_64 rng(20261201);
  std::uniform_real_distribution<double> mag(10e6, 90e6);
  for (int k = 0; k < 200; ++k) {
    Eigen::Matrix3d t = Eigen::Vector3d(mag(rng), mag(rng), mag(rng)).asDiagonal();
    const StressInvariants base = invariants(t);
    // Jaeger, Cook & Zimmerman (2007): J2 = [(S1−S2)² + (S2−S3)² + (S3−S1)²]/6 in principal axes.
    const double a = t(0, 0), b = t(1, 1), c = t(2, 2);
    CHECK_NEAR(base.j2, ((a - b) * (a - b) + (b - c) * (b - c) + (c - a) * (c - a)) / 6.0, 1e-12 * base.j2);  // Pa²
    CHECK_NEAR(base.mean, (a + b + c) / 3.0, 1e-7);
    CHECK_NEAR(base.q, std::sqrt(3.0 * base.j2), 1e-7);
    const Eigen::Matrix3d r = random_rotation(rng);
    const Eigen::Matrix3d rotated = r * t * r.transpose();
    const StressInvariants inv = invariants(rotated);
    CHECK_NEAR(inv.i1, base.i1, 1e-6);             // Pa; rounding ~1e-16 × 3e8
    CHECK_NEAR(inv.j2, base.j2, 1e-9 * base.j2 + 1.0);  // Pa²
    const auto p = principal_stresses(rotated);
    CHECK(p.values(0) >= p.values(1));
    CHECK(p.values(1) >= p.values(2));
    const Eigen::Matrix3d back = p.directions * p.values.asDiagonal() * p.directions.transpose();
    CHECK_NEAR((back - rotated).cwiseAbs().maxCoeff(), 0.0, 1e-6);  // Pa
    CHECK_NEAR((p.directions.transpose() * p.directions - Eigen::Matrix3d::Identity()).cwiseAbs().maxCoeff(), 0.0, 1e-12);
  }
}

TEST_CASE("Andersonian regimes") {
  // Anderson (1951).
  CHECK(classify_regime(AndersonianStress{60e6, 50e6, 40e6, 0, 20e6}) == FaultingRegime::normal);
  CHECK(classify_regime(AndersonianStress{50e6, 60e6, 40e6, 0, 20e6}) == FaultingRegime::strike_slip);
  CHECK(classify_regime(AndersonianStress{40e6, 60e6, 50e6, 0, 20e6}) == FaultingRegime::reverse);
  // The tensor version agrees, and finds the vertical axis.
  for (const auto& s : {AndersonianStress{60e6, 50e6, 40e6, 0.3, 20e6}, AndersonianStress{50e6, 60e6, 40e6, 1.2, 20e6},
                        AndersonianStress{40e6, 60e6, 50e6, 2.0, 20e6}}) {
    const auto r = classify_regime(stress_tensor_ned(s));
    CHECK(r.regime == classify_regime(s));
    CHECK_NEAR(r.vertical_axis_plunge, 90 * kDeg, 1e-7);
  }
  CHECK(std::string(to_string(FaultingRegime::strike_slip)) == "strike-slip");
}

TEST_CASE("bad stress states name the field") {
  CHECK_THROWS_WITH_AS(check(AndersonianStress{60e6, 40e6, 50e6, 0, 20e6}), doctest::Contains("field 'Shmin'"), InputError);
  CHECK_THROWS_WITH_AS(check(AndersonianStress{60e6, 40e6, 15e6, 0, 20e6}), doctest::Contains("above the pore pressure"), InputError);
  CHECK_THROWS_WITH_AS(check(AndersonianStress{10e6, 40e6, 30e6, 0, 20e6}), doctest::Contains("field 'Sv'"), InputError);
  CHECK_THROWS_WITH_AS(check(AndersonianStress{60e6, 50e6, 40e6, 0, -1.0}), doctest::Contains("field 'pore pressure'"), InputError);
  CHECK_NOTHROW(check(AndersonianStress{60e6, 50e6, 40e6, 0, 20e6}));
}
