#pragma once
// Events against the modelled pressure footprint: how many events fall where the modelled
// pore-pressure increase exceeds a threshold, against how many would by chance.
//
// Source: one-sided exact binomial test (common practice): with n events placed independently
// and uniformly over the study area, the number inside a footprint covering the fraction f of
// the area is Binomial(n, f); the chance expectation is n f and the p-value of observing k or
// more is P(X >= k) = 1 - F(k - 1; n, f) (Boost.Math binomial distribution).
//
// Symbol table (code -> symbol):
//   inside          k    events with modelled Δp >= threshold
//   events          n    events considered
//   area_fraction   f    footprint area / study area
//   expected        n f  events expected inside by chance
//   p_value         P(X >= k | n, f)
//
// The run supplies Δp at each event (an array, or a callback evaluated per event).
#include <cstddef>
#include <functional>
#include <span>
#include <vector>

#include "core/seismo/catalog.hpp"

namespace slipscreen::seismo {

struct FootprintCount {
  std::size_t events = 0;
  std::size_t inside = 0;
  double area_fraction = 0.0;
  double expected = 0.0;  // n f
  double p_value = 1.0;   // P(X >= inside) under the chance hypothesis
  double threshold = 0.0; // Pa
};

// Valid: 0 <= f <= 1 (InputError otherwise), pressures finite (non-finite Δp is an InputError
// naming the event index). Accuracy: Boost.Math binomial CDF, ~1e-15 relative.
FootprintCount footprint_count(std::span<const double> event_pressure_change, double threshold,
                               double area_fraction);

// Footprint area fraction at time t from fractions known at increasing times: 0 up to `start`
// (the first injection), linear from (start, 0) to the first sample and between samples, the
// last value after the last sample. Exact for the piecewise-linear curve; InputError for
// unsorted times or fractions outside [0, 1].
double footprint_fraction_at(std::span<const double> times, std::span<const double> fractions, double start,
                             double t);

// Δp (Pa) at an event's epicentre, depth and origin time, supplied by the run.
using PressureAtEvent = std::function<double(const Event&)>;

// The same with Δp evaluated by a callback for each event of the catalog.
FootprintCount footprint_count(const Catalog& catalog, const PressureAtEvent& pressure, double threshold,
                               double area_fraction);

}  // namespace slipscreen::seismo
