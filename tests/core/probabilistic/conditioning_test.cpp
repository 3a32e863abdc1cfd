#include "core/probabilistic/conditioning.hpp"

#include <doctest/doctest.h>
#include <omp.h>

#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <limits>
#include <numbers>
#include <random>

#include "core/errors.hpp"
#include "core/probabilistic/slip_probability.hpp"
#include "core/stats/wilson_interval.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDay = 86400.0;
constexpr double kDeg = std::numbers::pi / 180.0;

// Fictional case: the three-segment layout (strike_slip_case.hpp) with uncertain permeability
// (lognormal, median 2e-14 m², σ_ln 0.8) and friction (uniform 0.5 to 0.7); 1,024 Latin
// hypercube realizations, all valid (gradients stress, no rejection).
struct CondCase {
  UncertainModel model = test::strike_slip_model();
  std::vector<WellInput> wells;
  std::vector<SegmentInput> segments;
  RunSettings settings;
  explicit CondCase(std::uint64_t n = 1024) {
    model.permeability = Distribution::lognormal(2e-14, 0.8);
    model.friction = Distribution::uniform(0.5, 0.7);
    test::three_segment_layout(wells, segments, settings);
    settings.realizations = n;
    settings.seed = 7;
    settings.method = stats::SamplingMethod::latin_hypercube;
  }
};

// Δp by direct Theis superposition with Boost.Math's E1 (a general-purpose library) for the
// layout's well (0.05 m³/s from t = 0, shut in at 6 years) at distance r, time t, permeability k;
// h, φ, c_t, μ of strike_slip_case.hpp.
double theis_dp(double r, double t, double k) {
  const double h = 50.0, phi = 0.12, ct = 1.5e-9, mu = 4e-4;
  const double d = k / (mu * phi * ct), pre = mu / (4 * std::numbers::pi * k * h);
  double sum = 0.0;
  const double times[] = {0.0, 6 * 365 * kDay}, rates[] = {0.05, -0.05};
  for (int j = 0; j < 2; ++j)
    if (times[j] < t) sum += rates[j] * boost::math::expint(1, r * r / (4 * d * (t - times[j])));
  return pre * sum;
}

// Synthetic observations from permeability k_true: two monitoring points, yearly for 8 years,
// exact (noise-free) values with σ = 0.05 MPa.
std::vector<PressureObservation> synthetic(double k_true, double sigma) {
  std::vector<PressureObservation> obs;
  for (const auto& [x, y] : {std::pair{2000.0, 500.0}, std::pair{-800.0, 3000.0}})
    for (int year = 1; year <= 8; ++year) {
      const double t = year * 360 * kDay;
      obs.push_back({x, y, t, theis_dp(std::hypot(x, y), t, k_true), sigma});
    }
  return obs;
}

}  // namespace

TEST_CASE("importance weights: normalised in log space, Kish n_eff, fixed point exact") {
  SUBCASE("equal log-likelihoods give equal weights and n_eff = n exactly") {
    const std::vector<double> ll(1000, -1234.5);
    const auto w = importance_weights(ll);
    for (auto u : w.units) CHECK(u == w.units[0]);
    CHECK(w.n_eff == 1000.0);
    // Σ units within half a unit per weight of 2^52.
    CHECK(std::abs(static_cast<double>(w.total) - static_cast<double>(kWeightUnits)) <= 500.0);
  }
  SUBCASE("log-sum-exp: ℓ = −1000 and −1001 (exp underflows in linear space)") {
    const std::vector<double> ll{-1000.0, -1001.0};
    const auto w = importance_weights(ll);
    // w_0 = 1/(1 + e^−1) = 0.7310585786300049 (closed form; value by scipy.special.expit(1)).
    CHECK(w.weight(0) == doctest::Approx(0.7310585786300049).epsilon(1e-15));
    // n_eff = 1/(w0² + w1²) (Kish 1965) = 1.6502 for these weights (closed form).
    const double w0 = 0.7310585786300049, w1 = 1 - w0;
    CHECK(w.n_eff == doctest::Approx(1.0 / (w0 * w0 + w1 * w1)).epsilon(1e-12));
  }
  SUBCASE("−∞ carries no weight; no finite value is refused") {
    const double inf = std::numeric_limits<double>::infinity();
    const auto w = importance_weights(std::vector<double>{-inf, -3.0, -inf});
    CHECK(w.units[0] == 0);
    CHECK(w.units[2] == 0);
    CHECK(w.n_eff == 1.0);
    CHECK_THROWS_AS(importance_weights(std::vector<double>{-inf, -inf}), NumericalError);
    CHECK_THROWS_AS(importance_weights(std::vector<double>{0.0, std::nan("")}), NumericalError);
  }
}

