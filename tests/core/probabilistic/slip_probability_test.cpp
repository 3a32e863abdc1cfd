#include "core/probabilistic/slip_probability.hpp"

#include <doctest/doctest.h>
#include <omp.h>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <numbers>
#include <optional>

#include "core/errors.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "core/stats/sampler.hpp"
#include "core/stats/wilson_interval.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDay = 86400.0;
constexpr double kDeg = std::numbers::pi / 180.0;

// Fictional test case: one well injecting 0.05 m³/s for 6 years, then shut in; three fault
// segments at 1.5, 4 and 12 km; strike-slip stress from gradients at 3 km.
struct Case {
  UncertainModel model;
  std::vector<WellInput> wells;
  std::vector<SegmentInput> segments;
  RunSettings settings;
  Case() {
    model = test::strike_slip_model();
    model.friction = Distribution::fixed(0.6);
    test::three_segment_layout(wells, segments, settings);
    settings.realizations = 1;
    settings.method = stats::SamplingMethod::monte_carlo;
  }
  // Reference Δp by direct Theis superposition with Boost.Math's E1 (general-purpose library).
  double dp(const SegmentInput& s, double t) const {
    const double k = 2e-14, h = 50.0, phi = 0.12, ct = 1.5e-9, mu = 4e-4;
    const double d = k / (mu * phi * ct), pre = mu / (4 * std::numbers::pi * k * h);
    double best = 0.0;
    for (const auto& p : s.check_points) {
      const double r2 = p.x * p.x + p.y * p.y;
      double sum = 0.0;
      for (std::size_t j = 0; j < wells[0].steps.time.size(); ++j)
        if (wells[0].steps.time[j] < t)
          sum += wells[0].steps.delta_rate[j] * boost::math::expint(1, r2 / (4 * d * (t - wells[0].steps.time[j])));
      best = std::max(best, pre * sum);
    }
    return best;
  }
  Eigen::Matrix3d tensor() const {
    geomech::AndersonianStress st{75e6, 90e6, 51e6, 45 * kDeg, 30e6};
    return geomech::stress_tensor_ned(st);
  }
};
}  // namespace

TEST_CASE("all inputs fixed: the probabilistic screen reproduces the deterministic one (P is 0 or 1)") {
  Case c;
  c.settings.realizations = 8;
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  CHECK(res.realizations == 8);
  CHECK(res.rejected == 0);
  for (std::size_t s = 0; s < c.segments.size(); ++s) {
    const auto plane = geomech::FaultPlane::from_strike_dip(c.segments[s].strike, c.segments[s].dip);
    const auto rs = geomech::resolve(c.tensor(), 30e6, plane);
    const double crit = rs.effective_normal_stress - rs.shear_stress / 0.6;  // Δp_crit, c = 0
    REQUIRE(crit > 0.0);
    // Deterministic first tracking time at which Δp ≥ Δp_crit.
    int first = -1;
    for (std::size_t k = 0; k < c.settings.tracking_times.size() && first < 0; ++k)
      if (c.dp(c.segments[s], c.settings.tracking_times[k]) >= crit) first = static_cast<int>(k);
    for (std::size_t o = 0; o < c.settings.output_index.size(); ++o) {
      const bool slipped = first >= 0 && static_cast<int>(c.settings.output_index[o]) >= first;
      CAPTURE(s);
      CAPTURE(o);
      CHECK(res.segments[s].slipped_by[o] == (slipped ? 8u : 0u));
    }
    CHECK(res.segments[s].dp_crit.quantile(0.5) == doctest::Approx(crit).epsilon(0.011));  // sketch α = 0.01
  }
  // The case is built so that the nearest segment slips and the farthest does not.
  CHECK(res.segments[0].slipped_by.back() == 8);
  // The first date on the tracking grid is the deterministic first crossing (every realization
  // alike), not the first output time after it.
  for (std::size_t s = 0; s < c.segments.size(); ++s) {
    const auto first = first_tracking_index_reaching(res.segments[s], res.realizations, 0.5);
    const auto by = slipped_by_tracking(res.segments[s]);
    REQUIRE(by.size() == c.settings.tracking_times.size());
    if (res.segments[s].slipped_by.back() == 0) {
      CHECK_FALSE(first.has_value());
      continue;
    }
    REQUIRE(first.has_value());
    CHECK(res.segments[s].first_slip[*first] == 8);
    CHECK(by[*first] == 8);
    if (*first > 0) CHECK(by[*first - 1] == 0);
  }
  REQUIRE(first_tracking_index_reaching(res.segments[0], res.realizations, 0.5).has_value());
  // The nearest segment crosses between output times (not at one), so the two dates differ.
  CHECK(*first_tracking_index_reaching(res.segments[0], res.realizations, 0.5) < c.settings.output_index[0]);
  CHECK(res.segments[2].slipped_by.back() == 0);
}

