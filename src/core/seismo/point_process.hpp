#pragma once
// Log-likelihood of an earthquake catalog under a Poisson point process whose rate on each fault
// segment follows the Dieterich (1994) seismicity-rate model (rate_state.hpp), plus a background
// pool of constant rate for the events not assigned to a segment (docs/conditioning.md,
// "Seismicity likelihood").
//
// Source: Ogata (1988), J. Am. Stat. Assoc. 83:9-27, eq. 2.1: for a point process with
// intensity λ(t) observed on [T0, T1] with events at t_1..t_n,
//   ln L = Σ_i ln λ(t_i) − ∫_{T0}^{T1} λ(t) dt.
// Independent segments (and the pool) add: ln L = Σ_s [Σ_{e on s} ln λ_s(t_e) − ∫ λ_s dt]
//   + Σ_{e in pool} ln λ_b − λ_b (T1 − T0).
//
// Symbols (code -> literature): rate λ_s [events/s] = R of Dieterich (1994) on segment s,
// background_pool_rate λ_b [events/s], events' times t_e [s], window [T0, T1] [s].
//
// Accuracy: λ_s and ∫ λ_s dt are exact to rounding for piecewise-linear ΔCFF (rate_state.hpp:
// the integral is the model's closed-form expected count); checked against adaptive
// Gauss–Kronrod quadrature of λ_s (Boost.Math) to 1e-9 relative in
// tests/core/seismo/point_process_test.cpp.
#include <cstddef>
#include <limits>
#include <vector>

#include "core/seismo/rate_state.hpp"

namespace slipscreen::seismo {

inline constexpr std::size_t kBackgroundPool = std::numeric_limits<std::size_t>::max();

struct SegmentRateModel {
  CoulombHistory history;      // ΔCFF(t) on the segment (must start at or before T0)
  RateStateParameters params;  // r, Aσ, τ̇_r of the segment
};

struct AssignedEvent {
  double time = 0.0;                      // s, in [T0, T1]
  std::size_t segment = kBackgroundPool;  // index into the segments, or the pool
};

struct PointProcessLikelihood {
  double log_likelihood = 0.0;
  double sum_log_rate = 0.0;   // Σ_e ln λ(t_e)
  double expected = 0.0;       // Σ_s ∫ λ_s dt + λ_b (T1 − T0)
};

// InputError for T1 ≤ T0, an event outside [T0, T1], an unknown segment, events in the pool with
// λ_b ≤ 0, or a history starting after T0.
PointProcessLikelihood seismicity_log_likelihood(const std::vector<SegmentRateModel>& segments,
                                                 double background_pool_rate, const std::vector<AssignedEvent>& events,
                                                 double t0, double t1);

}  // namespace slipscreen::seismo
