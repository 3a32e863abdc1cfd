#pragma once
// Tracks, realization by realization, when each fault segment first reaches its Coulomb
// threshold under the modelled pore-pressure history.
//
// A segment has slipped by time t when max_{t' ≤ t} Δp(t') ≥ Δp_crit, with Δp the largest value
// over the segment's check points. This is the Coulomb criterion CFF(t) ≥ 0 restated through
// Δp_crit, exact because ΔCFF is linear in Δp (also on the poroelastic stress path), so the
// caller supplies Δp_crit per segment and realization.
// Δp is checked on the surrogate's tracking grid: the caller chooses it fine enough to catch
// the peak after a shut-in (the run uses the first of every month plus every output time).
// Speed: Δp at the output times is evaluated for every realization; the tracking series in
// chunks of 24 tracking times, in order until the first crossing, and only in the chunks where
// a rigorous upper bound reaches Δp_crit (interval arithmetic on the interpolant over the
// chunk, chunk_bounds.hpp; a bound over all times and check points at once first sieves out the
// realizations that cannot cross at all), so faults far from failure and times long before a
// crossing cost little;
// realizations are evaluated together in blocks of 256 (matrix products). The result is the
// same as evaluating every series.
#include <Eigen/Dense>
#include <cstddef>
#include <functional>
#include <optional>
#include <span>
#include <utility>
#include <vector>

#include "core/hydro/pressure_surrogate.hpp"

namespace slipscreen::probabilistic {

// Per realization inputs of the pressure model for a set of N realizations.
struct PressureDraws {
  Eigen::MatrixXd basis;  // nodes × N: hydro::PressureSurrogate::basis of each realization's D
  Eigen::MatrixXd scale;  // groups × N: prefactor μ/(4π k h) times the group's rate factor
};

// Builds PressureDraws from diffusivities, prefactors and rate factors (groups × N).
PressureDraws make_pressure_draws(const hydro::PressureSurrogate& surrogate, std::span<const double> diffusivity,
                                  std::span<const double> prefactor, const Eigen::MatrixXd& rate_factor);

// Segments [first, second).
using SegmentRows = std::pair<std::size_t, std::size_t>;

struct SegmentOutcome {
  std::size_t segment = 0;
  std::vector<int> first_crossing;  // tracking index of the first Δp ≥ Δp_crit; −1 if never
  Eigen::MatrixXd dp_at_output;     // outputs × N: Δp (max over check points) at output times
};

// For every segment (OpenMP over segments), or only segments [only->first, only->second),
// evaluates Δp for all realizations in blocks and calls visit(outcome) once per segment —
// possibly from several threads at once, each with a different segment, so the visitor must
// write to per-segment storage only.
// `dp_crit` is segments × N, or 1 × N when every segment shares the same values (maps). `output_index` lists the tracking indices of the output times.
void track_slip(const hydro::PressureSurrogate& surrogate, const std::vector<std::vector<std::size_t>>& segment_points,
                const PressureDraws& draws, const Eigen::MatrixXf& dp_crit,
                std::span<const std::size_t> output_index,
                const std::function<void(const SegmentOutcome&)>& visit,
                std::optional<SegmentRows> only = std::nullopt);

}  // namespace slipscreen::probabilistic
