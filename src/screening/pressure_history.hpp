#pragma once
// Δp over time at the segments closest to failure, with each well's contribution: the monthly
// series behind the report's stacked pressure figure (docs/outputs.md,
// "segment_pressure_history.csv"). No new physics: the same Theis superposition as the
// deterministic screen (hydro/pressure_field.hpp, Theis 1935), evaluated exactly (not from the
// similarity tables) at each check point of the chosen segments.
//
// - Segments: the `top` segments of the deterministic screen with the smallest margin
//   Δp_crit − peak Δp (already-critical segments first), ties by input order.
// - Times: the first day of every month of the tracking grid (core/screen/tracking_grid.hpp) and
//   every output time, from the first injection to the last output time.
// - At each time the segment's Δp is the maximum over its check points (as in the screen; the
//   first point holding it wins ties) and each well's contribution is taken at that point, so
//   at the output times the values equal `dp_MPa` of segment_times.csv and the contributions
//   `dp_MPa` of well_shares.csv (both exact Theis sums).
//
// Accuracy: that of hydro::PressureField (sums to ~1e-13 relative).
#include <cstddef>
#include <string>
#include <vector>

#include "core/screen/deterministic_screen.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

struct SegmentPressureHistory {
  std::vector<std::size_t> segments;  // indices into the run's segments, closest to failure first
  std::vector<double> times;          // s, increasing
  std::vector<std::string> wells;     // well ids, in the run's order
  std::vector<std::size_t> check_point;  // [i * T + k]: the check point holding segment i's Δp at time k
  std::vector<double> dp;                // [i * T + k]: Δp, Pa
  std::vector<double> contribution;      // [(i * T + k) * W + w]: well w's part of dp, Pa

  std::size_t time_count() const { return times.size(); }
};

// The `top` segments' monthly Δp by well (fewer when the run has fewer segments; none when
// `top` is 0 or there is no well).
SegmentPressureHistory segment_pressure_history(const PreparedRun& p, const screen::ScreenResult& r,
                                                std::size_t top);

// The segments closest to failure (smallest Δp_crit − peak Δp first, ties by index).
std::vector<std::size_t> segments_closest_to_failure(const screen::ScreenResult& r, std::size_t top);

}  // namespace slipscreen::screening
