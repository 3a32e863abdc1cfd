#include "core/screen/screen_split.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <cstring>
#include <string>
#include <thread>
#include <utility>

#include "core/errors.hpp"
#include "support/thread_exchange.hpp"

using namespace slipscreen;
using namespace slipscreen::screen;

namespace {

constexpr double kPi = 3.14159265358979323846;

// Fictional: two wells with monthly rates (one shut in for a while), seven segments from next to
// the wells to far away, so that some cross and some do not. `months` of injection, tracked
// monthly for `tracked` months and reported yearly for `years` years (shorter spans for a leaky
// formation, whose lag kernel costs about 3000 E1 per whole-day lag and node: run_cost.hpp).
ScreenInputs split_inputs(int months = 48, int tracked = 60, int years = 5) {
  ScreenInputs in;
  in.stress = {70e6, 90e6, 48e6, 75.0 * kPi / 180, 28e6};
  in.friction = {0.6, 0.0};
  in.formation = {0.4, 2.0e5};
  const double day = 86400.0, t0 = 14610 * day;
  for (int w = 0; w < 2; ++w) {
    std::vector<double> starts, rates;
    for (int m = 0; m < months; ++m) {
      starts.push_back(t0 + m * 30 * day);
      rates.push_back(w == 1 && m >= 20 && m < 26 ? 0.0 : 2.0 + 1.0 * std::sin(0.4 * m + w));
    }
    in.wells.push_back({std::string("W").append(std::to_string(w)), w * 2500.0, w * 1500.0, 0.1, hydro::RateHistory(starts, rates)});
  }
  const double sx[7] = {300, 1200, 2600, 5000, -6000, 9000, 20000}, sy[7] = {-200, -900, 1700, 5000, -3000, 1000, 0};
  for (int i = 0; i < 7; ++i)
    in.segments.push_back({std::string("F:").append(std::to_string(i)), (20.0 + 15.0 * i) * kPi / 180, 80.0 * kPi / 180,
                           {{sx[i] - 500, sy[i]}, {sx[i] + 500, sy[i] + 50}}, std::nullopt});
  for (int m = 1; m <= tracked; ++m) in.tracking_times.push_back(t0 + m * 30 * day + 2 * day);
  for (int y = 1; y <= years; ++y) in.output_times.push_back(t0 + y * 365 * day);
  return in;
}

bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0);
}

// Every result of `a` equals `b`'s bit for bit.
void same_screen(const ScreenResult& x, const ScreenResult& y) {
  CHECK(x.radius_clamped == y.radius_clamped);
  REQUIRE(x.segments.size() == y.segments.size());
  for (std::size_t s = 0; s < y.segments.size(); ++s) {
    CAPTURE(s);
    const SegmentScreen &a = x.segments[s], &b = y.segments[s];
    CHECK(same_bits(a.dp, b.dp));
    CHECK(a.dp_point == b.dp_point);
    CHECK(same_bits(a.well_share, b.well_share));
    CHECK(a.first_crossing == b.first_crossing);
    CHECK(same_bits(a.crossing_share, b.crossing_share));
    CHECK(a.leading_well == b.leading_well);
    CHECK(same_bits(a.leading_share, b.leading_share));
    CHECK(a.crossing_well == b.crossing_well);
    CHECK(std::memcmp(&a.crossing_well_share, &b.crossing_well_share, sizeof(double)) == 0);
    CHECK(same_bits(a.tracked_dp, b.tracked_dp));
    CHECK(std::memcmp(&a.peak_dp, &b.peak_dp, sizeof(double)) == 0);
    CHECK(std::memcmp(&a.peak_time, &b.peak_time, sizeof(double)) == 0);
    CHECK(std::memcmp(&a.dp_crit, &b.dp_crit, sizeof(double)) == 0);
  }
}

}  // namespace

TEST_CASE("split_segments cuts the segments into near-equal runs that cover them once, in order") {
  for (std::size_t n : {0u, 1u, 7u, 64u, 1000u})
    for (std::size_t parts : {1u, 2u, 3u, 8u}) {
      std::size_t next = 0, smallest = n, largest = 0;
      for (std::size_t p = 0; p < parts; ++p) {
        const SegmentRange r = split_segments(n, p, parts);
        CHECK(r.first == next);
        next = r.end;
        smallest = std::min(smallest, r.end - r.first);
        largest = std::max(largest, r.end - r.first);
      }
      CHECK(next == n);
      CHECK(largest - smallest <= 1);
    }
  CHECK_THROWS_AS(split_segments(10, 2, 2), InputError);
}

TEST_CASE("the deterministic screen split into parts and merged equals the whole screen bit for bit") {
  for (bool all_shares : {true, false}) {  // every well's share, or the leading well's only
    ScreenInputs in = split_inputs();
    in.all_well_shares = all_shares;
    CAPTURE(all_shares);
    const ScreenResult whole = deterministic_screen(in);
    std::size_t crossed = 0;
    for (const auto& s : whole.segments) crossed += s.first_crossing ? 1 : 0;
    REQUIRE(crossed > 0);            // the case exercises crossings and their shares ...
    REQUIRE(crossed < in.segments.size());  // ... and segments that never cross
    for (std::size_t parts : {2u, 3u}) {
      CAPTURE(parts);
      ScreenResult merged = deterministic_screen(in, nullptr, nullptr, split_segments(in.segments.size(), 0, parts));
      for (std::size_t p = 1; p < parts; ++p) {
        const SegmentRange mine = split_segments(in.segments.size(), p, parts);
        const ScreenResult part = deterministic_screen(in, nullptr, nullptr, mine);
        CHECK(part.segments[0].tracked_dp == std::vector<double>(whole.segments[0].tracked_dp.size(), 0.0));  // not its segment
        merge_screen_part(merged, encode_screen_part(part, mine));
      }
      same_screen(merged, whole);
    }
  }
}

