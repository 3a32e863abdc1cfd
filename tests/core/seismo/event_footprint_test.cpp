#include "core/seismo/event_footprint.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

TEST_CASE("events inside the pressure footprint against chance") {
  // 20 events, 9 with Δp >= 0.1 MPa, footprint 20 % of the area: chance expectation 4 events;
  // P(X >= 9 | n = 20, f = 0.2) = 0.0099817863 (exact binomial sum, /usr/bin/python3 math.comb).
  std::vector<double> dp(20, 0.0);
  for (int i = 0; i < 9; ++i) dp[static_cast<std::size_t>(i)] = 0.1e6 + i;
  const auto c = footprint_count(dp, 0.1e6, 0.2);
  CHECK(c.inside == 9);
  CHECK(c.expected == doctest::Approx(4.0).epsilon(1e-15));
  CHECK(c.p_value == doctest::Approx(0.009981786320724304).epsilon(1e-12));
  // Callback form: the run evaluates Δp per event.
  Catalog cat;
  for (int i = 0; i < 20; ++i) cat.events.push_back({std::to_string(i), 0.0, static_cast<double>(i), 0.0, 1000.0, 1.0, "ML", ""});
  const auto c2 = footprint_count(cat, [](const Event& e) { return e.x < 9.0 ? 2e5 : 0.0; }, 0.1e6, 0.2);
  CHECK(c2.inside == 9);
  CHECK(c2.p_value == doctest::Approx(c.p_value).epsilon(1e-14));
}

TEST_CASE("footprint edge cases") {
  const std::vector<double> none;
  CHECK(footprint_count(none, 1.0, 0.5).p_value == 1.0);
  const std::vector<double> dp = {2.0, 0.0};
  CHECK(footprint_count(dp, 1.0, 0.0).p_value == 0.0);
  CHECK(footprint_count(dp, 1.0, 1.0).p_value == 1.0);
  CHECK_THROWS_AS(footprint_count(dp, 1.0, 1.5), InputError);
  const std::vector<double> bad = {1.0, std::nan("")};
  CHECK_THROWS_WITH_AS(footprint_count(bad, 1.0, 0.5), doctest::Contains("event 2"), InputError);
}

TEST_CASE("footprint area fraction between output times") {
  // Piecewise-linear interpolation (exact reasoning): 0 up to the first injection at t = 100,
  // linear to the first sample, linear between samples, constant after the last.
  const std::vector<double> t{200.0, 400.0, 600.0};
  const std::vector<double> f{0.2, 0.6, 0.4};
  CHECK(footprint_fraction_at(t, f, 100.0, 50.0) == 0.0);
  CHECK(footprint_fraction_at(t, f, 100.0, 100.0) == 0.0);
  CHECK(footprint_fraction_at(t, f, 100.0, 150.0) == doctest::Approx(0.1).epsilon(1e-15));
  CHECK(footprint_fraction_at(t, f, 100.0, 200.0) == doctest::Approx(0.2).epsilon(1e-15));
  CHECK(footprint_fraction_at(t, f, 100.0, 300.0) == doctest::Approx(0.4).epsilon(1e-15));
  CHECK(footprint_fraction_at(t, f, 100.0, 500.0) == doctest::Approx(0.5).epsilon(1e-15));
  CHECK(footprint_fraction_at(t, f, 100.0, 900.0) == 0.4);
  // Samples at or before the first injection carry no footprint: start at 400 -> linear from
  // (400, 0) to (600, 0.4).
  CHECK(footprint_fraction_at(t, f, 400.0, 500.0) == doctest::Approx(0.2).epsilon(1e-15));
  const std::vector<double> bad{0.2, 1.5, 0.4};
  CHECK_THROWS_AS(footprint_fraction_at(t, bad, 100.0, 300.0), InputError);
  const std::vector<double> unsorted{200.0, 200.0, 600.0};
  CHECK_THROWS_AS(footprint_fraction_at(unsorted, f, 100.0, 300.0), InputError);
}
