#include "core/geomech/fault_stress.hpp"

#include <doctest/doctest.h>

#include <numbers>
#include <random>

#include "check_near.hpp"
#include "core/errors.hpp"
#include "core/geomech/stress_state.hpp"

using namespace slipscreen;
using namespace slipscreen::geomech;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;
}

TEST_CASE("2D limit: plane-stress formulas for a plane containing S2") {
  // Jaeger, Cook & Zimmerman (2007) ch. 2: with θ the angle between the plane's normal and σ1,
  // σn = (σ1+σ3)/2 + (σ1−σ3)/2 cos2θ and |τ| = (σ1−σ3)/2 |sin2θ|.
  // Reverse regime: σ1 = SHmax along north, σ2 = Shmin east, σ3 = Sv. Planes striking east
  // contain σ2; their normal (−sinδ, 0, −cosδ) makes θ = 90° − δ with north.
  const AndersonianStress s{40e6, 80e6, 55e6, 0.0, 20e6};
  const Eigen::Matrix3d t = stress_tensor_ned(s);
  const double s1 = 80e6, s3 = 40e6;
  for (double dip = 0; dip <= 90; dip += 2.5) {
    const auto r = resolve(t, s.pore_pressure, FaultPlane::from_strike_dip(90 * kDeg, dip * kDeg));
    const double theta = (90 - dip) * kDeg;
    CHECK_NEAR(r.normal_stress, 0.5 * (s1 + s3) + 0.5 * (s1 - s3) * std::cos(2 * theta), 1e-5);
    CHECK_NEAR(r.shear_stress, 0.5 * (s1 - s3) * std::fabs(std::sin(2 * theta)), 1e-5);
    CHECK_NEAR(r.effective_normal_stress, r.normal_stress - 20e6, 1e-7);
    // Morris et al. (1996): Ts = τ/(σn − p); Ferrill et al. (1999): Td = (σ1 − σn)/(σ1 − σ3).
    CHECK_NEAR(r.slip_tendency, r.shear_stress / (r.normal_stress - 20e6), 1e-15);
    CHECK_NEAR(r.dilation_tendency, (s1 - r.normal_stress) / (s1 - s3), 1e-12);
  }
  // Plane normal to σ1: no shear, Td = 0; plane normal to σ3: Td = 1.
  const auto n1 = resolve(t, 20e6, FaultPlane::from_strike_dip(90 * kDeg, 90 * kDeg));
  CHECK_NEAR(n1.shear_stress, 0.0, 1e-5);
  CHECK(n1.sense == SlipSense::none);
  CHECK_NEAR(n1.dilation_tendency, 0.0, 1e-12);
  const auto n3 = resolve(t, 20e6, FaultPlane::from_strike_dip(0.0, 0.0));
  CHECK_NEAR(n3.dilation_tendency, 1.0, 1e-12);
}

TEST_CASE("slip direction, rake and slip sense in the three regimes") {
  // Anderson (1951) and Aki & Richards (1980) rake convention: normal −90°, reverse +90°,
  // left-lateral 0°, right-lateral 180°.
  const Eigen::Matrix3d normal_regime = stress_tensor_ned({70e6, 50e6, 40e6, 0.0, 30e6});
  auto r = resolve(normal_regime, 30e6, FaultPlane::from_strike_dip(0.0, 60 * kDeg));  // strikes along SHmax
  CHECK_NEAR(r.rake, -90 * kDeg, 1e-12);
  CHECK(r.sense == SlipSense::normal);
  CHECK(r.slip_direction(2) > 0.0);  // hanging wall moves down
  const Eigen::Matrix3d reverse_regime = stress_tensor_ned({40e6, 80e6, 55e6, 0.0, 20e6});
  r = resolve(reverse_regime, 20e6, FaultPlane::from_strike_dip(90 * kDeg, 30 * kDeg));
  CHECK_NEAR(r.rake, 90 * kDeg, 1e-12);
  CHECK(r.sense == SlipSense::reverse);
  CHECK(r.slip_direction(2) < 0.0);  // hanging wall moves up
  // Strike-slip, σ1 north: the N30E plane is left-lateral, the N30W plane right-lateral
  // (conjugate shears; the acute angle bisector is σ1; common practice).
  const Eigen::Matrix3d ss = stress_tensor_ned({50e6, 70e6, 35e6, 0.0, 20e6});
  r = resolve(ss, 20e6, FaultPlane::from_strike_dip(30 * kDeg, 90 * kDeg));
  CHECK_NEAR(std::fabs(r.rake), 0.0, 1e-12);
  CHECK(r.sense == SlipSense::left_lateral);
  r = resolve(ss, 20e6, FaultPlane::from_strike_dip(330 * kDeg, 90 * kDeg));
  CHECK_NEAR(r.rake, 180 * kDeg, 1e-12);
  CHECK(r.sense == SlipSense::right_lateral);
  // An oblique plane: strike 45° from SHmax in the normal regime.
  r = resolve(normal_regime, 30e6, FaultPlane::from_strike_dip(45 * kDeg, 60 * kDeg));
  CHECK(r.rake < 0.0);
  CHECK((r.sense == SlipSense::oblique_normal || r.sense == SlipSense::normal));
  // The slip direction lies in the plane, along the shear traction.
  CHECK_NEAR(r.slip_direction.dot(FaultPlane::from_strike_dip(45 * kDeg, 60 * kDeg).normal()), 0.0, 1e-12);
}

