#include "core/screen/tracking_grid.hpp"

#include <doctest/doctest.h>

#include <vector>

#include "core/util/civil_date.hpp"

using namespace slipscreen;
using util::to_seconds;

TEST_CASE("tracking grid: month starts, rate changes and output times, sorted and unique") {
  const std::vector<double> changes = {to_seconds({2020, 1, 15}), to_seconds({2020, 3, 1}), to_seconds({2020, 2, 10})};
  const std::vector<double> outputs = {to_seconds({2020, 3, 20}), to_seconds({2020, 5, 1})};
  const auto g = screen::tracking_grid(changes, outputs);
  const std::vector<double> expected = {
      to_seconds({2020, 2, 1}),  to_seconds({2020, 2, 10}), to_seconds({2020, 3, 1}),
      to_seconds({2020, 3, 20}), to_seconds({2020, 4, 1}),  to_seconds({2020, 5, 1})};
  CHECK(g == expected);  // the first change itself carries no pressure yet (t_j < t is needed)
}

TEST_CASE("tracking grid without changes is empty") {
  const std::vector<double> outputs = {to_seconds({2020, 3, 20})};
  CHECK(screen::tracking_grid({}, outputs).empty());
}
