#include "screening/comparison.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::screening;

namespace {

constexpr double kDay = 86400.0;
constexpr double t2026 = 20454.0 * kDay;  // 2026-01-01T00:00Z: 20454 days after 1970-01-01 (common practice: 56 years, 14 leap days)

RunRecord base_run() {
  RunRecord r;
  r.folder = "runs/old";
  r.region = "Marrowick Basin (fictional)";
  r.crs = "EPSG:32708";
  r.inputs = {{"scenario", "s.toml", "aa"}, {"wells", "wells.csv", "bb"}, {"histories", "h.csv", "cc"}};
  r.parameters = {{"scenario.seed", "1"}, {"uncertainty.realizations", "100"}};
  // W1: 0.01 m3/s reported through 2026-01-01, then assumed on for a year; W2 shut in; P proposed.
  r.wells = {{"W1", "active", false, {{t2026 - 100 * kDay, t2026, 0.01, false}, {t2026, t2026 + 365 * kDay, 0.01, true}}},
             {"W2", "shut-in", false, {{t2026 - 200 * kDay, t2026 - 100 * kDay, 0.02, false}}},
             {"W3", "active", false, {{t2026 - 50 * kDay, t2026 - 40 * kDay, 0.03, false}}},
             {"P", "proposed", true, {{t2026 + 30 * kDay, t2026 + 400 * kDay, 0.05, false}}}};
  r.realizations = 100;
  r.thresholds = {0.05, 0.2};
  for (const char* seg : {"F:0", "F:1"})
    for (const char* date : {"2020-01-01", "2030-01-01"})
      r.probabilities.push_back({seg, "F", date, 0.1, 1e6});
  r.catalog = RunCatalogReview{"2025-12-31T00:00:00Z", t2026 - kDay, 1.0, 1.0, -2.0,
                               {{"e1", "2025-12-31T00:00:00Z", t2026 - kDay, 1.5}}};
  return r;
}

}  // namespace

TEST_CASE("a run compared with itself has no change at all") {
  const RunRecord r = base_run();
  const Comparison c = compare_runs(r, r);
  CHECK_FALSE(c.any_change());
  CHECK(c.parameters.empty());
  CHECK(c.moved_segments().empty());
  for (const auto& i : c.inputs) CHECK(i.change == Change::unchanged);
  for (const auto& w : c.wells) {
    CHECK(w.change == Change::unchanged);
    CHECK(w.volume_reported_new == 0.0);
    CHECK(w.volume_revised == 0.0);
  }
  for (const auto& s : c.segments) {
    CHECK(s.test.z == 0.0);
    CHECK(s.newly_flagged.empty());
    CHECK(s.cleared.empty());
  }
  CHECK(c.segments.size() == 4);
  CHECK(c.catalog.new_events.empty());
}

TEST_CASE("wells: removed, status changed, and volumes between the two histories' ends") {
  const RunRecord o = base_run();
  RunRecord n = base_run();
  n.folder = "runs/new";
  n.wells.erase(n.wells.begin() + 1);      // W2 removed
  n.wells[1].status = "shut-in";            // W3 shut in
  // The new history reports W1 for 30 more days at 0.02 m3/s (the old run assumed 0.01) and revises
  // its first reported period from 0.01 to 0.011 m3/s.
  n.wells[0].periods = {{t2026 - 100 * kDay, t2026, 0.011, false}, {t2026, t2026 + 30 * kDay, 0.02, false}};
  n.inputs[1].sha256 = "changed";
  const Comparison c = compare_runs(o, n);
  REQUIRE(c.history_end_old);
  REQUIRE(c.history_end_new);
  CHECK(*c.history_end_old == t2026);
  CHECK(*c.history_end_new == t2026 + 30 * kDay);  // P's planned periods are no history
  REQUIRE(c.wells.size() == 4);
  const auto well = [&](const std::string& id) {
    return *std::find_if(c.wells.begin(), c.wells.end(), [&](const WellChange& w) { return w.id == id; });
  };
  CHECK(well("W2").change == Change::removed);
  CHECK(well("W3").change == Change::changed);
  CHECK(*well("W3").old_status == "active");
  CHECK(*well("W3").new_status == "shut-in");
  CHECK(well("P").change == Change::unchanged);
  CHECK(well("W1").change == Change::unchanged);
  // By hand: 30 days at 0.02 m3/s reported; the old run assumed 30 days at 0.01 m3/s.
  CHECK(well("W1").volume_reported_new == doctest::Approx(30 * kDay * 0.02).epsilon(1e-14));
  CHECK(well("W1").volume_expected_old == doctest::Approx(30 * kDay * 0.01).epsilon(1e-14));
  CHECK(well("W1").volume_revised == doctest::Approx(100 * kDay * 0.001).epsilon(1e-12));
  CHECK(well("W2").volume_revised == doctest::Approx(-100 * kDay * 0.02).epsilon(1e-14));
  // P is planned from day 30: nothing of it falls in [end_old, end_new) = days 0 to 30, and a plan is
  // never counted as reported.
  CHECK(well("P").volume_expected_old == 0.0);
  CHECK(well("P").volume_reported_new == 0.0);
  CHECK(c.inputs[1].change == Change::changed);
  CHECK(c.any_change());
}

