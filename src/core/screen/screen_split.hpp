#pragma once
// Splitting the deterministic screen across processes (docs/cluster.md): part p of n computes
// the pressure at its range of segments (deterministic_screen's `only`), encodes those
// segments' pressure results, and part 0 writes every other part's into its own result. Each
// segment's values are those of a whole run (the tables span every check point), so the merged
// result equals the unsplit one bit for bit. No communication here (src/core has no I/O).
#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

#include "core/screen/deterministic_screen.hpp"

namespace slipscreen::screen {

// Part `part` of `parts` over `segments`: near-equal runs of whole segments, in order.
// InputError when part ≥ parts.
SegmentRange split_segments(std::size_t segments, std::size_t part, std::size_t parts);

// The pressure results of the segments in `range` (and whether a check point was clamped).
std::vector<std::uint8_t> encode_screen_part(const ScreenResult& result, SegmentRange range);

// Writes an encoded part's segments into `into` (same inputs, so the same segment count and
// shapes); InputError on a malformed block or one that does not fit.
void merge_screen_part(ScreenResult& into, std::span<const std::uint8_t> bytes);

}  // namespace slipscreen::screen
