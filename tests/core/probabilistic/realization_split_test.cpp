#include "support/thread_exchange.hpp"
#include "core/probabilistic/realization_split.hpp"

#include <doctest/doctest.h>

#include <exception>
#include <thread>

#include <bit>
#include <numbers>

#include "core/errors.hpp"
#include "core/probabilistic/slip_probability.hpp"
#include "strike_slip_case.hpp"

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

namespace {
constexpr double kDeg = std::numbers::pi / 180.0;

// Fictional case: the three-segment layout (strike_slip_case.hpp) with uncertain permeability,
// friction, rate and strike, a 3 × 2 map; 700 realizations (three blocks of 256).
struct SplitCase {
  UncertainModel model = test::strike_slip_model();
  std::vector<WellInput> wells;
  std::vector<SegmentInput> segments;
  RunSettings settings;
  SplitCase() {
    model.permeability = Distribution::lognormal(2e-14, 0.5);
    model.friction = Distribution::uniform(0.5, 0.7);
    model.rate_factor = Distribution::uniform(0.8, 1.2);
    model.strike_perturbation = Distribution::normal(0.0, 5 * kDeg);
    test::three_segment_layout(wells, segments, settings);
    settings.realizations = 700;
    settings.seed = 11;
    for (double x : {500.0, 2000.0, 6000.0})
      for (double y : {0.0, 1000.0}) settings.map_points.push_back({x, y});
    settings.map_strike = 15 * kDeg;
    settings.map_dip = 80 * kDeg;
    // A what-if variant: the first well at half its rates (its counts merge like the screen's).
    GroupSplit half;
    half.wells = wells;
    for (std::size_t w = 0; w < wells.size(); ++w) {
      half.origin.push_back(w);
      half.in_group.push_back(w == 0);
    }
    half.factor = 0.5;
    settings.what_if.push_back(half);
  }
};

// Runs the case split into `parts` processes, simulated by threads: the realization blocks are
// gathered to part 0, and (with `share`) the pressure model's tables and surrogate are built
// together. Returns part 0's result; the others must have merged elsewhere.
ProbabilisticResult run_split(const SplitCase& c, std::size_t parts, bool share = true) {
  slipscreen::threads::Exchange exchange(parts);
  std::vector<ProbabilisticResult> results(parts);
  std::vector<std::exception_ptr> errors(parts);
  std::vector<std::thread> threads;
  for (std::size_t p = 0; p < parts; ++p)
    threads.emplace_back([&, p] {
      try {
        RealizationSplit split;
        split.part = p;
        split.parts = parts;
        split.gather = [&, p](std::vector<std::uint8_t> b) -> std::optional<std::vector<std::vector<std::uint8_t>>> {
          auto all = exchange.all(p, std::move(b));
          if (p != 0) return std::nullopt;
          return all;
        };
        if (share) split.all_gather = [&, p](std::vector<std::uint8_t> b) { return exchange.all(p, std::move(b)); };
        results[p] = run_probabilistic(c.model, c.wells, c.segments, c.settings, &split);
      } catch (...) {
        errors[p] = std::current_exception();
      }
    });
  for (auto& t : threads) t.join();
  for (auto& e : errors)
    if (e) std::rethrow_exception(e);
  for (std::size_t p = 1; p < parts; ++p) {
    CHECK(results[p].merged_elsewhere);
    CHECK(results[p].segments.empty());
  }
  return std::move(results[0]);
}

// Bit for bit (a constant input's ρ is NaN, which == would call different).
bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (std::bit_cast<std::uint64_t>(a[i]) != std::bit_cast<std::uint64_t>(b[i])) return false;
  return true;
}

