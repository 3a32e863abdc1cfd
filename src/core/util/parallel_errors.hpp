#pragma once
// Exceptions out of OpenMP worker threads. An exception must not leave an OpenMP structured
// block (the program would terminate), so every parallel region in the core runs its work
// through one ParallelErrors:
//
//   util::ParallelErrors errors;
//   #pragma omp parallel
//   {
//     Scratch s;
//     errors.setup([&] { s.resize(n); });             // per-thread set-up before the loop
//   #pragma omp for
//     for (std::size_t i = 0; i < n; ++i)
//       errors.iteration(i, [&] { work(i, s); });      // skipped once an earlier one failed
//   }
//   errors.rethrow();                                  // on the calling thread, after the region
//
// What is kept: the exception of the lowest failing iteration (a set-up failure counts as
// before every iteration), so the same input gives the same error whatever the thread count
// and schedule. Every iteration after a recorded failure is skipped; iterations before it
// still run, which is what makes the choice deterministic. The exception object itself is
// rethrown (std::exception_ptr): same type, same message.
#include <atomic>
#include <cstddef>
#include <exception>
#include <limits>
#include <mutex>

namespace slipscreen::util {

class ParallelErrors {
 public:
  ParallelErrors() = default;
  ParallelErrors(const ParallelErrors&) = delete;
  ParallelErrors& operator=(const ParallelErrors&) = delete;

  // Runs body() for iteration i unless an iteration ≤ i (or a set-up) has already failed; an
  // exception it throws is recorded, never propagated. Safe to call from any thread.
  template <class Body>
  void iteration(std::size_t i, Body&& body) noexcept {
    run(key_of(i), body);
  }

  // Runs per-thread set-up code; its failure stops every iteration.
  template <class Body>
  void setup(Body&& body) noexcept {
    run(0, body);
  }

  // Whether iteration i would be skipped (a failure at or before it is recorded).
  bool stopped(std::size_t i) const noexcept { return key_of(i) >= stop_.load(std::memory_order_acquire); }
  bool failed() const noexcept { return stop_.load(std::memory_order_acquire) != kNone; }

  // Rethrows the recorded exception, if any. Call on the calling thread after the region.
  void rethrow() const {
    std::lock_guard<std::mutex> lock(mutex_);
    if (first_) std::rethrow_exception(first_);
  }

 private:
  static constexpr std::size_t kNone = std::numeric_limits<std::size_t>::max();
  // Set-up is key 0, iteration i is key i + 1 (saturating: the last index shares kNone − 1).
  static std::size_t key_of(std::size_t i) noexcept { return i < kNone - 1 ? i + 1 : kNone - 1; }

  template <class Body>
  void run(std::size_t key, Body& body) noexcept {
    if (key >= stop_.load(std::memory_order_acquire)) return;
    try {
      body();
    } catch (...) {
      record(key, std::current_exception());
    }
  }

  void record(std::size_t key, std::exception_ptr e) noexcept {
    std::lock_guard<std::mutex> lock(mutex_);
    if (key < stop_.load(std::memory_order_relaxed)) {
      first_ = std::move(e);
      stop_.store(key, std::memory_order_release);
    }
  }

  std::atomic<std::size_t> stop_{kNone};  // key of the recorded failure; kNone: none
  mutable std::mutex mutex_;
  std::exception_ptr first_;
};

}  // namespace slipscreen::util
