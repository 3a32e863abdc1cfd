// Piecewise-constant rate histories; see rate_history.hpp.
#include "core/hydro/rate_history.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::hydro {
namespace {

std::string step_field(const char* what, std::size_t i) {
  return std::string("history[") + std::to_string(i) + "]." + what;
}

}  // namespace

RateHistory::RateHistory(std::vector<double> start_times, std::vector<double> rates)
    : starts_(std::move(start_times)), rates_(std::move(rates)) {
  if (starts_.size() != rates_.size())
    throw InputError("history", std::to_string(starts_.size()) + " start times, " +
                                    std::to_string(rates_.size()) + " rates",
                     "one rate per start time");
  for (std::size_t i = 0; i < starts_.size(); ++i) {
    if (!std::isfinite(starts_[i]))
      throw InputError(step_field("start", i), util::number_text(starts_[i]), "a finite time");
    if (!std::isfinite(rates_[i]))
      throw InputError(step_field("rate", i), util::number_text(rates_[i]), "a finite rate (m³/s)");
    if (i > 0 && !(starts_[i] > starts_[i - 1]))
      throw InputError(step_field("start", i), util::number_text(starts_[i]),
                       "a start time after the previous step's start (" + util::number_text(starts_[i - 1]) +
                           " s): steps must be sorted and must not overlap");
  }
}

RateHistory RateHistory::from_periods(std::span<const RatePeriod> periods) {
  std::vector<double> starts, rates;
  const auto field = [](const char* what, std::size_t i) {
    return std::string("period[") + std::to_string(i) + "]." + what;
  };
  for (std::size_t i = 0; i < periods.size(); ++i) {
    const RatePeriod& p = periods[i];
    if (!std::isfinite(p.start)) throw InputError(field("start", i), util::number_text(p.start), "a finite time");
    if (std::isnan(p.end) || p.end == -std::numeric_limits<double>::infinity())
      throw InputError(field("end", i), util::number_text(p.end), "a time after the start (or +inf)");
    if (!(p.end > p.start))
      throw InputError(field("end", i), util::number_text(p.end),
                       "a time after the period's start (" + util::number_text(p.start) + " s)");
    if (!std::isfinite(p.rate)) throw InputError(field("rate", i), util::number_text(p.rate), "a finite rate (m³/s)");
    if (i > 0) {
      const RatePeriod& prev = periods[i - 1];
      if (p.start < prev.end)
        throw InputError(field("start", i), util::number_text(p.start),
                         "a time at or after the previous period's end (" + util::number_text(prev.end) +
                             " s): periods must be sorted and must not overlap");
      if (p.start > prev.end) {  // gap: shut-in
        starts.push_back(prev.end);
        rates.push_back(0.0);
      }
    }
    if (!starts.empty() && starts.back() == p.start) {
      rates.back() = p.rate;
    } else {
      starts.push_back(p.start);
      rates.push_back(p.rate);
    }
    if (i + 1 == periods.size() && std::isfinite(p.end)) {
      starts.push_back(p.end);
      rates.push_back(0.0);
    }
  }
  return RateHistory(std::move(starts), std::move(rates));
}

RateHistory RateHistory::from_monthly_volumes(std::chrono::year_month first_month,
                                              std::span<const double> volumes,
                                              std::chrono::sys_days epoch) {
  using namespace std::chrono;
  if (!first_month.ok())
    throw InputError("first_month", "invalid", "a calendar year and month");
  std::vector<double> starts, rates;
  year_month ym = first_month;
  for (std::size_t i = 0; i < volumes.size(); ++i) {
    const double v = volumes[i];
    if (!std::isfinite(v) || v < 0.0)
      throw InputError("volume[" + std::to_string(i) + "]", util::number_text(v), "a finite volume ≥ 0 (m³)");
    const sys_days begin{ym / 1};
    const sys_days end{(ym + months{1}) / 1};
    const double t0 = static_cast<double>(duration_cast<seconds>(begin - epoch).count());
    const double t1 = static_cast<double>(duration_cast<seconds>(end - epoch).count());
    starts.push_back(t0);
    rates.push_back(v / (t1 - t0));  // mean rate of the month
    ym += months{1};
  }
  if (!volumes.empty()) {
    const sys_days end{ym / 1};
    starts.push_back(static_cast<double>(duration_cast<seconds>(end - epoch).count()));
    rates.push_back(0.0);
  }
  return RateHistory(std::move(starts), std::move(rates));
}

RateHistory RateHistory::scaled(double factor) const {
  if (!std::isfinite(factor)) throw InputError("rate_factor", util::number_text(factor), "a finite factor");
  RateHistory h = *this;
  for (double& q : h.rates_) q *= factor;
  return h;
}

double RateHistory::rate_at(double t) const {
  double q = 0.0;
  for (std::size_t i = 0; i < starts_.size() && starts_[i] <= t; ++i) q = rates_[i];
  return q;
}

std::vector<RateChange> RateHistory::changes() const {
  std::vector<RateChange> c;
  double prev = 0.0;
  for (std::size_t i = 0; i < starts_.size(); ++i) {
    const double d = rates_[i] - prev;
    if (d != 0.0) c.push_back({starts_[i], d});
    prev = rates_[i];
  }
  return c;
}

double RateHistory::cumulative_volume(double t) const {
  double v = 0.0;
  for (std::size_t i = 0; i < starts_.size() && starts_[i] < t; ++i) {
    const double end = i + 1 < starts_.size() ? std::min(starts_[i + 1], t) : t;
    v += rates_[i] * (end - starts_[i]);
  }
  return v;
}

}  // namespace slipscreen::hydro
