#include "core/screen/tracking_grid.hpp"

#include <algorithm>

#include "core/util/civil_date.hpp"

namespace slipscreen::screen {

std::vector<double> tracking_grid(std::span<const double> change_times, std::span<const double> output_times) {
  std::vector<double> grid;
  if (change_times.empty() || output_times.empty()) return grid;
  const double first = *std::min_element(change_times.begin(), change_times.end());
  const double last = *std::max_element(output_times.begin(), output_times.end());
  if (!(first < last)) return {output_times.begin(), output_times.end()};
  util::CivilDate month = util::date_at(first);
  month.day = 1;
  for (double t = util::to_seconds(month); t <= last; t = util::to_seconds(month)) {
    if (t > first) grid.push_back(t);
    month = util::add_months(month, 1);
  }
  for (double t : change_times)
    if (t > first && t <= last) grid.push_back(t);
  for (double t : output_times)
    if (t > first) grid.push_back(t);
  std::sort(grid.begin(), grid.end());
  grid.erase(std::unique(grid.begin(), grid.end()), grid.end());
  return grid;
}

}  // namespace slipscreen::screen
