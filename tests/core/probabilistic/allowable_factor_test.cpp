#include "core/probabilistic/allowable_factor.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <optional>
#include <stdexcept>
#include <limits>
#include <random>
#include <vector>

#include "core/errors.hpp"
#include "core/probabilistic/critical_factor.hpp"
#include "core/stats/wilson_interval.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();

// Random f_crit values with ties, zeros and +∞ (invented).
std::vector<double> random_factors(std::mt19937_64& rng, std::size_t count) {
  std::uniform_real_distribution<double> U(0.0, 1.0);
  std::vector<double> f;
  for (std::size_t i = 0; i < count; ++i) {
    const double u = U(rng);
    f.push_back(u < 0.03 ? 0.0 : u > 0.9 ? kInf : std::round(4000 * U(rng)) / 1000);  // ties on a 1e-3 grid
  }
  return f;
}
}  // namespace

TEST_CASE("P(slip | f) steps exactly at the critical factors: brute force over the realizations") {
  // Series of a small full model: the curve's count at f equals the realizations whose own
  // Δp_rest + f·Δp_G reaches Δp_crit, between the steps (away from rounding at a step).
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> U(0.0, 1.0);
  struct R {
    std::vector<double> rest, group;
    double crit;
  };
  std::vector<R> rs;
  std::vector<double> f_crit;
  for (int i = 0; i < 200; ++i) {
    R r;
    for (int k = 0; k < 12; ++k) {
      r.rest.push_back(1e6 * U(rng));
      r.group.push_back(k < 4 ? 0.0 : 1e6 * U(rng));
    }
    r.crit = 2e6 * U(rng) + 0.5e6;
    f_crit.push_back(critical_factor(r.rest, r.group, r.crit));
    rs.push_back(r);
  }
  const SlipFactorCurve curve(f_crit, 250);  // 50 more realizations: critical before injection
  const auto& steps = curve.steps();
  for (std::size_t j = 0; j + 1 < steps.size(); ++j) {
    if (!(steps[j] < steps[j + 1]) || std::isinf(steps[j + 1])) continue;
    const double f = 0.5 * (steps[j] + steps[j + 1]);
    std::uint64_t brute = 0;
    for (const auto& r : rs) {
      bool s = false;
      for (std::size_t k = 0; k < r.rest.size(); ++k) s = s || r.rest[k] + f * r.group[k] >= r.crit;
      brute += s;
    }
    CAPTURE(f);
    CHECK(curve.slipped(f) == brute);
    CHECK(curve.slipped(f) == j + 1);
  }
  // At a step value itself the realization counts (f_crit ≤ f); just below, it does not.
  for (std::size_t j = 0; j < steps.size(); ++j) {
    if (std::isinf(steps[j]) || steps[j] == 0.0) continue;
    CHECK(curve.slipped(steps[j]) > curve.slipped(std::nextafter(steps[j], 0.0)));
  }
  CHECK(curve.probability(kInf) == 200.0 / 250.0);
}

TEST_CASE("segment limit and allowable factor equal a brute-force scan of the steps") {
  std::mt19937_64 rng(11);
  const double z = stats::kZ95;
  for (int trial = 0; trial < 20; ++trial) {
    std::vector<SlipFactorCurve> curves;
    for (int s = 0; s < 6; ++s) curves.emplace_back(random_factors(rng, 300), 400);
    for (double th : {0.02, 0.05, 0.2, 0.5})
      for (auto bound : {ProbabilityBound::point_estimate, ProbabilityBound::wilson_upper}) {
        const auto ok = [&](const SlipFactorCurve& c, double f) {
          const auto ci = stats::wilson_interval(c.slipped(f), c.realizations(), z);
          return (bound == ProbabilityBound::point_estimate ? ci.estimate : ci.upper) <= th;
        };
        double best = kInf;
        std::optional<std::size_t> binding;
        std::vector<std::size_t> without;
        for (std::size_t s = 0; s < curves.size(); ++s) {
          // Brute force: the first of 0 and the steps at which the bound exceeds the threshold.
          double lim = kInf;
          if (!ok(curves[s], 0.0)) lim = 0.0;
          else
            for (double f : curves[s].steps())
              if (!ok(curves[s], f)) {
                lim = f;
                break;
              }
          CHECK(segment_limit(curves[s], th, bound, z) == lim);
          if (lim == 0.0) without.push_back(s);
          else if (lim < best) {
            best = lim;
            binding = s;
          }
        }
        const AllowableFactor a = allowable_factor(curves, th, bound, z);
        CAPTURE(th);
        CHECK(a.limit == best);
        CHECK(a.binding == binding);
        CHECK(a.reached_without == without);
        if (std::isfinite(a.limit)) {
          CHECK(a.largest < a.limit);
          for (std::size_t s = 0; s < curves.size(); ++s)
            if (std::find(without.begin(), without.end(), s) == without.end()) CHECK(ok(curves[s], a.largest));
          CHECK_FALSE(ok(curves[*a.binding], a.limit));
        }
      }
  }
}

TEST_CASE("the point estimate's answer over the Wilson answer's segments is never below it") {
  // Same segments left apart for both (those over the threshold at f = 0 by the upper end), and
  // the upper end is at least the estimate at every f, so the point answer cannot be smaller.
  std::mt19937_64 rng(29);
  const double z = stats::kZ95;
  int compared = 0;
  for (int trial = 0; trial < 30; ++trial) {
    std::vector<SlipFactorCurve> curves;
    for (int s = 0; s < 8; ++s) curves.emplace_back(random_factors(rng, 60), 400);
    for (double th : {0.02, 0.05, 0.2}) {
      const auto w = allowable_factor(curves, th, ProbabilityBound::wilson_upper, z);
      const auto p = allowable_factor(curves, th, ProbabilityBound::point_estimate, z, ProbabilityBound::wilson_upper);
      CHECK(p.reached_without == w.reached_without);
      CHECK(w.limit <= p.limit);
      compared += std::isfinite(w.limit) ? 1 : 0;
    }
  }
  CHECK(compared > 10);  // the case exercises finite answers
}