TEST_CASE("gaussian_log_likelihood: −½ Σ z²") {
  const std::vector<double> obs{1.0e6, 2.0e6}, mod{1.1e6, 1.7e6}, sig{0.1e6, 0.2e6};
  // z = −1 and 1.5: −½ (1 + 2.25) = −1.625 (hand computation).
  CHECK(gaussian_log_likelihood(obs, mod, sig) == doctest::Approx(-1.625).epsilon(1e-14));
  CHECK_THROWS_AS(gaussian_log_likelihood(obs, mod, std::vector<double>{0.1e6, 0.0}), InputError);
}

TEST_CASE("modelled Δp at observations agrees with direct Theis superposition (Boost.Math E1)") {
  CondCase c(4);
  c.model.permeability = Distribution::fixed(2e-14);
  c.settings.observations = synthetic(2e-14, 0.05e6);  // observed = the direct Theis sum
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(res.conditioning);
  const auto& m = res.conditioning->modelled;
  REQUIRE(m.rows() == static_cast<Eigen::Index>(c.settings.observations.size()));
  REQUIRE(m.cols() == 4);
  // Tolerance: the fast path's accuracy against the plain method, 1e-5 of Δp where Δp > 1 kPa
  // (docs/uncertainty.md), plus 1 Pa.
  for (std::size_t o = 0; o < c.settings.observations.size(); ++o) {
    const double ref = c.settings.observations[o].observed;
    REQUIRE(ref > 1e3);
    for (Eigen::Index col = 0; col < m.cols(); ++col)
      CHECK(std::abs(m(static_cast<Eigen::Index>(o), col) - ref) <= 1e-5 * ref + 1.0);
  }
  // Every realization alike: equal weights.
  CHECK(res.conditioning->weights.n_eff == 4.0);
}

TEST_CASE("observations with a huge σ leave every probability and percentile equal to the prior run's") {
  CondCase prior(512);
  const auto a = run_probabilistic(prior.model, prior.wells, prior.segments, prior.settings);
  CondCase cond(512);
  cond.settings.observations = synthetic(5e-14, 1e30);  // far from the median, but σ = 1e30 Pa
  const auto b = run_probabilistic(cond.model, cond.wells, cond.segments, cond.settings);
  REQUIRE(b.conditioning);
  const auto& w = b.conditioning->weights;
  CHECK(w.n_eff == static_cast<double>(b.realizations));
  const double z = stats::kZ95;
  for (std::size_t s = 0; s < a.segments.size(); ++s) {
    const auto& x = a.segments[s];
    const auto& y = b.segments[s].conditioned;
    for (std::size_t t = 0; t < x.slipped_by.size(); ++t) {
      const auto ci0 = stats::wilson_interval(x.slipped_by[t], a.realizations, z);
      const auto ci1 = weighted_proportion(y.slipped_by[t], w, z);
      CHECK(ci1.estimate == ci0.estimate);  // exact: integer sums below 2^53
      CHECK(ci1.lower == doctest::Approx(ci0.lower).epsilon(1e-12));
      CHECK(ci1.upper == doctest::Approx(ci0.upper).epsilon(1e-12));
      for (double q : {0.05, 0.5, 0.95}) CHECK(y.dp[t].quantile(q) == x.dp[t].quantile(q));  // same rank rule
    }
    for (double q : {0.05, 0.5, 0.95}) CHECK(y.dp_crit.quantile(q) == x.dp_crit.quantile(q));
  }
  // The inputs' posterior percentiles equal the prior's.
  const auto& cd = *b.conditioning;
  for (std::size_t j = 0; j < cd.input_prior.size(); ++j) {
    CHECK(cd.input_posterior[j].p05 == cd.input_prior[j].p05);
    CHECK(cd.input_posterior[j].p50 == cd.input_prior[j].p50);
    CHECK(cd.input_posterior[j].p95 == cd.input_prior[j].p95);
  }
  // And the unweighted results of the conditioned run are the prior run's.
  for (std::size_t s = 0; s < a.segments.size(); ++s) CHECK(a.segments[s].slipped_by == b.segments[s].slipped_by);
}