void check_identical(const ProbabilisticResult& a, const ProbabilisticResult& b) {
  CHECK_FALSE(b.merged_elsewhere);
  CHECK(a.realizations == b.realizations);
  CHECK(a.surrogate_error == b.surrogate_error);
  REQUIRE(a.segments.size() == b.segments.size());
  for (std::size_t s = 0; s < a.segments.size(); ++s) {
    const auto& x = a.segments[s];
    const auto& y = b.segments[s];
    CHECK(x.slipped_by == y.slipped_by);
    CHECK(x.first_slip == y.first_slip);
    CHECK(x.already_critical == y.already_critical);
    CHECK(x.never_critical == y.never_critical);
    CHECK(x.dp_crit == y.dp_crit);
    CHECK(x.dp == y.dp);
    CHECK(x.conditioned == y.conditioned);
    CHECK(same_bits(x.sensitivity, y.sensitivity));
    REQUIRE(x.median.size() == y.median.size());
    for (std::size_t t = 0; t < x.median.size(); ++t) {
      CHECK(x.median[t].realization == y.median[t].realization);
      CHECK(x.median[t].dp == y.median[t].dp);
      CHECK(x.median[t].well_dp == y.median[t].well_dp);
    }
  }
  CHECK(a.what_if == b.what_if);
  CHECK(a.map_dangerous == b.map_dangerous);
  CHECK(a.map_oriented == b.map_oriented);
  CHECK(a.map_dangerous_already_critical == b.map_dangerous_already_critical);
  CHECK(a.map_oriented_already_critical == b.map_oriented_already_critical);
}

}  // namespace

TEST_CASE("split_columns: contiguous blocks of whole 256-column groups covering every column") {
  for (std::size_t n : {0u, 1u, 255u, 256u, 700u, 10000u})
    for (std::size_t parts : {1u, 2u, 3u, 7u}) {
      std::size_t next = 0;
      for (std::size_t p = 0; p < parts; ++p) {
        const ColumnRange r = split_columns(n, p, parts);
        CHECK(r.begin == next);
        CHECK(r.end >= r.begin);
        if (r.end != n) CHECK(r.end % kSplitAlign == 0);
        next = r.end;
      }
      CHECK(next == n);
    }
  // 700 columns in 3 parts: 256, 256, 188.
  CHECK(split_columns(700, 1, 3) == ColumnRange{256, 512});
  CHECK(split_columns(700, 2, 3) == ColumnRange{512, 700});
  CHECK_THROWS_AS(split_columns(10, 3, 3), InputError);
}

TEST_CASE("encode_partial/decode_partial round trip; truncated buffers are refused") {
  PartialResult p;
  p.first_segment = 1;
  p.surrogate_error = 3.25e-6;
  p.columns = {256, 300};
  SegmentPart s;
  s.slipped_by = {1, 2};
  s.first_slip = {0, 1, 1};
  s.already_critical = 3;
  s.never_critical = 4;
  s.dp_crit.add(1.5e6);
  s.dp_crit.add(-2e5);
  s.dp.assign(2, stats::QuantileSketch());
  s.dp[1].add(3e5);
  s.what_if = {{1, 2}, {0, 3}};
  p.segments = {s, s};
  p.finished = {{{0.25, -0.5}, {{7, 2.5e5, 1, {1e5, 1.5e5}}, {9, 0.0, 0, {0.0, 0.0}}}}, {{0.125}, {}}};
  p.map_dangerous = {5, 6};
  p.map_dangerous_already_critical = 7;
  const auto bytes = encode_partial(p);
  CHECK(decode_partial(bytes) == p);
  CHECK_THROWS_AS(decode_partial(std::span(bytes).first(bytes.size() - 8)), InputError);
  CHECK_THROWS_AS(decode_partial(std::span(bytes).first(bytes.size() - 3)), InputError);
  // A finished segment missing for a tracked one.
  PartialResult q = p;
  q.finished.pop_back();
  CHECK_THROWS_AS(decode_partial(encode_partial(q)), InputError);
}

