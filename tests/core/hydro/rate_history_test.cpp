#include "core/hydro/rate_history.hpp"

#include <doctest/doctest.h>

#include <chrono>
#include <cmath>
#include <limits>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;
using namespace std::chrono;

TEST_CASE("a history gives the rate in force and its changes") {
  const RateHistory h({0.0, 100.0, 250.0}, {2.0, 5.0, 0.0});
  CHECK(h.rate_at(-1.0) == 0.0);  // before the first step: no injection
  CHECK(h.rate_at(0.0) == 2.0);
  CHECK(h.rate_at(99.0) == 2.0);
  CHECK(h.rate_at(100.0) == 5.0);
  CHECK(h.rate_at(1e9) == 0.0);
  const auto c = h.changes();
  REQUIRE(c.size() == 3);
  CHECK(c[0].time == 0.0);
  CHECK(c[0].delta == 2.0);
  CHECK(c[1].delta == 3.0);
  CHECK(c[2].delta == -5.0);
  // 2 m3/s for 100 s + 5 m3/s for 150 s (arithmetic)
  CHECK(h.cumulative_volume(1e6) == doctest::Approx(950.0).epsilon(1e-15));
  CHECK(h.cumulative_volume(50.0) == doctest::Approx(100.0).epsilon(1e-15));
  // A repeated rate is no change.
  CHECK(RateHistory({0.0, 10.0}, {1.0, 1.0}).changes().size() == 1);
}

TEST_CASE("unsorted, overlapping and non-finite histories are clear errors") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_WITH_AS(RateHistory({0.0, 50.0, 20.0}, {1, 2, 3}),
                       doctest::Contains("history[2].start"), InputError);
  CHECK_THROWS_WITH_AS(RateHistory({0.0, 50.0, 20.0}, {1, 2, 3}),
                       doctest::Contains("must be sorted"), InputError);
  CHECK_THROWS_WITH_AS(RateHistory({0.0, 0.0}, {1, 2}), doctest::Contains("history[1].start"), InputError);
  CHECK_THROWS_WITH_AS(RateHistory({0.0, 1.0}, {1, nan}), doctest::Contains("history[1].rate"), InputError);
  CHECK_THROWS_WITH_AS(RateHistory({nan}, {1}), doctest::Contains("history[0].start"), InputError);
  CHECK_THROWS_WITH_AS(RateHistory({0.0, 1.0}, {1}), doctest::Contains("one rate per start time"), InputError);
  const RatePeriod overlapping[] = {{0, 100, 1.0}, {50, 200, 2.0}};
  CHECK_THROWS_WITH_AS(RateHistory::from_periods(overlapping), doctest::Contains("period[1].start"), InputError);
  const RatePeriod backwards[] = {{100, 50, 1.0}};
  CHECK_THROWS_WITH_AS(RateHistory::from_periods(backwards), doctest::Contains("period[0].end"), InputError);
  const double volumes[] = {1000.0, -5.0};
  CHECK_THROWS_WITH_AS(RateHistory::from_monthly_volumes(2020y / January, volumes, sys_days{2020y / January / 1}),
                       doctest::Contains("volume[1]"), InputError);
}

TEST_CASE("periods with gaps become shut-ins") {
  const RatePeriod periods[] = {{0, 100, 1.0}, {100, 200, 3.0}, {300, 400, 2.0}};
  const RateHistory h = RateHistory::from_periods(periods);
  CHECK(h.start_times() == std::vector<double>{0, 100, 200, 300, 400});
  CHECK(h.rates() == std::vector<double>{1, 3, 0, 2, 0});
  const RatePeriod open_ended[] = {{10, std::numeric_limits<double>::infinity(), 4.0}};
  const RateHistory o = RateHistory::from_periods(open_ended);
  CHECK(o.start_times() == std::vector<double>{10});
  CHECK(o.rate_at(1e12) == 4.0);
}

TEST_CASE("monthly volumes become the mean rate of each calendar month") {
  // 2020 is a leap year: January 31 days, February 29 days (Gregorian calendar, common practice).
  const double volumes[] = {31 * 86400.0 * 2.0, 29 * 86400.0 * 3.0};
  const sys_days epoch{2020y / January / 1};
  const RateHistory h = RateHistory::from_monthly_volumes(2020y / January, volumes, epoch);
  REQUIRE(h.start_times().size() == 3);
  CHECK(h.start_times()[0] == 0.0);
  CHECK(h.start_times()[1] == 31 * 86400.0);
  CHECK(h.start_times()[2] == 60 * 86400.0);
  CHECK(h.rates()[0] == doctest::Approx(2.0).epsilon(1e-15));
  CHECK(h.rates()[1] == doctest::Approx(3.0).epsilon(1e-15));
  CHECK(h.rates()[2] == 0.0);  // reports end: the well is shut in
  CHECK(h.cumulative_volume(1e9) == doctest::Approx(volumes[0] + volumes[1]).epsilon(1e-15));
}

TEST_CASE("superposition in time sums only the changes before t") {
  const RateHistory h({0.0, 10.0}, {1.0, 0.0});
  const auto c = h.changes();
  const auto F = [](double tau) { return tau; };  // a unit response growing linearly
  CHECK(superpose_in_time(std::span<const RateChange>(c), -1.0, F) == 0.0);  // before injection
  CHECK(superpose_in_time(std::span<const RateChange>(c), 0.0, F) == 0.0);
  CHECK(superpose_in_time(std::span<const RateChange>(c), 5.0, F) == 5.0);
  // after shut-in: 1*(t) - 1*(t-10) = 10
  CHECK(superpose_in_time(std::span<const RateChange>(c), 25.0, F) == 10.0);
  CHECK(h.scaled(2.0).rates() == std::vector<double>{2.0, 0.0});
}