TEST_CASE("a malformed or misfitting part of the deterministic screen is refused") {
  const ScreenInputs in = split_inputs();
  ScreenResult into = deterministic_screen(in, nullptr, nullptr, split_segments(in.segments.size(), 0, 2));
  const SegmentRange mine = split_segments(in.segments.size(), 1, 2);
  std::vector<std::uint8_t> good = encode_screen_part(deterministic_screen(in, nullptr, nullptr, mine), mine);
  std::vector<std::uint8_t> truncated(good.begin(), good.end() - 8);
  CHECK_THROWS_AS(merge_screen_part(into, truncated), InputError);
  std::vector<std::uint8_t> odd(good.begin(), good.end() - 3);
  CHECK_THROWS_AS(merge_screen_part(into, odd), InputError);
  std::vector<std::uint8_t> header = good;
  header[0] ^= 1;
  CHECK_THROWS_AS(merge_screen_part(into, header), InputError);
  ScreenInputs fewer = in;
  fewer.output_times.pop_back();  // a part of a run with other output times
  ScreenResult other = deterministic_screen(fewer, nullptr, nullptr, split_segments(in.segments.size(), 0, 2));
  CHECK_THROWS_AS(merge_screen_part(other, good), InputError);
  merge_screen_part(into, good);  // the well-formed part still fits

  // A part naming a well the receiving screen does not have (a run with other wells).
  ScreenInputs lean = in;
  lean.all_well_shares = false;
  const ScreenResult lean_part = deterministic_screen(lean, nullptr, nullptr, mine);
  bool names_second = false;
  for (std::size_t s = mine.first; s < mine.end; ++s)
    for (std::size_t w : lean_part.segments[s].leading_well) names_second = names_second || w == 1;
  REQUIRE(names_second);
  lean.wells.pop_back();
  ScreenResult one_well = deterministic_screen(lean, nullptr, nullptr, split_segments(in.segments.size(), 0, 2));
  CHECK_THROWS_AS(merge_screen_part(one_well, encode_screen_part(lean_part, mine)), InputError);
}

TEST_CASE("the deterministic screen built by blocks of wells equals the screen with every table at once") {
  // A block budget of one byte builds the tables well by well (three wells, images included);
  // a point adds its wells in order whatever the blocks (deterministic_screen.cpp, tabulate).
  ScreenInputs in = split_inputs();
  in.wells.push_back({"W2", -3000.0, 800.0, 0.1, hydro::RateHistory({in.wells[0].history.changes().front().time}, {1.5})});
  in.boundaries.push_back({hydro::BoundaryKind::no_flow, 0.0, -30000.0, 1.0, 0.0});
  const ScreenResult whole = deterministic_screen(in);
  ScreenInputs by_well = in;
  by_well.table_block_bytes = 1.0;
  same_screen(deterministic_screen(by_well), whole);
  // ... and so does each part of a split screen.
  const SegmentRange mine = split_segments(in.segments.size(), 1, 2);
  ScreenResult part = deterministic_screen(by_well, nullptr, nullptr, mine), ref = deterministic_screen(in, nullptr, nullptr, mine);
  same_screen(part, ref);
}

TEST_CASE("the deterministic screen shared by tracked times across parts equals the whole screen bit for bit") {
  // Parts simulated by threads exchange their table Δp (deterministic_screen.cpp, tabulate): each
  // builds the tables at every parts-th tracked time for every check point. Theis and leaky
  // formations, with a no-flow boundary (image wells), and with one well per table block. The
  // leaky case spans 14 months, not five years, with one well per block only (its lag kernel took
  // about 11 s per screen over five years).
  const std::pair<double, double> cases[] = {{0.0, hydro::kTableBlockBytes}, {0.0, 1.0}, {1e-9, 1.0}};  // leakage, block
  for (const auto& [leakage, block] : cases) {
    ScreenInputs in = leakage > 0.0 ? split_inputs(12, 14, 1) : split_inputs();
    in.boundaries.push_back({hydro::BoundaryKind::no_flow, 0.0, -30000.0, 1.0, 0.0});
    in.formation.leakage_rate = leakage;
    in.table_block_bytes = block;
    CAPTURE(leakage);
    CAPTURE(block);
    const ScreenResult whole = deterministic_screen(in);
    for (std::size_t parts : {2u, 3u}) {
      CAPTURE(parts);
      threads::Exchange exchange(parts);
      std::vector<ScreenResult> got(parts);
      std::vector<std::thread> workers;
      for (std::size_t p = 0; p < parts; ++p)
        workers.emplace_back([&, p] {
          const util::WorkShare share{p, parts, [&, p](std::vector<std::uint8_t> b) { return exchange.all(p, std::move(b)); }};
          got[p] = deterministic_screen(in, nullptr, nullptr, split_segments(in.segments.size(), p, parts), &share);
        });
      for (auto& w : workers) w.join();
      for (std::size_t p = 1; p < parts; ++p)
        merge_screen_part(got[0], encode_screen_part(got[p], split_segments(in.segments.size(), p, parts)));
      same_screen(got[0], whole);
    }
  }
}