TEST_CASE("merge_partials: segments concatenated, map counts summed, the largest surrogate error") {
  PartialResult a, b;
  SegmentPart s;
  s.slipped_by = {4, 5};
  a.segments = {s};
  a.finished = {{{0.5}, {}}};
  a.surrogate_error = 2e-6;
  a.columns = {0, 256};
  a.map_dangerous = {1, 2};
  s.slipped_by = {6, 7};
  b.first_segment = 1;
  b.segments = {s, s};
  b.finished = {{{0.25}, {}}, {{0.125}, {}}};
  b.surrogate_error = 5e-6;
  b.columns = {256, 300};
  b.map_dangerous = {10, 20};
  b.map_dangerous_already_critical = 3;
  const PartialResult m = merge_partials({a, b});
  CHECK(m.first_segment == 0);
  REQUIRE(m.segments.size() == 3);
  CHECK(m.segments[0].slipped_by == std::vector<std::uint64_t>{4, 5});
  CHECK(m.segments[2].slipped_by == std::vector<std::uint64_t>{6, 7});
  REQUIRE(m.finished.size() == 3);
  CHECK(m.finished[2].sensitivity == std::vector<double>{0.125});
  CHECK(m.surrogate_error == 5e-6);
  CHECK(m.columns == ColumnRange{0, 300});
  CHECK(m.map_dangerous == std::vector<std::uint64_t>{11, 22});
  CHECK(m.map_dangerous_already_critical == 3);
  // Refused: columns that do not follow, segments that do not follow, a finished segment missing.
  PartialResult c = b;
  c.columns = {300, 400};
  CHECK_THROWS_AS(merge_partials({a, c}), InputError);
  c = b;
  c.first_segment = 2;
  CHECK_THROWS_AS(merge_partials({a, c}), InputError);
  c = b;
  c.finished.pop_back();
  CHECK_THROWS_AS(merge_partials({a, c}), InputError);
  c = a;  // the first part is checked too
  c.finished.clear();
  CHECK_THROWS_AS(merge_partials({c, b}), InputError);
}

TEST_CASE("run_probabilistic split into 2 and 3 parts gives the unsplit result bit for bit") {
  const SplitCase c;
  const ProbabilisticResult whole = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  // The case must exercise the counts: some segment slips in some but not all realizations.
  bool partial_slip = false;
  for (const auto& s : whole.segments)
    partial_slip |= s.slipped_by.back() > 0 && s.slipped_by.back() < whole.realizations;
  CHECK(partial_slip);
  // ... and the variant must differ from the base somewhere.
  REQUIRE(whole.what_if.size() == 1);
  bool variant_moves = false;
  for (std::size_t s = 0; s < whole.segments.size(); ++s) variant_moves |= whole.what_if[0][s] != whole.segments[s].slipped_by;
  CHECK(variant_moves);
  for (std::size_t parts : {2u, 3u}) {
    CAPTURE(parts);
    check_identical(whole, run_split(c, parts));         // tables and surrogate built together
    check_identical(whole, run_split(c, parts, false));  // every part builds them itself
  }
}

TEST_CASE("a split run tracking its segments in chunks of the surrogate, merged in rounds, gives the unsplit result bit for bit") {
  SplitCase c;
  c.settings.what_if.clear();
  const ProbabilisticResult whole = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(c.segments.size() == 3);
  c.settings.surrogate_chunk_bytes = 1.0;  // one segment per chunk: part 0 of 2 holds one, part 1 two
  for (std::size_t parts : {2u, 3u}) {
    CAPTURE(parts);
    check_identical(whole, run_split(c, parts));
    check_identical(whole, run_split(c, parts, false));
  }
  c.settings.merge_segments = 1;  // the merge in rounds of one segment: part 1 of 2 sends two rounds
  check_identical(whole, run_split(c, 2));
  // With a what-if variant a part keeps its segments in one chunk, whatever the budget.
  SplitCase v;
  v.settings.surrogate_chunk_bytes = 1.0;
  check_identical(run_probabilistic(v.model, v.wells, v.segments, v.settings), run_split(v, 2));
}

TEST_CASE("a run conditioned on pressure observations split into 2 and 3 parts gives the unsplit result bit for bit") {
  SplitCase c;
  // Two fictional observations at 2.5 km from the well (after 2 and 5 years, 30-day years).
  constexpr double day = 86400.0;
  c.settings.observations = {{2500.0, 0.0, 2 * 360 * day, 0.6e6, 0.1e6}, {0.0, 2500.0, 5 * 360 * day, 0.9e6, 0.1e6}};
  const ProbabilisticResult whole = run_probabilistic(c.model, c.wells, c.segments, c.settings);
  REQUIRE(whole.conditioning);
  CHECK(whole.conditioning->weights.n_eff < 0.9 * static_cast<double>(whole.realizations));  // the data weigh
  for (std::size_t parts : {2u, 3u}) {
    CAPTURE(parts);
    const ProbabilisticResult split = run_split(c, parts);
    check_identical(whole, split);
    REQUIRE(split.conditioning);
    CHECK(split.conditioning->weights.units == whole.conditioning->weights.units);
  }
}
