#pragma once
// Splitting the probabilistic screen across processes (docs/cluster.md).
//
// Every process samples every realization and builds the same tables; the segments are cut
// into near-equal ranges (split_rows), and each process builds the surrogate of its own
// segments' check points only (pressure_model.hpp; every point's values bit for bit those of
// the whole model) and tracks its segments over every realization, exactly as one process
// tracks them: the same products in the same blocks, the same sketches, sensitivities and
// median attribution. Nothing but finished segments needs merging. The probability maps are
// split by realizations: a fixed range of columns (valid realizations in index order) per
// process, whose boundaries are multiples of kSplitAlign, the slip tracker's block of matrix
// products, so each process evaluates exactly the products of the single-process run; their
// integer counts sum exactly.
// (The segments were first split by realizations as the maps are; measured on the regional
// case, docs/cluster.md, the surrogate's exchange and the recomputation of every realization's
// Δp for the sensitivities cost more than the split saved.)
//
// No communication happens here (src/core has no I/O): the caller supplies `gather`, which the
// run layer implements with MPI (run/mpi_cluster.hpp).
#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <span>
#include <vector>

#include "core/stats/quantile_sketch.hpp"
#include "core/stats/weighted_sketch.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::probabilistic {

inline constexpr std::size_t kSplitAlign = 256;  // = the slip tracker's kBlock

// Columns [begin, end) of the valid realizations.
struct ColumnRange {
  std::size_t begin = 0, end = 0;
  std::size_t size() const noexcept { return end - begin; }
  bool operator==(const ColumnRange&) const = default;
};

// Part `part` of `parts` over `columns` valid realizations: near-equal blocks of whole
// kSplitAlign groups, in order (later parts may be empty when there are few groups).
ColumnRange split_columns(std::size_t columns, std::size_t part, std::size_t parts);

// A segment's weighted accumulators when the run is conditioned on observations
// (conditioning.hpp): fixed-point weights, so they sum exactly in any order. Empty otherwise.
struct ConditionedCounts {
  std::vector<std::uint64_t> slipped_by;  // per output time: Σ weight units of injection-induced slips by then
  std::uint64_t already_critical = 0;     // Σ weight units of realizations with Δp_crit ≤ 0
  stats::WeightedSketch dp_crit;          // finite Δp_crit values (Pa)
  std::vector<stats::WeightedSketch> dp;  // per output time: Δp (Pa), max over check points
  bool operator==(const ConditionedCounts&) const = default;
};

// Well attribution of a segment's median Δp at one output time. The median realization is the
// valid realization of rank ⌊(n − 1)/2⌋ (0-based, the sketches' rank convention) when the n
// valid realizations are ordered by their Δp at the segment at that time (fast path, max over
// check points), ties by realization index. Its inputs are reproducible from its stream
// (seed, realization). At the check point holding that maximum (the first one on ties), each
// well's contribution is evaluated from its similarity table (every source of the well, with
// its sign, the realization's D, μ/(4π k h) and rate factors). Σ well_dp equals `dp` to the
// surrogate's accuracy (max_relative_error()); shares are well_dp / Σ well_dp.
struct MedianAttribution {
  std::uint64_t realization = 0;  // realization index i (not the rank among valid ones)
  double dp = 0.0;                // Pa, the median realization's Δp at the segment (fast path)
  std::size_t check_point = 0;    // index in the segment's check points (holding the maximum)
  std::vector<double> well_dp;    // Pa, per well
  // Well w's share of Σ well_dp (0 when the sum is ≤ 0).
  double share(std::size_t w) const;
  bool operator==(const MedianAttribution&) const = default;
};

// What a segment's results need from every realization: the sensitivities (Spearman ρ with the
// slip margin) and the median attribution.
struct FinishedSegment {
  std::vector<double> sensitivity;
  std::vector<MedianAttribution> median;
  bool operator==(const FinishedSegment&) const = default;
};

// Part `part` of `parts` over `n` rows (segments): near-equal runs, in order.
ColumnRange split_rows(std::size_t n, std::size_t part, std::size_t parts);

// One segment's results over every realization, before what needs all of them at once.
struct SegmentPart {
  std::vector<std::uint64_t> slipped_by, first_slip;
  std::uint64_t already_critical = 0, never_critical = 0;
  stats::QuantileSketch dp_crit;
  std::vector<stats::QuantileSketch> dp;  // per output time
  std::vector<std::vector<std::uint64_t>> what_if;  // per what-if variant: slips by output time
  ConditionedCounts conditioned;          // empty unless conditioned on observations
  bool operator==(const SegmentPart&) const = default;
};

// One process's share: its segments, whole, and its block of the map counts.
struct PartialResult {
  std::size_t first_segment = 0;           // segments [first_segment, + segments.size()) tracked here
  std::vector<SegmentPart> segments;
  std::vector<FinishedSegment> finished;   // the same segments
  double surrogate_error = 0.0;            // over this part's check points (hydro::PointRange)
  ColumnRange columns;                     // the valid realizations of the map counts
  std::vector<std::uint64_t> map_dangerous, map_oriented;
  std::uint64_t map_dangerous_already_critical = 0, map_oriented_already_critical = 0;
  bool operator==(const PartialResult&) const = default;
};

// Flat encoding for sending between processes; decode_partial(encode_partial(p)) == p.
// decode_partial throws InputError on a truncated or malformed buffer.
std::vector<std::uint8_t> encode_partial(const PartialResult& p);
PartialResult decode_partial(std::span<const std::uint8_t> bytes);

// Merges parts whose segment ranges and column ranges each follow each other from 0 (InputError
// otherwise, or if their map counts differ in shape): segments concatenated, map counts summed,
// the largest surrogate error.
PartialResult merge_partials(std::vector<PartialResult> parts);

// How run_probabilistic splits: this process's part and the exchange. `gather` is called by
// every part the same number of times, each with an encoded PartialResult holding the next
// round of its finished segments (slip_probability.cpp merge_split; part 0's own pieces are
// empty, as it keeps its result); the run layer calls it before that for the deterministic
// screen's segments (screen/screen_split.hpp). On part 0 it returns every part's bytes in part
// order, elsewhere nothing (and run_probabilistic then returns only the run-level fields, with
// ProbabilisticResult::merged_elsewhere set).
struct RealizationSplit {
  std::size_t part = 0, parts = 1;
  std::function<std::optional<std::vector<std::vector<std::uint8_t>>>(std::vector<std::uint8_t>)> gather;
  // Every part's piece to every part (util::WorkShare): the leaky model's tables are built
  // together, and so is the whole surrogate when every part needs it (the allowable rate, the
  // seismicity likelihood). Empty: every part builds what it needs itself.
  std::function<std::vector<std::vector<std::uint8_t>>(std::vector<std::uint8_t>)> all_gather;
  util::WorkShare work_share() const { return {part, parts, all_gather}; }
};

}  // namespace slipscreen::probabilistic
