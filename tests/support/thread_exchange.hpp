#pragma once
// Processes simulated by threads in one test: an in-process stand-in for the MPI exchange of the
// run layer (util::WorkShare::all_gather, RealizationSplit::gather).
#include <condition_variable>
#include <cstddef>
#include <cstdint>
#include <map>
#include <mutex>
#include <vector>

namespace slipscreen::threads {

// An in-process exchange for parts run on threads: in each round (a part's n-th call) every part
// deposits its piece and waits until all have; then each gets every piece.
class Exchange {
 public:
  explicit Exchange(std::size_t parts) : parts_(parts), calls_(parts, 0) {}
  std::vector<std::vector<std::uint8_t>> all(std::size_t part, std::vector<std::uint8_t> piece) {
    std::unique_lock lock(mutex_);
    Round& round = rounds_[calls_[part]++];
    round.pieces.resize(parts_);
    round.pieces[part] = std::move(piece);
    ++round.arrived;
    changed_.notify_all();
    changed_.wait(lock, [&] { return round.arrived == parts_; });
    return round.pieces;
  }

 private:
  struct Round {
    std::vector<std::vector<std::uint8_t>> pieces;
    std::size_t arrived = 0;
  };
  std::size_t parts_;
  std::vector<std::size_t> calls_;
  std::map<std::size_t, Round> rounds_;
  std::mutex mutex_;
  std::condition_variable changed_;
};

}  // namespace slipscreen::threads