TEST_CASE("friction ~ normal: P(slip) matches the closed form within its Wilson interval") {
  // Only μ is uncertain. With c = 0, slip by t  <=>  Δp_max(t) ≥ σn' − τ/μ  <=>  μ ≤ τ/(σn' − Δp_max),
  // so P = Φ((τ/(σn' − Δp) − m)/sd) (exact reasoning; injection is monotone until t, so the
  // running maximum is Δp(t) at the middle segment's output time before shut-in).
  Case c;
  const double m = 0.6, sd = 0.08;
  c.model.friction = Distribution::normal(m, sd);
  c.settings.realizations = 4000;
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  const auto& seg = c.segments[1];
  const auto rs = geomech::resolve(c.tensor(), 30e6, geomech::FaultPlane::from_strike_dip(seg.strike, seg.dip));
  const boost::math::normal_distribution<double> phi(0.0, 1.0);
  int checked = 0;
  for (std::size_t o = 0; o < 3; ++o) {
    const double dp = c.dp(seg, c.settings.tracking_times[c.settings.output_index[o]]);
    const double mu_needed = rs.shear_stress / (rs.effective_normal_stress - dp);
    const double p_exact = boost::math::cdf(phi, (mu_needed - m) / sd);
    const auto ci = stats::wilson_interval(res.segments[1].slipped_by[o] + res.segments[1].already_critical,
                                           res.realizations);
    CAPTURE(o);
    CAPTURE(p_exact);
    CHECK(ci.lower <= p_exact);
    CHECK(p_exact <= ci.upper);
    checked += p_exact > 0.02 && p_exact < 0.98;
  }
  CHECK(checked >= 1);  // the case exercises a probability strictly between 0 and 1
}

TEST_CASE("same seed gives identical results with 1 and 2 threads; P never decreases with time") {
  Case c;
  c.model.friction = Distribution::normal(0.6, 0.1);
  c.model.permeability = Distribution::lognormal(2e-14, 0.7);
  c.model.shmax_azimuth = Distribution::normal(45 * kDeg, 10 * kDeg);
  c.model.strike_perturbation = Distribution::normal(0.0, 5 * kDeg);
  c.settings.realizations = 600;
  c.settings.method = stats::SamplingMethod::latin_hypercube;
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  const auto one = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(2);
  const auto two = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(before);
  REQUIRE(one.segments.size() == two.segments.size());
  for (std::size_t s = 0; s < one.segments.size(); ++s) {
    CHECK(one.segments[s].slipped_by == two.segments[s].slipped_by);
    CHECK(one.segments[s].first_slip == two.segments[s].first_slip);
    // The histogram's running sum at each output time is the output time's slip count.
    const auto by = slipped_by_tracking(one.segments[s]);
    for (std::size_t o = 0; o < c.settings.output_index.size(); ++o)
      CHECK(by[c.settings.output_index[o]] == one.segments[s].slipped_by[o]);
    CHECK(one.segments[s].already_critical == two.segments[s].already_critical);
    CHECK(one.segments[s].dp_crit == two.segments[s].dp_crit);
    CHECK(one.segments[s].dp == two.segments[s].dp);
    REQUIRE(one.segments[s].sensitivity.size() == two.segments[s].sensitivity.size());
    for (std::size_t j = 0; j < one.segments[s].sensitivity.size(); ++j) {
      const double a = one.segments[s].sensitivity[j], b = two.segments[s].sensitivity[j];
      CHECK(((std::isnan(a) && std::isnan(b)) || a == b));  // NaN: a fixed input has no ranking
    }
    for (std::size_t o = 1; o < one.segments[s].slipped_by.size(); ++o)
      CHECK(one.segments[s].slipped_by[o] >= one.segments[s].slipped_by[o - 1]);
  }
  // Friction drives the margin of a near-optimal fault: ρ(friction, margin) > 0 (a larger μ
  // raises Δp_crit). Exact reasoning: Δp_crit = σn' − τ/μ increases with μ.
  const auto names = sampled_input_names(c.model, c.wells, 3);
  const auto it = std::find(names.begin(), names.end(), "friction");
  REQUIRE(it != names.end());
  CHECK(one.segments[1].sensitivity[static_cast<std::size_t>(it - names.begin())] > 0.3);
}

