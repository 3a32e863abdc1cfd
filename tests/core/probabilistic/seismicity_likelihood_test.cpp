#include "core/probabilistic/seismicity_likelihood.hpp"

#include <doctest/doctest.h>
#include <omp.h>

#include <cmath>
#include <limits>
#include <numbers>

#include "core/errors.hpp"
#include "core/probabilistic/slip_probability.hpp"
#include "core/seismo/point_process.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDay = 86400.0, kYear = 365.25 * kDay;

// Fictional case: the three-segment layout (strike_slip_case.hpp; segments at 1.5, 4 and 12 km,
// taken 2 km long) with uncertain permeability (lognormal, median 2e-14 m², σ_ln 0.8), 256 Latin
// hypercube realizations; Dieterich inputs Aσ = 0.5 MPa, t_a = 100 yr, 0.05 events/yr per km
// (invented for the test). Window: the first injection (t = 0) to the last tracking time.
struct SeisCase {
  UncertainModel model = test::strike_slip_model();
  std::vector<WellInput> wells;
  std::vector<SegmentInput> segments;
  RunSettings settings;
  explicit SeisCase(std::uint64_t n = 256) {
    model.permeability = Distribution::lognormal(2e-14, 0.8);
    model.seismicity = true;
    model.a_sigma = Distribution::fixed(0.5e6);
    model.background_rate_per_km = Distribution::fixed(0.05 / kYear);
    test::three_segment_layout(wells, segments, settings);
    settings.realizations = n;
    settings.seed = 11;
    settings.method = stats::SamplingMethod::latin_hypercube;
    SeismicityData d;
    d.injection_start = 0.0;
    d.t0 = 0.0;
    d.t1 = settings.tracking_times.back();
    d.segment_length = {2000.0, 2000.0, 2000.0};
    d.stressing_rate = 0.5e6 / (100.0 * kYear);
    settings.seismicity = d;
  }
  // `count` events on `segment` (or the pool), evenly spread over years 1 to 6.
  void add_events(std::size_t count, std::size_t segment) {
    for (std::size_t e = 0; e < count; ++e)
      settings.seismicity->events.push_back({(1.0 + 5.0 * static_cast<double>(e) / static_cast<double>(count)) * kYear, segment});
    std::size_t pool = 0;
    for (const auto& ev : settings.seismicity->events) pool += ev.segment == seismo::kBackgroundPool;
    settings.seismicity->pool_rate = static_cast<double>(pool) / (settings.seismicity->t1 - settings.seismicity->t0);
  }
};

double p_final(const SegmentResult& s, std::uint64_t n) { return static_cast<double>(s.slipped_by.back()) / static_cast<double>(n); }
double p_final_conditioned(const SegmentResult& s, const ImportanceWeights& w) {
  return static_cast<double>(s.conditioned.slipped_by.back()) / static_cast<double>(w.total);
}

}  // namespace

TEST_CASE("segment_coulomb_history: ΔCFF = 0 at the first injection, then the path's ΔCFF at the tracking times") {
  const geomech::CoulombPathChange mu_only{0.0, 0.0, 0.0, 0.6};  // κ = 0: ΔCFF = μΔp
  const std::vector<double> times{10.0, 20.0}, dp{1e5, 2e5};
  const auto h = segment_coulomb_history(times, dp, mu_only, 5.0);
  REQUIRE(h.time.size() == 3);
  CHECK(h.time[0] == 5.0);
  CHECK(h.coulomb_change[0] == 0.0);
  CHECK(h.coulomb_change[2] == doctest::Approx(1.2e5).epsilon(1e-15));
  CHECK(segment_coulomb_history(times, dp, mu_only, 10.0).time.size() == 2);  // the grid already starts there
  CHECK_THROWS_AS(segment_coulomb_history(times, std::vector<double>{1.0}, mu_only, 0.0), InputError);
}