TEST_CASE("Wilson bound: with no slip among 100 realizations the upper end is z²/(n + z²)") {
  // Wilson (1927) at r = 0: upper = z²/(n + z²) = 0.036994 for n = 100, z = 1.96 (closed form).
  const SlipFactorCurve none({}, 100);
  CHECK(segment_limit(none, 0.036, ProbabilityBound::wilson_upper, stats::kZ95) == 0.0);  // even 0 slips exceed
  CHECK(segment_limit(none, 0.038, ProbabilityBound::wilson_upper, stats::kZ95) == kInf);
  CHECK(segment_limit(none, 0.038, ProbabilityBound::point_estimate, stats::kZ95) == kInf);
}

TEST_CASE("a curve merged from two parts of the realizations equals the curve of all of them") {
  std::mt19937_64 rng(3);
  const auto a = random_factors(rng, 120), b = random_factors(rng, 80);
  std::vector<double> all = a;
  all.insert(all.end(), b.begin(), b.end());
  SlipFactorCurve merged(a, 150);
  merged.merge(SlipFactorCurve(b, 100));
  const SlipFactorCurve whole(all, 250);
  CHECK(merged.realizations() == whole.realizations());
  CHECK(merged.steps() == whole.steps());
  for (double th : {0.05, 0.2})
    CHECK(segment_limit(merged, th, ProbabilityBound::wilson_upper, stats::kZ95) ==
          segment_limit(whole, th, ProbabilityBound::wilson_upper, stats::kZ95));
}

TEST_CASE("curves refuse bad input") {
  CHECK_THROWS_AS(SlipFactorCurve({0.5}, 0), InputError);
  CHECK_THROWS_AS(SlipFactorCurve({0.5, 1.0}, 1), InputError);
  CHECK_THROWS_AS(SlipFactorCurve({-0.1}, 3), InputError);
  CHECK_THROWS_AS(SlipFactorCurve({std::nan("")}, 3), InputError);
  CHECK_THROWS_AS(allowable_factor({}, 0.05, ProbabilityBound::point_estimate, stats::kZ95), InputError);
  CHECK_THROWS_AS(allowable_factor({SlipFactorCurve({}, 3)}, 1.5, ProbabilityBound::point_estimate, stats::kZ95),
                  InputError);
}

TEST_CASE("the steps_needed() smallest factors decide every segment limit; beyond them a curve may be cut") {
  // A curve cut at its k-th smallest factor (larger ones listed as +∞, exact range = that factor)
  // gives the same segment_limit() as the whole curve for every threshold and bound, k =
  // steps_needed(); cut one step earlier, some limit differs or cannot be told (group_factors.hpp).
  std::mt19937_64 rng(11);
  const std::vector<double> thresholds{0.05, 0.2};
  const std::vector<ProbabilityBound> bounds{ProbabilityBound::point_estimate, ProbabilityBound::wilson_upper,
                                             ProbabilityBound::wilson_lower};
  const std::uint64_t n = 400;
  const std::uint64_t k = steps_needed(n, thresholds, stats::kZ95);
  // The count at which the lower end of the Wilson (1927) interval first passes 0.2 among 400:
  // by the normal approximation of the score interval, where r/n − 1.96·√(0.2·0.8/400) = 0.2,
  // i.e. r/n ≈ 0.239, r ≈ 96 (the score interval's own skew moves it by a few counts).
  CHECK(k > 85);
  CHECK(k < 110);
  const auto cut = [](std::vector<double> f, std::uint64_t at) {
    std::sort(f.begin(), f.end());
    const double c = f[static_cast<std::size_t>(at - 1)];
    for (double& v : f)
      if (v > c) v = kInf;
    return SlipFactorCurve(f, 400, c);
  };
  int differs_one_step_earlier = 0;
  for (int trial = 0; trial < 20; ++trial) {
    const auto f = random_factors(rng, 300);
    const SlipFactorCurve whole(f, n), at_k = cut(f, k), before_k = cut(f, k - 1);
    CHECK(at_k.exact_up_to() == at_k.steps()[static_cast<std::size_t>(k - 1)]);
    for (double th : thresholds)
      for (auto b : bounds) {
        CHECK(segment_limit(at_k, th, b, stats::kZ95) == segment_limit(whole, th, b, stats::kZ95));
        try {
          if (segment_limit(before_k, th, b, stats::kZ95) != segment_limit(whole, th, b, stats::kZ95))
            ++differs_one_step_earlier;
        } catch (const std::logic_error&) {
          ++differs_one_step_earlier;
        }
      }
  }
  CHECK(differs_one_step_earlier > 0);  // k is the least that decides them
}

TEST_CASE("a curve answers only within its exact range, and a merge keeps the smaller range") {
  SlipFactorCurve a({0.2, 0.7, kInf}, 10, 1.0), b({0.4, kInf}, 10, 2.0);
  CHECK(a.slipped(1.0) == 2);
  CHECK_THROWS_AS((void)a.slipped(1.5), std::logic_error);
  a.merge(b);
  CHECK(a.exact_up_to() == 1.0);
  CHECK(a.slipped(0.5) == 2);
  CHECK_THROWS_AS(SlipFactorCurve({0.5}, 3, 0.0), InputError);
}