TEST_CASE("first date reaching a threshold equals a brute-force scan of every realization's first crossing") {
  Case c;
  c.model.friction = Distribution::normal(0.6, 0.1);
  c.model.permeability = Distribution::lognormal(2e-14, 0.7);
  c.settings.realizations = 300;
  for (std::uint64_t i = 0; i < 300; ++i) c.settings.audit_realizations.push_back(i);
  c.settings.audit_segments = {0, 1, 2};
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  const std::size_t n_t = c.settings.tracking_times.size();
  int found = 0;
  for (std::size_t s = 0; s < c.segments.size(); ++s)
    for (double th : {0.01, 0.05, 0.1, 0.3, 0.5}) {
      // Brute force: count, at every tracking time, the audited realizations (all of them) with
      // 0 < Δp_crit < ∞ whose first crossing is at or before it.
      std::optional<std::size_t> expected;
      for (std::size_t k = 0; k < n_t && !expected; ++k) {
        std::uint64_t slipped = 0;
        for (const auto& a : res.audit)
          if (a.segment == s && a.dp_crit > 0.0 && std::isfinite(a.dp_crit) && a.first_crossing >= 0 &&
              static_cast<std::size_t>(a.first_crossing) <= k)
            ++slipped;
        if (static_cast<double>(slipped) / static_cast<double>(res.realizations) >= th) expected = k;
      }
      CAPTURE(s);
      CAPTURE(th);
      CHECK(first_tracking_index_reaching(res.segments[s], res.realizations, th) == expected);
      found += expected.has_value();
    }
  CHECK(found >= 3);  // the case exercises crossings
}

TEST_CASE("bad input is rejected with the field named") {
  Case c;
  c.settings.realizations = 0;
  CHECK_THROWS_WITH_AS(run_probabilistic(c.model, c.wells, c.segments, c.settings),
                       doctest::Contains("realizations"), InputError);
  Case d;
  d.settings.realizations = 10;
  d.segments.clear();
  CHECK_THROWS_AS(run_probabilistic(d.model, d.wells, d.segments, d.settings), InputError);
  Case e;
  e.settings.realizations = 10;
  e.model.shmin_gradient = Distribution::fixed(35e3);  // Shmin > SHmax in every realization
  CHECK_THROWS_WITH_AS(run_probabilistic(e.model, e.wells, e.segments, e.settings),
                       doctest::Contains("physical stress state"), InputError);
}

TEST_CASE("extreme rates end in a typed error on the calling thread, with 1 or 2 threads") {
  // 1e70 bbl/d (1.84e65 m³/s; 1 bbl = 0.158987294928 m³, common practice). Before, the
  // similarity tables overflowed to inf, a NaN reached a quantile sketch inside the OpenMP
  // region of track_slip and the run ended in "internal error".
  const int threads = omp_get_max_threads();
  for (int n : {1, 2}) {
    omp_set_num_threads(n);
    Case c;
    c.settings.realizations = 16;
    c.wells[0].steps.delta_rate = {1.84e65, -1.84e65};
    CHECK_THROWS_WITH_AS(run_probabilistic(c.model, c.wells, c.segments, c.settings),
                         doctest::Contains("single-precision range"), NumericalError);
  }
  omp_set_num_threads(threads);
}

TEST_CASE("probability maps: a pixel with a mapped fault's orientation matches that fault; the most dangerous orientation is never safer") {
  Case c;
  c.model.friction = Distribution::normal(0.6, 0.08);
  c.settings.realizations = 500;
  for (auto& s : c.segments) s.check_points = {s.check_points[1]};  // one point, like a pixel
  for (const auto& s : c.segments) c.settings.map_points.push_back(s.check_points[0]);
  c.settings.map_strike = c.segments[0].strike;
  c.settings.map_dip = c.segments[0].dip;
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  const std::size_t n_out = c.settings.output_index.size();
  REQUIRE(res.map_oriented.size() == c.segments.size() * n_out);
  for (std::size_t p = 0; p < c.segments.size(); ++p)
    for (std::size_t t = 0; t < n_out; ++t) {
      // Same orientation, same point, same realizations: identical counts (exact reasoning).
      CHECK(res.map_oriented[p * n_out + t] == res.segments[p].slipped_by[t]);
      // min over orientations of Δp_crit ≤ Δp_crit of any one orientation (up to the 5° grid).
      CHECK(res.map_dangerous[p * n_out + t] + res.map_dangerous_already_critical >=
            res.map_oriented[p * n_out + t]);
    }
}