TEST_CASE("the run's seismicity log-likelihood equals seismicity_log_likelihood of the plain method's Δp") {
  SeisCase c(64);
  c.add_events(12, 0);
  c.add_events(3, 1);
  c.add_events(4, seismo::kBackgroundPool);
  // Every tracking time an output time, so that the plain method gives the whole series.
  c.settings.output_index.clear();
  for (std::size_t k = 0; k < c.settings.tracking_times.size(); ++k) c.settings.output_index.push_back(k);
  c.settings.attribute_median = false;
  c.settings.audit_realizations = {5, 40};
  c.settings.audit_segments = {0, 1, 2};
  const auto r = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(r.conditioning);
  REQUIRE(r.conditioning->seismicity_log_likelihood.size() == r.realizations);
  REQUIRE(r.audit.size() == 6);
  const auto& d = *c.settings.seismicity;
  for (std::uint64_t i : {5u, 40u}) {
    std::vector<seismo::SegmentRateModel> models;
    for (std::size_t s = 0; s < 3; ++s) {
      const AuditEntry* fast = nullptr;
      for (const auto& a : r.audit)
        if (a.realization == i && a.segment == s) fast = &a;
      REQUIRE(fast);
      // Direct E1 superposition at every tracking time (no tables, no surrogate), ΔCFF = μΔp with
      // μ = 0.6 (fixed friction, no stress path, no perturbation: geomech::coulomb_path_change).
      const AuditEntry plain = plain_slip_check(*fast, c.wells, c.segments, c.settings);
      seismo::CoulombHistory h{{0.0}, {0.0}};
      for (std::size_t k = 0; k < c.settings.tracking_times.size(); ++k) {
        h.time.push_back(c.settings.tracking_times[k]);
        h.coulomb_change.push_back(0.6 * plain.dp_at_output[k]);
      }
      models.push_back({h, {0.05 / kYear * 2.0, 0.5e6, d.stressing_rate}});
    }
    const auto expected = seismo::seismicity_log_likelihood(models, d.pool_rate, d.events, d.t0, d.t1);
    const double got = r.conditioning->seismicity_log_likelihood[i];  // every realization valid: column i
    // Tolerance: the surrogate's relative error in Δp (r.surrogate_error) carried through
    // ln λ ≈ ΔCFF/Aσ at 19 events and the expected count; 1e-7 relative of the largest term.
    CHECK(std::abs(got - expected.log_likelihood) <= 1e-7 * std::max(1.0, std::abs(expected.sum_log_rate) + expected.expected));
    CHECK(std::isfinite(got));
  }
}

TEST_CASE("many events near a segment raise its conditioned P(slip); none near it lowers it") {
  SeisCase many;
  many.add_events(40, 0);
  const auto a = run_probabilistic(many.model, many.wells, many.segments, many.settings);
  SeisCase none;  // the same realizations, no event at all: −Σ ∫ λ dt favours low ΔCFF
  const auto b = run_probabilistic(none.model, none.wells, none.segments, none.settings);
  REQUIRE(a.conditioning);
  REQUIRE(b.conditioning);
  const double prior = p_final(a.segments[0], a.realizations);
  CHECK(prior == p_final(b.segments[0], b.realizations));
  REQUIRE(prior > 0.0);
  REQUIRE(prior < 1.0);
  CHECK(p_final_conditioned(a.segments[0], a.conditioning->weights) > prior);
  CHECK(p_final_conditioned(b.segments[0], b.conditioning->weights) < prior);
  CHECK(a.conditioning->weights.n_eff < 0.99 * static_cast<double>(a.realizations));
}

TEST_CASE("events only in the pool with a negligible segment background rate leave the prior's results") {
  SeisCase c;
  c.model.background_rate_per_km = Distribution::fixed(1e-12 / kYear);  // expected segment counts ~1e-11
  c.add_events(25, seismo::kBackgroundPool);
  const auto r = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(r.conditioning);
  const auto& w = r.conditioning->weights;
  CHECK(w.n_eff == doctest::Approx(static_cast<double>(r.realizations)).epsilon(1e-9));
  for (const auto& s : r.segments)
    CHECK(p_final_conditioned(s, w) == doctest::Approx(p_final(s, r.realizations)).epsilon(1e-9));
  // The pool's term is the same constant in every realization: 25 ln λ_b − λ_b (t1 − t0) with the
  // maximum-likelihood λ_b = 25 / (t1 − t0).
  const double span = c.settings.seismicity->t1 - c.settings.seismicity->t0;
  CHECK(r.conditioning->seismicity_log_likelihood[0] ==
        doctest::Approx(25.0 * std::log(25.0 / span) - 25.0).epsilon(1e-9));
}

TEST_CASE("seismicity weights are identical for 1 and 2 threads, and Aσ may be uncertain") {
  SeisCase c(300);
  c.model.a_sigma = Distribution::lognormal(0.5e6, 0.3);
  c.add_events(20, 0);
  c.add_events(5, 2);
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  const auto one = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(2);
  const auto two = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  omp_set_num_threads(before);
  REQUIRE(one.conditioning);
  CHECK(one.conditioning->seismicity_log_likelihood == two.conditioning->seismicity_log_likelihood);
  CHECK(one.conditioning->weights.units == two.conditioning->weights.units);
  // Aσ is a sampled input, last in the list: its prior and posterior percentiles are reported.
  REQUIRE(one.input_names.size() >= 3);
  CHECK(one.input_names[one.input_names.size() - 4] == "a_sigma");
  CHECK(one.input_names[one.input_names.size() - 3] == "background_rate_per_km");
}

TEST_CASE("seismicity inputs are checked before computing") {
  SeisCase c(16);
  c.settings.seismicity->events.push_back({kYear, 7});  // no segment 7
  CHECK_THROWS_AS(run_probabilistic(c.model, c.wells, c.segments, c.settings), InputError);
  SeisCase late(16);
  late.settings.seismicity->t1 = late.settings.tracking_times.back() + kYear;  // beyond the tracking grid
  CHECK_THROWS_AS(run_probabilistic(late.model, late.wells, late.segments, late.settings), InputError);
}
