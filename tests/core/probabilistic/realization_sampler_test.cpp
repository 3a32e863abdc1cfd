#include "core/probabilistic/realization_sampler.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "core/errors.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;

// Fictional case: strike-slip stress from gradients at 3 km (Sv 75, SHmax 90, Shmin 51,
// p0 30 MPa), one segment striking 15°, dipping 80°; every input fixed unless a test changes it.
struct Case {
  UncertainModel model;
  std::vector<WellInput> wells{WellInput{"W1", 0.0, 0.0, 0.1, {}}};
  std::vector<SegmentInput> segments;
  RunSettings settings;
  Case() {
    model = test::strike_slip_model();
    SegmentInput s;
    s.check_points = {{1500.0, 0.0}};
    s.strike = 15 * kDeg;
    s.dip = 80 * kDeg;
    segments.push_back(s);
    settings.realizations = 16;
    settings.method = stats::SamplingMethod::monte_carlo;
  }
  SampledRealizations sample() const {
    const InputList list = make_inputs(model, wells, 1);
    return sample_realizations(model, list, segments, 1, settings,
                               stats::RealizationCount(static_cast<std::int64_t>(settings.realizations)));
  }
};
}  // namespace

TEST_CASE("realizations: D = k/(μ φ c_t) and μ/(4π k h), or D = T/S and ρ g/(4π T) (Theis 1935)") {
  Case c;
  const auto r = c.sample();
  REQUIRE(r.keep.size() == 16);
  // Hand arithmetic: 2e-14 / (4e-4 · 0.12 · 1.5e-9) = 2e-14 / 7.2e-14 = 0.2777… m²/s;
  // 4e-4 / (4π · 2e-14 · 50) = 1e8/π Pa per m³/s.
  CHECK(std::abs(r.diffusivity[0] - 2.0 / 7.2) < 1e-15);
  CHECK(std::abs(r.prefactor[0] / (1e8 / std::numbers::pi) - 1.0) < 1e-15);
  c.model.from_transmissivity = true;
  c.model.transmissivity = Distribution::fixed(2e-5);
  c.model.storativity = Distribution::fixed(4e-5);
  c.model.fluid_density = 1000.0;
  const auto t = c.sample();
  // D = 2e-5 / 4e-5 = 0.5 m²/s; ρ g/(4π T) = 1000 · 9.80665 / (4π · 2e-5) (standard gravity).
  CHECK(t.diffusivity[0] == 0.5);
  CHECK(std::abs(t.prefactor[0] / (1000.0 * 9.80665 / (8e-5 * std::numbers::pi)) - 1.0) < 1e-15);
}

TEST_CASE("realizations: a formation that is not physical (φ > 1) or a stress state Shmin > SHmax is rejected") {
  Case c;
  c.settings.realizations = 400;
  c.model.porosity = Distribution::uniform(0.5, 1.5);
  const auto r = c.sample();
  CHECK(r.drawn == 400);
  CHECK(r.keep.size() > 100);  // about half of 400 (the other half has φ > 1)
  CHECK(r.keep.size() < 300);
  const InputList list = make_inputs(c.model, c.wells, 1);
  for (Eigen::Index col = 0; col < r.inputs.cols(); ++col) CHECK(r.inputs(static_cast<Eigen::Index>(list.phi), col) <= 1.0);
  Case bad;
  bad.model.shmin_gradient = Distribution::fixed(31e3);  // Shmin above SHmax in every realization
  CHECK_THROWS_AS(bad.sample(), InputError);
}

TEST_CASE("realizations: counted beyond the frictional limit [√(μ²+1) + μ]² = 3.12 for μ = 0.6 (Zoback 2007)") {
  Case c;  // (90 − 30)/(51 − 30) = 2.86: within the limit
  CHECK(c.sample().beyond_frictional_limit == 0);
  c.model.shmax_gradient = Distribution::fixed(60e3);  // (180 − 30)/(51 − 30) = 7.1: beyond
  const auto r = c.sample();
  CHECK(r.keep.size() == 16);  // beyond the limit is used and counted, not rejected
  CHECK(r.beyond_frictional_limit == 16);
}

TEST_CASE("realizations: the most dangerous map orientation is never safer than a mapped segment on its 5° grid") {
  Case c;
  c.settings.realizations = 64;
  c.model.friction = Distribution::uniform(0.4, 0.8);
  c.model.shmax_azimuth = Distribution::uniform(30 * kDeg, 60 * kDeg);
  c.settings.map_points = {{0.0, 0.0}};
  c.settings.map_strike = 15 * kDeg;
  c.settings.map_dip = 80 * kDeg;
  const auto r = c.sample();
  REQUIRE(r.map_dp_crit.cols() == static_cast<Eigen::Index>(r.keep.size()));
  for (Eigen::Index col = 0; col < r.map_dp_crit.cols(); ++col) {
    CHECK(r.map_dp_crit(0, col) <= r.map_dp_crit(1, col));
    // The given orientation with the global friction is the segment's own threshold (single
    // precision storage: 1e-6 relative).
    CHECK(std::abs(r.map_dp_crit(1, col) - r.dp_crit(0, col)) <= 1e-6f * std::abs(r.dp_crit(0, col)));
  }
}

TEST_CASE("realizations: a part's own segments get the whole run's thresholds bit for bit, the others NaN") {
  Case c;
  c.settings.realizations = 300;
  c.model.friction = Distribution::uniform(0.4, 0.8);
  c.model.porosity = Distribution::uniform(0.5, 1.5);  // some realizations rejected: the kept columns are picked
  for (int k = 1; k < 5; ++k) {
    SegmentInput s = c.segments.front();
    s.strike = (15 + 20 * k) * kDeg;
    c.segments.push_back(s);
  }
  const InputList list = make_inputs(c.model, c.wells, 1);
  const stats::RealizationCount n(300);
  const SampledRealizations whole = sample_realizations(c.model, list, c.segments, 1, c.settings, n);
  const SampledRealizations part = sample_realizations(c.model, list, c.segments, 1, c.settings, n, std::pair{1, 3});
  REQUIRE(part.keep == whole.keep);
  REQUIRE(whole.keep.size() < 300);
  CHECK(part.inputs == whole.inputs);
  CHECK(part.perturbation == whole.perturbation);
  CHECK(part.diffusivity == whole.diffusivity);
  REQUIRE(part.dp_crit.rows() == 5);
  for (Eigen::Index s = 0; s < 5; ++s)
    for (Eigen::Index col = 0; col < part.dp_crit.cols(); ++col) {
      if (s >= 1 && s < 3) CHECK(part.dp_crit(s, col) == whole.dp_crit(s, col));
      else CHECK(std::isnan(part.dp_crit(s, col)));
    }
  CHECK_THROWS_AS(sample_realizations(c.model, list, c.segments, 1, c.settings, n, std::pair{3, 6}), InputError);
  c.settings.seismicity.emplace();  // reads every segment's
  CHECK_THROWS_AS(sample_realizations(c.model, list, c.segments, 1, c.settings, n, std::pair{0, 2}), InputError);
}