TEST_CASE("synthetic observations from a known permeability: the truth inside the posterior P5–P95, narrower") {
  const double k_true = 3.1e-14;  // within the prior (median 2e-14, σ_ln 0.8: prior P5–P95 0.54e-14 to 7.4e-14)
  const double mu_true = 0.62;
  CondCase c(2048);
  c.settings.observations = synthetic(k_true, 0.05e6);
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(res.conditioning);
  const auto& cd = *res.conditioning;
  const InputList list = make_inputs(c.model, c.wells, 3);
  const auto& kp = cd.input_prior[list.k];
  const auto& kq = cd.input_posterior[list.k];
  CHECK(kq.p05 <= k_true);
  CHECK(k_true <= kq.p95);
  CHECK((kq.p95 - kq.p05) < 0.5 * (kp.p95 - kp.p05));  // the pressures pin the permeability down
  // Friction does not enter the pressures: its posterior keeps the truth inside P5–P95.
  const auto& fq = cd.input_posterior[list.friction];
  CHECK(fq.p05 <= mu_true);
  CHECK(mu_true <= fq.p95);
  CHECK(cd.weights.n_eff > 20.0);
}

TEST_CASE("weighted P(slip) agrees with brute-force rejection sampling within the intervals") {
  CondCase c(2048);
  c.settings.observations = synthetic(3.1e-14, 0.1e6);
  for (std::uint64_t i = 0; i < 2048; ++i) c.settings.audit_realizations.push_back(i);
  c.settings.audit_segments = {0, 1};
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(res.rejected == 0);  // column i is realization i
  const auto& w = res.conditioning->weights;
  // Accept realization i with probability exp(ℓ_i − max ℓ) (an independent fictional stream).
  std::mt19937_64 rng(20261203);
  std::uniform_real_distribution<double> u01(0.0, 1.0);
  std::vector<char> accept(2048);
  for (std::size_t i = 0; i < accept.size(); ++i)
    accept[i] = u01(rng) < std::exp(w.log_likelihood[i] - w.max_log_likelihood);
  const std::size_t K = c.settings.output_index.size();
  const double z = stats::kZ95;
  bool compared = false;
  for (std::size_t s : {0u, 1u}) {
    std::uint64_t n_acc = 0, slipped = 0;
    for (const auto& a : res.audit)
      if (a.segment == s && accept[a.realization]) {
        ++n_acc;
        slipped += a.first_crossing >= 0 && a.first_crossing <= static_cast<int>(c.settings.output_index[K - 1]) &&
                   a.dp_crit > 0.0;
      }
    REQUIRE(n_acc > 30);
    const auto rej = stats::wilson_interval(slipped, n_acc, z);
    const auto wt = weighted_proportion(res.segments[s].conditioned.slipped_by[K - 1], w, z);
    CAPTURE(s);
    CAPTURE(rej.estimate);
    CAPTURE(wt.estimate);
    // The two estimates agree within the sum of their half-widths.
    CHECK(std::abs(rej.estimate - wt.estimate) <=
          0.5 * (rej.upper - rej.lower) + 0.5 * (wt.upper - wt.lower));
    compared |= wt.estimate > 0.02 && wt.estimate < 0.98;
  }
  CHECK(compared);  // at least one segment with a probability away from 0 and 1
}

TEST_CASE("a conditioned run is identical for 1 and 2 threads") {
  CondCase c(600);
  c.settings.observations = synthetic(3.1e-14, 0.05e6);
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  const auto a = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(2);
  const auto b = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(before);
  CHECK(a.conditioning->weights.units == b.conditioning->weights.units);
  CHECK(a.conditioning->weights.n_eff == b.conditioning->weights.n_eff);
  for (std::size_t s = 0; s < a.segments.size(); ++s) CHECK(a.segments[s].conditioned == b.segments[s].conditioned);
}
