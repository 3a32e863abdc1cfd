#pragma once
// Piecewise-constant injection rate histories and superposition in time.
//
// Superposition in time (linearity of the diffusion equation; Earlougher 1977, eq. 2.23):
//   Δp(t) = Σ_j (q_j − q_{j−1}) F(t − t_j)   over the steps with t_j < t,  q_{−1} = 0,
// where F(τ) is the response to a unit rate switched on at τ = 0. A shut-in is a step to rate 0;
// the pressure then decays (Theis recovery: Δp = q/(4π T)·[W(u) − W(u')] after a single
// injection period).
//
// Symbols: start times t_j [s, any fixed epoch], rates q_j [m³/s, positive = injection],
// F(τ) unit response [Pa per m³/s].
//
// Domain: before the first step the rate is 0 and Δp = 0 (a documented value, not an error).
#include <chrono>
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::hydro {

// One constant-rate interval [start, end) given as a period; gaps between periods are shut-ins.
struct RatePeriod {
  double start = 0;  // s
  double end = 0;    // s (may be +inf for "continues")
  double rate = 0;   // m³/s
};

// A rate change: from time `time` on, the rate is the previous rate plus `delta`.
struct RateChange {
  double time;   // t_j, s
  double delta;  // q_j − q_{j−1}, m³/s
};

class RateHistory {
 public:
  // No injection at all.
  RateHistory() = default;

  // Rate `rates[j]` from `start_times[j]` until the next start (the last one holds forever; end
  // it with a 0 rate for a shut-in). Throws InputError when the lengths differ, a value is not
  // finite, or the start times are not strictly increasing ("history" names the step index).
  RateHistory(std::vector<double> start_times, std::vector<double> rates);

  // From periods (start < end, sorted, non-overlapping; touching is fine). A gap between two
  // periods becomes a 0-rate step (shut-in), and the end of the last period too unless it is +inf.
  static RateHistory from_periods(std::span<const RatePeriod> periods);

  // From reported monthly volumes [m³], month i being first_month + i (calendar months, UTC):
  // each month's rate is its mean rate, volume / month length. The history ends (rate 0) at the
  // end of the last month. Times are seconds since `epoch`. Negative or non-finite volumes are
  // errors (field "volume", month index).
  static RateHistory from_monthly_volumes(std::chrono::year_month first_month,
                                          std::span<const double> volumes,
                                          std::chrono::sys_days epoch);

  // The history with every rate multiplied by `factor` (Monte Carlo rate factors).
  RateHistory scaled(double factor) const;

  const std::vector<double>& start_times() const noexcept { return starts_; }
  const std::vector<double>& rates() const noexcept { return rates_; }
  bool empty() const noexcept { return starts_.empty(); }

  // Rate in force at time t (0 before the first step). A step applies from its start on.
  double rate_at(double t) const;

  // The steps as changes (t_j, q_j − q_{j−1}), skipping zero changes.
  std::vector<RateChange> changes() const;

  // Volume injected in [first start, t], m³.
  double cumulative_volume(double t) const;

 private:
  std::vector<double> starts_;
  std::vector<double> rates_;
};

// Δp(t) = Σ_{t_j < t} Δq_j F(t − t_j), for any unit response F(τ) [Pa per m³/s]. Returns 0 when
// t is at or before the first change (or the history is empty).
template <class UnitResponse>
double superpose_in_time(std::span<const RateChange> changes, double t, UnitResponse&& F) {
  double sum = 0.0;
  for (const RateChange& c : changes) {
    if (!(c.time < t)) break;  // changes are sorted
    sum += c.delta * F(t - c.time);
  }
  return sum;
}

}  // namespace slipscreen::hydro
