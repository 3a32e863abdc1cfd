#pragma once
// Mergeable counts of fault-segment slip over the output times, across realizations.
//
// A realization's outcome for one segment is one of: already critical before any injection
// (Δp_crit ≤ 0, counted apart and never folded into the injection-induced counts), slipped
// first by output time k (the Coulomb threshold was crossed at some time t' ≤ t_k), or did
// not slip by the last output time. The counts are integers, so merging the counts of
// realizations split across threads or processes (element-wise sums, e.g. an MPI sum
// reduction over raw()) gives exactly the single-process result. Splitting by segment works
// the same way: a process leaves the segments it does not own at zero.
//
// P(slip by t_k) = slipped_by(s, k) / realizations(s) is non-decreasing in k by construction
// (a cumulative sum of first-slip counts).
#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

namespace slipscreen::stats {

class SlipCounts {
 public:
  SlipCounts(std::size_t segments, std::size_t times);

  std::size_t segments() const noexcept { return segments_; }
  std::size_t times() const noexcept { return times_; }

  // Record one realization's outcome for `segment` (InputError for an index out of range).
  void record_already_critical(std::size_t segment);
  void record_first_slip(std::size_t segment, std::size_t first_time);  // first output time index
  void record_no_slip(std::size_t segment);

  // Realizations recorded for the segment (all outcomes).
  std::uint64_t realizations(std::size_t segment) const;
  // Realizations already critical before injection.
  std::uint64_t already_critical(std::size_t segment) const;
  // Realizations not critical before injection whose threshold was crossed by output time
  // `time` (cumulative; non-decreasing in time).
  std::uint64_t slipped_by(std::size_t segment, std::size_t time) const;

  // Element-wise sum (InputError if the shapes differ). Exact.
  void merge(const SlipCounts& other);

  // The counts as one array (layout: per segment, `times` first-slip counts, then no-slip,
  // then already-critical), for a sum reduction across processes.
  std::span<const std::uint64_t> raw() const noexcept { return counts_; }
  std::span<std::uint64_t> raw() noexcept { return counts_; }

  bool operator==(const SlipCounts& other) const = default;

 private:
  std::size_t slot(std::size_t segment, std::size_t k) const { return segment * (times_ + 2) + k; }
  void check_segment(std::size_t segment) const;

  std::size_t segments_, times_;
  std::vector<std::uint64_t> counts_;
};

}  // namespace slipscreen::stats
