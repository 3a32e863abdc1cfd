// Splitting the deterministic screen across processes; see screen_split.hpp.
#include "core/screen/screen_split.hpp"

#include <algorithm>
#include <bit>
#include <string>

#include "core/errors.hpp"
#include "core/util/word_codec.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::screen {
namespace {

constexpr std::uint64_t kMagic = 0x736c697073637232ULL;  // "slipscr2": this encoding's version
constexpr const char* kWhat = "an encoded part of the deterministic screen (screen_split.hpp)";

// The lengths a segment's vectors must have in `into`.
void check_length(const util::WordReader& r, std::size_t got, std::size_t want, const char* field) {
  if (got != want) r.fail(std::string(field) + " of " + std::to_string(got) + " values where " + std::to_string(want) + " fit");
}

// A well index must name one of the screen's wells.
void check_well(const util::WordReader& r, std::size_t index, std::size_t wells, const char* field) {
  if (index >= std::max<std::size_t>(wells, 1))
    r.fail(std::string(field) + " " + std::to_string(index) + " of " + std::to_string(wells) + " wells");
}

}  // namespace

SegmentRange split_segments(std::size_t segments, std::size_t part, std::size_t parts) {
  const auto [first, end] = util::part_range(segments, part, parts);
  return {first, end};
}

std::vector<std::uint8_t> encode_screen_part(const ScreenResult& result, SegmentRange range) {
  const std::size_t end = std::min(range.end, result.segments.size()), first = std::min(range.first, end);
  util::WordWriter w;
  std::size_t words = 4;  // reserved whole: tens of megabytes for a regional review
  for (std::size_t s = first; s < end; ++s) {
    const SegmentScreen& g = result.segments[s];
    words += 13 + g.dp.size() + g.dp_point.size() + g.well_share.size() + g.leading_well.size() +
             g.leading_share.size() + g.crossing_share.size() + g.tracked_dp.size();
  }
  w.reserve(words);
  w.word(kMagic);
  w.word(first);
  w.word(end);
  w.word(result.radius_clamped ? 1 : 0);
  for (std::size_t s = first; s < end; ++s) {
    const SegmentScreen& g = result.segments[s];
    w.doubles(g.dp);
    w.sizes(g.dp_point);
    w.doubles(g.well_share);
    w.sizes(g.leading_well);
    w.doubles(g.leading_share);
    w.word(g.first_crossing ? 1 : 0);
    w.word(std::bit_cast<std::uint64_t>(g.first_crossing.value_or(0.0)));
    w.doubles(g.crossing_share);
    w.word(g.crossing_well);
    w.word(std::bit_cast<std::uint64_t>(g.crossing_well_share));
    w.doubles(g.tracked_dp);
    w.word(std::bit_cast<std::uint64_t>(g.peak_dp));
    w.word(std::bit_cast<std::uint64_t>(g.peak_time));
  }
  return std::move(w).bytes();
}

void merge_screen_part(ScreenResult& into, std::span<const std::uint8_t> bytes) {
  util::WordReader r(bytes, kWhat);
  if (r.word() != kMagic) r.fail("an unknown header");
  const std::uint64_t first = r.word(), end = r.word();
  if (end < first || end > into.segments.size())
    r.fail("segments " + std::to_string(first) + " to " + std::to_string(end) + " of " +
           std::to_string(into.segments.size()));
  const std::uint64_t clamped = r.word();
  if (clamped > 1) r.fail("a clamped flag of " + std::to_string(clamped));
  into.radius_clamped = into.radius_clamped || clamped == 1;
  for (std::size_t s = first; s < end; ++s) {
    SegmentScreen& g = into.segments[s];
    const std::size_t K = g.dp.size(), KW = g.well_share.size(), G = g.tracked_dp.size();
    g.dp = r.doubles();
    check_length(r, g.dp.size(), K, "dp");
    g.dp_point = r.sizes();
    check_length(r, g.dp_point.size(), K, "dp_point");
    g.well_share = r.doubles();
    check_length(r, g.well_share.size(), KW, "well_share");
    g.leading_well = r.sizes();
    check_length(r, g.leading_well.size(), K, "leading_well");
    g.leading_share = r.doubles();
    check_length(r, g.leading_share.size(), K, "leading_share");
    for (std::size_t v : g.leading_well) check_well(r, v, into.well_count, "leading_well");
    const std::uint64_t crossed = r.word();
    const double at = std::bit_cast<double>(r.word());
    if (crossed > 1) r.fail("a crossing flag of " + std::to_string(crossed));
    g.first_crossing.reset();
    if (crossed == 1) g.first_crossing = at;
    g.crossing_share = r.doubles();
    g.crossing_well = r.word();
    check_well(r, g.crossing_well, into.well_count, "crossing_well");
    g.crossing_well_share = std::bit_cast<double>(r.word());
    g.tracked_dp = r.doubles();
    check_length(r, g.tracked_dp.size(), G, "tracked_dp");
    g.peak_dp = std::bit_cast<double>(r.word());
    g.peak_time = std::bit_cast<double>(r.word());
  }
  if (!r.done()) r.fail("words after the end");
}

}  // namespace slipscreen::screen