TEST_CASE("audit: the fast path agrees with the plain method (every E1 term evaluated)") {
  Case c;
  c.model.permeability = Distribution::lognormal(2e-14, 0.8);
  c.model.friction = Distribution::normal(0.6, 0.1);
  c.settings.realizations = 300;
  c.settings.method = stats::SamplingMethod::latin_hypercube;
  for (std::uint64_t i = 0; i < 300; i += 7) c.settings.audit_realizations.push_back(i);
  c.settings.audit_segments = {0, 1, 2};
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(res.audit.size() >= 3 * 40);
  double worst = 0.0;
  int mismatched = 0;
  for (const auto& fast : res.audit) {
    const auto plain = plain_slip_check(fast, c.wells, c.segments, c.settings);
    mismatched += fast.first_crossing != plain.first_crossing;
    for (std::size_t t = 0; t < plain.dp_at_output.size(); ++t)
      if (plain.dp_at_output[t] > 1000.0)  // the stated domain: Δp > 1 kPa
        worst = std::max(worst, std::abs(fast.dp_at_output[t] - plain.dp_at_output[t]) / plain.dp_at_output[t]);
  }
  MESSAGE("fast vs plain: worst relative Δp difference " << worst << ", crossing mismatches " << mismatched);
  CHECK(worst < 1e-4);  // the engine's stated accuracy (pressure_surrogate.hpp)
  CHECK(mismatched == 0);
}

namespace {
// Fictional case for the well attribution: three wells with different histories (whole days),
// two segments; everything fixed unless a test changes it.
Case three_wells() {
  Case c;
  c.wells.clear();
  const double wx[3] = {0.0, 2500.0, -1500.0}, wy[3] = {0.0, 1500.0, 2500.0};
  for (int w = 0; w < 3; ++w) {
    WellInput in;
    in.id = std::string("W").append(std::to_string(w + 1));
    in.x = wx[w];
    in.y = wy[w];
    double q_prev = 0.0;
    for (int m = 0; m < 48; ++m) {
      double q = 0.01 * (w + 1) + 0.005 * std::sin(0.3 * m + w);
      if (w == 2 && m >= 30) q = 0.0;  // injection ends
      in.steps.time.push_back(m * 30 * kDay);
      in.steps.delta_rate.push_back(q - q_prev);
      q_prev = q;
    }
    c.wells.push_back(in);
  }
  c.segments.resize(2);
  c.segments[1].check_points = {{6000.0, 4000.0}, {6300.0, 4400.0}, {6600.0, 4800.0}};
  return c;
}
}  // namespace

