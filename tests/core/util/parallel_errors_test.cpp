#include "core/util/parallel_errors.hpp"

#include <doctest/doctest.h>

#include <atomic>
#include <cstddef>
#include <new>
#include <stdexcept>
#include <string>
#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using slipscreen::util::ParallelErrors;

namespace {

// A parallel loop over n iterations that throws `make(i)` at every iteration in `failing`;
// counts the iterations whose body ran.
template <class Make>
void loop(ParallelErrors& errors, std::size_t n, const std::vector<std::size_t>& failing, Make make,
          std::atomic<std::size_t>& ran) {
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t i = 0; i < n; ++i)
    errors.iteration(i, [&] {
      ++ran;
      for (std::size_t f : failing)
        if (f == i) make(i);
    });
}

}  // namespace

TEST_CASE("an exception thrown in iteration k reaches the caller with its type and message") {
  ParallelErrors errors;
  std::atomic<std::size_t> ran{0};
  loop(errors, 1000, {417}, [](std::size_t i) {
    throw InputError("rate", std::to_string(i), "a rate below 1e9 m3/s");
  }, ran);
  CHECK(errors.failed());
  CHECK_THROWS_WITH_AS(errors.rethrow(), "field 'rate' = '417': expected a rate below 1e9 m3/s", InputError);
  // The same object: the typed fields survive, not only the text.
  try {
    errors.rethrow();
  } catch (const InputError& e) {
    CHECK(e.field() == "rate");
    CHECK(e.value() == "417");
    CHECK(e.category() == ErrorCategory::input);
  }
}

TEST_CASE("standard exceptions keep their type too (bad_alloc, length_error)") {
  {
    ParallelErrors errors;
    std::atomic<std::size_t> ran{0};
    loop(errors, 64, {5}, [](std::size_t) { throw std::bad_alloc(); }, ran);
    CHECK_THROWS_AS(errors.rethrow(), std::bad_alloc);
  }
  {
    ParallelErrors errors;
    std::atomic<std::size_t> ran{0};
    loop(errors, 64, {63}, [](std::size_t) { throw std::length_error("too long"); }, ran);
    CHECK_THROWS_WITH_AS(errors.rethrow(), "too long", std::length_error);
  }
}

TEST_CASE("of several failures the lowest iteration's is kept, whatever the thread schedule") {
  for (int repeat = 0; repeat < 20; ++repeat) {
    ParallelErrors errors;
    std::atomic<std::size_t> ran{0};
    loop(errors, 500, {499, 250, 31, 32, 400}, [](std::size_t i) { throw NumericalError("at " + std::to_string(i)); },
         ran);
    CHECK_THROWS_WITH_AS(errors.rethrow(), "at 31", NumericalError);
    // Iterations after a recorded failure are skipped; every one before the lowest failure ran.
    CHECK(ran.load() >= 32);
    CHECK(errors.stopped(31));
    CHECK(errors.stopped(499));
    CHECK_FALSE(errors.stopped(30));
  }
}

TEST_CASE("later iterations are skipped once a failure is recorded (serial order)") {
  ParallelErrors errors;
  std::size_t ran = 0;
  for (std::size_t i = 0; i < 100; ++i)
    errors.iteration(i, [&] {
      ++ran;
      if (i == 10) throw std::runtime_error("stop");
    });
  CHECK(ran == 11);
  CHECK_THROWS_WITH_AS(errors.rethrow(), "stop", std::runtime_error);
}

TEST_CASE("a set-up failure stops every iteration and is the error reported") {
  ParallelErrors errors;
  std::atomic<std::size_t> ran{0};
#pragma omp parallel
  {
    errors.setup([] { throw IoError("scratch"); });
#pragma omp for
    for (std::size_t i = 0; i < 100; ++i) errors.iteration(i, [&] { ++ran; });
  }
  CHECK(ran.load() == 0);
  CHECK_THROWS_WITH_AS(errors.rethrow(), "scratch", IoError);
}

TEST_CASE("no failure: every iteration runs and rethrow does nothing") {
  ParallelErrors errors;
  std::atomic<std::size_t> ran{0};
  loop(errors, 300, {}, [](std::size_t) {}, ran);
  CHECK(ran.load() == 300);
  CHECK_FALSE(errors.failed());
  CHECK_NOTHROW(errors.rethrow());
}