TEST_CASE("rake bands") {
  CHECK(slip_sense_from_rake(10 * kDeg) == SlipSense::left_lateral);
  CHECK(slip_sense_from_rake(-22 * kDeg) == SlipSense::left_lateral);
  CHECK(slip_sense_from_rake(40 * kDeg) == SlipSense::oblique_reverse);
  CHECK(slip_sense_from_rake(70 * kDeg) == SlipSense::reverse);
  CHECK(slip_sense_from_rake(130 * kDeg) == SlipSense::oblique_reverse);
  CHECK(slip_sense_from_rake(170 * kDeg) == SlipSense::right_lateral);
  CHECK(slip_sense_from_rake(-170 * kDeg) == SlipSense::right_lateral);
  CHECK(slip_sense_from_rake(-100 * kDeg) == SlipSense::normal);
  CHECK(slip_sense_from_rake(-50 * kDeg) == SlipSense::oblique_normal);
  CHECK(slip_sense_from_rake(std::nan("")) == SlipSense::none);
}

TEST_CASE("a plane and its opposite normal give identical results") {
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (int k = 0; k < 100; ++k) {
    Eigen::Matrix3d a = Eigen::Matrix3d::NullaryExpr([&](Eigen::Index, Eigen::Index) { return u(rng) * 10e6; });
    const Eigen::Matrix3d t = 0.5 * (a + a.transpose()) + 60e6 * Eigen::Matrix3d::Identity();
    const auto p = FaultPlane::from_strike_dip(u(rng) * 360 * kDeg, u(rng) * 89.9 * kDeg);
    const auto q = FaultPlane::from_normal(-p.normal());
    const auto x = resolve_normal(t, p.normal());
    const auto y = resolve_normal(t, -p.normal());
    CHECK_NEAR(x.normal_stress, y.normal_stress, 1e-7);
    CHECK_NEAR(x.shear_stress, y.shear_stress, 1e-7);
    const auto rp = resolve(t, 20e6, p);
    const auto rq = resolve(t, 20e6, q);
    CHECK_NEAR(rp.normal_stress, rq.normal_stress, 1e-6);
    CHECK_NEAR(rp.shear_stress, rq.shear_stress, 1e-6);
    CHECK_NEAR(rp.rake, rq.rake, 1e-9);
    CHECK_NEAR(rp.slip_tendency, rq.slip_tendency, 1e-12);
    CHECK_NEAR(rp.dilation_tendency, rq.dilation_tendency, 1e-9);
    CHECK_NEAR(x.normal_stress, rp.normal_stress, 1e-7);
  }
}

TEST_CASE("a plane in effective tension is refused") {
  const Eigen::Matrix3d t = stress_tensor_ned({60e6, 50e6, 40e6, 0.0, 20e6});
  CHECK_THROWS_WITH_AS(resolve(t, 45e6, FaultPlane::from_strike_dip(0.0, 90 * kDeg)),
                       doctest::Contains("field 'pore pressure'"), InputError);
}
