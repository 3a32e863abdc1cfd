#include "core/stats/slip_counts.hpp"

#include <numeric>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::stats {

SlipCounts::SlipCounts(std::size_t segments, std::size_t times)
    : segments_(segments), times_(times), counts_(segments * (times + 2), 0) {
  if (times == 0) throw InputError("output times", "0", "at least one output time");
}

void SlipCounts::check_segment(std::size_t segment) const {
  if (segment >= segments_)
    throw InputError("segment", std::to_string(segment), "a segment index below " + std::to_string(segments_));
}

void SlipCounts::record_already_critical(std::size_t segment) {
  check_segment(segment);
  ++counts_[slot(segment, times_ + 1)];
}

void SlipCounts::record_first_slip(std::size_t segment, std::size_t first_time) {
  check_segment(segment);
  if (first_time >= times_)
    throw InputError("first slip time", std::to_string(first_time), "an output time index below " + std::to_string(times_));
  ++counts_[slot(segment, first_time)];
}

void SlipCounts::record_no_slip(std::size_t segment) {
  check_segment(segment);
  ++counts_[slot(segment, times_)];
}

std::uint64_t SlipCounts::realizations(std::size_t segment) const {
  check_segment(segment);
  const auto first = counts_.begin() + static_cast<std::ptrdiff_t>(slot(segment, 0));
  return std::accumulate(first, first + static_cast<std::ptrdiff_t>(times_ + 2), std::uint64_t{0});
}

std::uint64_t SlipCounts::already_critical(std::size_t segment) const {
  check_segment(segment);
  return counts_[slot(segment, times_ + 1)];
}

std::uint64_t SlipCounts::slipped_by(std::size_t segment, std::size_t time) const {
  check_segment(segment);
  if (time >= times_) throw InputError("output time", std::to_string(time), "an index below " + std::to_string(times_));
  const auto first = counts_.begin() + static_cast<std::ptrdiff_t>(slot(segment, 0));
  return std::accumulate(first, first + static_cast<std::ptrdiff_t>(time + 1), std::uint64_t{0});
}

void SlipCounts::merge(const SlipCounts& other) {
  if (other.segments_ != segments_ || other.times_ != times_)
    throw InputError("slip counts", std::to_string(other.segments_) + " segments x " + std::to_string(other.times_) + " times",
                     std::to_string(segments_) + " segments x " + std::to_string(times_) + " times to merge with");
  for (std::size_t k = 0; k < counts_.size(); ++k) counts_[k] += other.counts_[k];
}

}  // namespace slipscreen::stats
