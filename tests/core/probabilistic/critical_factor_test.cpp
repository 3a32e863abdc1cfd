#include "core/probabilistic/critical_factor.hpp"

#include <doctest/doctest.h>

#include <boost/math/special_functions/expint.hpp>
#include <algorithm>
#include <cmath>
#include <limits>
#include <random>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kMonth = 30.4375 * 86400.0;

// Δp of one well (rate q from t_on to t_off, then shut in) at distance r, by Theis (1935)
// superposition with Boost.Math's E1 (general-purpose reference library). D = 0.5 m²/s and
// μ/(4πkh) = 2e5 Pa per m³/s (invented).
double theis(double q, double r, double t_on, double t_off, double t) {
  const auto e1 = [&](double dt) { return dt > 0 ? boost::math::expint(1, r * r / (4 * 0.5 * dt)) : 0.0; };
  return 2e5 * q * (e1(t - t_on) - e1(t - t_off));
}

// Whether the full model Δp_rest + f·Δp_G reaches Δp_crit at some tracking time.
bool slips(const std::vector<double>& rest, const std::vector<double>& group, double crit, double f) {
  for (std::size_t k = 0; k < rest.size(); ++k)
    if (rest[k] + f * group[k] >= crit) return true;
  return false;
}

// The crossing factor by bisection on the full model (independent of the closed form): 0 if it
// slips at f = 0, +∞ if not at f = 1e12, else bisected to adjacent doubles.
double bisect(const std::vector<double>& rest, const std::vector<double>& group, double crit) {
  if (slips(rest, group, crit, 0.0)) return 0.0;
  double lo = 0.0, hi = 1.0;
  while (!slips(rest, group, crit, hi)) {
    hi *= 2;
    if (hi > 1e12) return kInf;
  }
  while (std::nextafter(lo, hi) < hi) {
    const double mid = 0.5 * (lo + hi);
    if (mid <= lo || mid >= hi) break;
    (slips(rest, group, crit, mid) ? hi : lo) = mid;
  }
  return hi;
}
}  // namespace

TEST_CASE("f_crit equals a bisection on the full model, on random Theis cases with shut-ins") {
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> U(0.0, 1.0);
  int finite = 0, zero = 0, never = 0;
  for (int c = 0; c < 300; ++c) {
    // Two wells outside the group, one in it (which may start late); 48 monthly tracking times.
    const double r1 = 300 + 5000 * U(rng), r2 = 300 + 5000 * U(rng), rg = 300 + 5000 * U(rng);
    const double on1 = 24 * kMonth * U(rng), off1 = on1 + 30 * kMonth * U(rng);
    const double on2 = 24 * kMonth * U(rng), off2 = on2 + 30 * kMonth * U(rng);
    const double ong = 40 * kMonth * U(rng), offg = ong + 20 * kMonth * U(rng);
    std::vector<double> rest, group;
    for (int k = 1; k <= 48; ++k) {
      const double t = k * kMonth;
      rest.push_back(theis(0.02, r1, on1, off1, t) + theis(0.01, r2, on2, off2, t));
      group.push_back(theis(0.03, rg, ong, offg, t));
    }
    const double peak = *std::max_element(rest.begin(), rest.end()) + *std::max_element(group.begin(), group.end());
    const double crit = c % 50 == 0 ? kInf : (0.05 + 2.0 * U(rng)) * std::max(peak, 1e3);
    const double f = critical_factor(rest, group, crit);
    const double ref = bisect(rest, group, crit);
    CAPTURE(c);
    CAPTURE(crit);
    if (std::isinf(ref)) {
      CHECK(std::isinf(f));
      ++never;
    } else if (ref == 0.0) {
      CHECK(f == 0.0);
      ++zero;
    } else {
      CHECK(std::abs(f - ref) <= 1e-9 * ref);
      ++finite;
    }
  }
  MESSAGE("finite " << finite << ", zero " << zero << ", never " << never);
  CHECK(finite >= 50);  // the cases exercise every branch
  CHECK(zero >= 5);
  CHECK(never >= 5);
}

TEST_CASE("f_crit: the ends of the domain") {
  using V = std::vector<double>;
  const V rest{0.0, 1.0, 2.0}, group{0.0, 1.0, 0.5};
  CHECK(critical_factor(rest, group, 2.0) == 0.0);        // the rest alone reaches it at t_2
  CHECK(critical_factor(rest, group, 3.0) == 2.0);        // min((3−1)/1, (3−2)/0.5) = 2
  CHECK(critical_factor(rest, group, kInf) == kInf);      // never critical
  CHECK(critical_factor(rest, V{0.0, 0.0, 0.0}, 3.0) == kInf);  // the group adds nothing
  CHECK(critical_factor(rest, V{0.0, -1.0, 0.5}, 2.5) == 1.0);  // a negative group Δp never helps at f > 0
  CHECK(critical_factor(V{}, V{}, 1.0) == kInf);
  CHECK_THROWS_AS(critical_factor(rest, V{1.0}, 1.0), InputError);
  CHECK_THROWS_AS(critical_factor(rest, group, std::nan("")), InputError);
  CHECK_THROWS_AS(critical_factor(V{std::nan("")}, V{1.0}, 1.0), InputError);
}