TEST_CASE("P(slip): the noise test, thresholds newly reached or cleared at the last common date") {
  RunRecord o = base_run();
  o.probabilities[3].p_slip = 0.06;
  RunRecord n = base_run();
  n.realizations = 400;
  n.probabilities[1].p_slip = 0.25;   // F:0 at 2030: 0.1 (of 100) -> 0.25 (of 400): z = 3.17 by the pooled formula
  n.probabilities[3].p_slip = 0.04;   // F:1 at 2030: 0.06 -> 0.04, below 0.05: cleared, yet within the noise (z = -0.87)
  const Comparison c = compare_runs(o, n);
  CHECK(c.common_dates == std::vector<std::string>{"2020-01-01", "2030-01-01"});
  CHECK(c.moved_segments() == std::vector<std::string>{"F:0"});
  REQUIRE(c.flags.size() == 2);
  CHECK(c.flags[0].threshold == 0.05);
  CHECK(c.flags[0].cleared == std::vector<std::string>{"F:1"});
  CHECK(c.flags[0].newly_flagged.empty());
  CHECK(c.flags[1].newly_flagged == std::vector<std::string>{"F:0"});
  // By hand: pooled = (10 + 100)/500 = 0.22, SE = sqrt(0.22*0.78*(1/100 + 1/400)) = 0.046314..., z = 0.15/SE.
  const double se = std::sqrt(0.22 * 0.78 * (0.01 + 0.0025));
  CHECK(c.segments[1].test.z == doctest::Approx(0.15 / se).epsilon(1e-12));
  CHECK(c.segments[3].cleared == std::vector<double>{0.05});
}

TEST_CASE("segments and dates of one run only; catalog events after the old review; not reviewed") {
  const RunRecord o = base_run();
  RunRecord n = base_run();
  n.probabilities.erase(n.probabilities.begin() + 2, n.probabilities.end());  // F:1 gone
  n.probabilities.push_back({"G:0", "G", "2030-01-01", 0.0, 0.0});
  n.probabilities.push_back({"G:0", "G", "2020-01-01", 0.0, 0.0});
  n.catalog->events.push_back({"e2", "2026-02-01T00:00:00Z", t2026 + 31 * kDay, 2.1});
  n.catalog->b = 1.1;
  const Comparison c = compare_runs(o, n);
  CHECK(c.segments_only_old == std::vector<std::string>{"F:1"});
  CHECK(c.segments_only_new == std::vector<std::string>{"G:0"});
  REQUIRE(c.catalog.new_events.size() == 1);
  CHECK(c.catalog.new_events[0].id == "e2");
  CHECK(*c.catalog.b_new - *c.catalog.b_old == doctest::Approx(0.1).epsilon(1e-12));

  RunRecord none = base_run();
  none.catalog.reset();
  const Comparison d = compare_runs(o, none);
  CHECK_FALSE(d.catalog.new_reviewed);
  CHECK(d.catalog.new_events.empty());
  CHECK(d.any_change());
}

TEST_CASE("runs of different regions or working CRSs, or without a common date, are refused naming both") {
  const RunRecord o = base_run();
  RunRecord n = base_run();
  n.folder = "runs/new";
  n.crs = "EPSG:32614";
  const auto why = incomparable(o, n);
  REQUIRE(why);
  CHECK(why->find("EPSG:32708") != std::string::npos);
  CHECK(why->find("EPSG:32614") != std::string::npos);
  CHECK_THROWS_AS(compare_runs(o, n), InputError);
  n = base_run();
  n.region = "Elsewhere";
  REQUIRE(incomparable(o, n));
  CHECK(incomparable(o, n)->find("Elsewhere") != std::string::npos);
  n = base_run();
  for (auto& p : n.probabilities) p.date = p.date == "2020-01-01" ? "2040-01-01" : "2041-01-01";
  CHECK_THROWS_AS(compare_runs(o, n), InputError);  // no common output date
}
