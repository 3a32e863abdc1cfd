#include "core/stats/slip_counts.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"
#include "core/stats/random_stream.hpp"

using namespace slipscreen;
using stats::SlipCounts;

namespace {
// A reproducible pseudo-outcome of realization i for a segment: 0 already critical,
// 1..times first slip at times − 1, times + 1 no slip.
void record(SlipCounts& c, std::size_t segment, std::uint64_t i) {
  stats::RandomStream s(3, i * 31 + segment);
  const auto outcome = s.below(c.times() + 2);
  if (outcome == 0)
    c.record_already_critical(segment);
  else if (outcome <= c.times())
    c.record_first_slip(segment, outcome - 1);
  else
    c.record_no_slip(segment);
}
}  // namespace

TEST_CASE("counts accumulate per segment and time, cumulatively") {
  SlipCounts c(2, 3);
  c.record_already_critical(0);
  c.record_first_slip(0, 1);
  c.record_first_slip(0, 1);
  c.record_first_slip(0, 2);
  c.record_no_slip(0);
  c.record_first_slip(1, 0);
  CHECK(c.realizations(0) == 5);
  CHECK(c.already_critical(0) == 1);
  // Slipped by t0: none; by t1: two; by t2: three (cumulative; critical ones apart).
  CHECK(c.slipped_by(0, 0) == 0);
  CHECK(c.slipped_by(0, 1) == 2);
  CHECK(c.slipped_by(0, 2) == 3);
  CHECK(c.realizations(1) == 1);
  CHECK(c.slipped_by(1, 0) == 1);
  CHECK(c.slipped_by(1, 2) == 1);
}

TEST_CASE("merging split realizations equals one accumulator") {
  constexpr std::size_t segments = 5, times = 6;
  SlipCounts whole(segments, times), part_a(segments, times), part_b(segments, times), part_c(segments, times);
  for (std::uint64_t i = 0; i < 1000; ++i)
    for (std::size_t s = 0; s < segments; ++s) record(whole, s, i);
  // Split across three "processes" by realization, in another order.
  for (std::uint64_t i = 1000; i-- > 0;)
    for (std::size_t s = 0; s < segments; ++s) record(i % 3 == 0 ? part_a : i % 3 == 1 ? part_b : part_c, s, i);
  SlipCounts merged = part_c;
  merged.merge(part_a);
  merged.merge(part_b);
  CHECK(merged == whole);
  // Split by segment: each process records only its own segments.
  SlipCounts low(segments, times), high(segments, times);
  for (std::uint64_t i = 0; i < 1000; ++i)
    for (std::size_t s = 0; s < segments; ++s) record(s < 2 ? low : high, s, i);
  low.merge(high);
  CHECK(low == whole);
  // Monotone in time, and bounded by the realizations.
  for (std::size_t s = 0; s < segments; ++s) {
    CHECK(whole.realizations(s) == 1000);
    for (std::size_t t = 1; t < times; ++t) CHECK(whole.slipped_by(s, t) >= whole.slipped_by(s, t - 1));
    CHECK(whole.slipped_by(s, times - 1) + whole.already_critical(s) <= 1000);
  }
}

TEST_CASE("bad indices and shapes are clear errors") {
  SlipCounts c(2, 3);
  CHECK_THROWS_AS(c.record_first_slip(2, 0), InputError);
  CHECK_THROWS_AS(c.record_first_slip(0, 3), InputError);
  CHECK_THROWS_AS(c.slipped_by(0, 3), InputError);
  CHECK_THROWS_AS(c.merge(SlipCounts(2, 4)), InputError);
  CHECK_THROWS_AS(SlipCounts(2, 0), InputError);
}
