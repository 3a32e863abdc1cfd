#pragma once
// The Monte Carlo engine of the screen in depth (poro/fault_screen.hpp): one deterministic
// screen in depth per realization of the uncertain inputs — the solid's G, ν, ν_u, α and
// permeability, and the fault friction — counting per segment and output time the realizations
// in which the segment has reached failure (some check point with ΔCFF ≥ μΔp_crit, or already
// critical). P(slip by t_k) = count / realizations (the estimate; Wilson intervals from
// stats/wilson_interval.hpp as for the Theis engine, docs/uncertainty.md).
//
// Method: direct sums per realization, no surrogate (the 3-D response depends on c through
// ξ = r/√(ct) and on η and κ separately, so the Theis engine's tables in ln(r²/4D) and its
// prefactor scaling do not carry over); cost = realizations × one depth_screen
// (bench/poro3d_bench prints it). Counts are integers summed per realization, so the result is
// the same for any thread count; the draws themselves come from the caller (realization i from
// its own stream, stats/random_stream.hpp).
//
// Accuracy: each realization's crossing as poro/fault_screen.hpp; the probabilities carry the
// sampling error of `realizations` draws.
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

#include "core/poro/fault_screen.hpp"

namespace slipscreen::poro {

struct DepthRealization {
  PoroelasticMedium medium;
  std::optional<double> friction;  // μ for every segment; empty: each segment's own or the default
};

struct DepthSlipCounts {
  std::size_t realizations = 0;
  std::vector<std::vector<std::uint32_t>> slipped;  // [segment][output time]: realizations failed by then
};

// InputError (the first failing realization's, for any thread count) when a realization's
// medium or friction is invalid.
DepthSlipCounts depth_slip_counts(const DepthScreenInputs& base, std::span<const DepthRealization> draws);

}  // namespace slipscreen::poro