TEST_CASE("median well attribution, all inputs fixed: the deterministic screen's well shares") {
  Case c = three_wells();
  c.settings.realizations = 5;
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  // The same wells, points and times through the deterministic screen (exact Theis sums).
  screen::ScreenInputs in;
  in.stress = {75e6, 90e6, 51e6, 45 * kDeg, 30e6};
  in.friction = {0.6, 0.0};
  const double k = 2e-14, h = 50.0, phi = 0.12, ct = 1.5e-9, mu = 4e-4;
  in.formation = {k / (mu * phi * ct), mu / (4 * std::numbers::pi * k * h)};
  for (const auto& w : c.wells) {
    std::vector<double> starts, rates;
    double q = 0.0;
    for (std::size_t j = 0; j < w.steps.time.size(); ++j) {
      q += w.steps.delta_rate[j];
      starts.push_back(w.steps.time[j]);
      rates.push_back(q);
    }
    in.wells.push_back({w.id, w.x, w.y, w.radius, hydro::RateHistory(starts, rates)});
  }
  for (std::size_t s = 0; s < c.segments.size(); ++s) {
    std::vector<geometry::Point2> pts;
    for (const auto& p : c.segments[s].check_points) pts.push_back({p.x, p.y});
    in.segments.push_back({std::string("S").append(std::to_string(s)), c.segments[s].strike, c.segments[s].dip, pts, std::nullopt});
  }
  for (std::size_t o : c.settings.output_index) in.output_times.push_back(c.settings.tracking_times[o]);
  in.tracking_times = c.settings.tracking_times;
  const auto det = screen::deterministic_screen(in);
  double worst = 0.0;
  for (std::size_t s = 0; s < c.segments.size(); ++s) {
    REQUIRE(res.segments[s].median.size() == c.settings.output_index.size());
    for (std::size_t t = 0; t < c.settings.output_index.size(); ++t) {
      CAPTURE(s);
      CAPTURE(t);
      const auto& m = res.segments[s].median[t];
      CHECK(m.realization == 2);  // identical realizations: rank ⌊(5 − 1)/2⌋ = 2, ties by index
      CHECK(m.check_point == det.segments[s].dp_point[t]);
      double sum = 0.0;
      for (std::size_t w = 0; w < 3; ++w) {
        sum += m.share(w);
        worst = std::max(worst, std::abs(m.share(w) - det.segments[s].well_share[t * 3 + w]));
      }
      CHECK(std::abs(sum - 1.0) < 1e-12);
      // Σ well_dp (tables) against the fast path's Δp: within the surrogate's accuracy.
      double total = 0.0;
      for (double v : m.well_dp) total += v;
      CHECK(std::abs(total - m.dp) <= 1e-4 * m.dp);
      CHECK(std::abs(total - det.segments[s].dp[t]) <= 1e-5 * det.segments[s].dp[t]);
    }
  }
  MESSAGE("median shares vs deterministic shares: worst difference " << worst);
  // Table against exact sums: 1e-6 of the wells' near-field scale (similarity_table.hpp), here
  // well below 1e-5 of the segment's Δp.
  CHECK(worst < 1e-5);
}

TEST_CASE("median well attribution: the median realization reproduced from the sampler's streams") {
  // Two wells with the same history at the same distance from a one-point segment; only the
  // first well's rate factor is uncertain. Δp = P·H·(f1 + 1) increases with f1, so the median
  // realization is the one with the median f1, and the first well's share there is f1/(f1 + 1).
  Case c;
  c.wells.push_back(c.wells[0]);
  c.wells[0].x = -3000.0;
  c.wells[1].x = 3000.0;
  c.wells[1].id = "W2";
  c.segments = {c.segments[0]};
  c.segments[0].check_points = {{0.0, 2000.0}};
  c.model.well_rate_factor = {Distribution::uniform(0.5, 1.5), std::nullopt};
  c.settings.realizations = 101;
  c.settings.method = stats::SamplingMethod::latin_hypercube;
  c.settings.seed = 11;
  const auto res = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(res.realizations == 101);
  // The sampler's inputs: the run's names with the rate factor's distribution in its slot (an
  // input's draws depend only on (seed, its slot, N) and its own distribution).
  const auto names = sampled_input_names(c.model, c.wells, 1);
  std::vector<stats::UncertainInput> inputs;
  std::size_t slot = names.size();
  for (std::size_t j = 0; j + 2 < names.size(); ++j) {
    if (names[j] == "rate_factor[W1]") slot = j;
    inputs.push_back({names[j], names[j] == "rate_factor[W1]" ? Distribution::uniform(0.5, 1.5) : Distribution::fixed(1.0)});
  }
  REQUIRE(slot < inputs.size());
  const stats::Sampler sampler(inputs, c.settings.method, c.settings.seed, stats::RealizationCount(101));
  std::vector<double> f1(101);
  for (std::uint64_t i = 0; i < 101; ++i) f1[i] = sampler.draw(i)[slot];
  for (std::size_t t = 0; t < c.settings.output_index.size(); ++t) {
    CAPTURE(t);
    const auto& m = res.segments[0].median[t];
    REQUIRE(m.realization < 101);
    const double f = f1[m.realization];
    // Rank ⌊(101 − 1)/2⌋ = 50: exactly 50 realizations have a smaller rate factor.
    CHECK(std::count_if(f1.begin(), f1.end(), [&](double v) { return v < f; }) == 50);
    CHECK(std::abs(m.share(0) - f / (f + 1.0)) < 1e-6);
    CHECK(std::abs(m.share(0) + m.share(1) - 1.0) < 1e-12);
    // Its Δp is the median the quantile sketch reports, within the sketch's 1 % accuracy.
    CHECK(std::abs(m.dp - res.segments[0].dp[t].quantile(0.5)) <= 0.0101 * m.dp);
  }
}
