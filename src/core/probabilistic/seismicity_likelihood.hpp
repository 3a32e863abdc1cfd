#pragma once
// The seismicity log-likelihood of every realization of the probabilistic screen: observed
// earthquakes weigh the realizations beside the observed pressures (docs/conditioning.md,
// "Seismicity").
//
// Sources (one line each, every formula called from the file that holds it):
//   ln L = Σ_e ln λ(t_e) − ∫ λ dt, independent segments and a pool add   Ogata (1988) — seismo::seismicity_log_likelihood
//   λ_s = r_s / γ̂ under S(t) = τ̇_r t + ΔCFF_s(t)                        Dieterich (1994) — seismo::rate_response
//   ΔCFF along the stress path, |a + bΔp| − |a| + μ(1 − κ sin²δ)Δp        geomech::CoulombPathChange
//
// Symbols (code -> literature): for valid realization i and segment s, dp Δp_i,s(t_k) [Pa] at the
// tracking times t_k (max over the segment's check points, the series the slip tracker uses),
// path ΔCFF(Δp) on the realization's perturbed plane with its friction and κ, a_sigma Aσ_i [Pa],
// r_s = background_rate_per_km_i × length_s / 1000 [events/s], stressing_rate τ̇_r [Pa/s], the same
// in every realization, pool_rate λ_b [events/s].
//
// The history of segment s starts at min(t_inj, t_0) with ΔCFF = 0 (t_inj the first injection,
// SeismicityData::injection_start: no injection before it, the population at steady state), then follows ΔCFF(Δp(t_k)) linearly between tracking times
// and stays at its last value after the last one. Δp comes from the run's pressure model (the
// same surrogate, realizations' D, P and rate factors) evaluated at every tracking time.
//
// Accuracy: the rate-state integration is exact for the piecewise-linear ΔCFF (rate_state.hpp);
// Δp carries the surrogate's error (PressureSurrogate::max_relative_error()). Cost: one
// rate-state pass per (realization, segment) over the tracking grid.
//
// A realization whose history drives the rate beyond e^700 r (seismo::rate_response's domain)
// gets ℓ = −∞ (weight 0) and is counted in `beyond_domain`.
#include <cstdint>
#include <span>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/probabilistic/pressure_model.hpp"
#include "core/probabilistic/realization_sampler.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/seismo/rate_state.hpp"

namespace slipscreen::probabilistic {

struct SeismicityLikelihood {
  std::vector<double> log_likelihood;  // per valid realization: segments and pool
  double pool_log_likelihood = 0.0;    // the pool's part (the same in every realization)
  std::uint64_t beyond_domain = 0;     // realizations with ℓ = −∞ (see above)
};

// Segment s's Coulomb history from its Δp at the tracking times (see above).
seismo::CoulombHistory segment_coulomb_history(std::span<const double> tracking_times, std::span<const double> dp,
                                               const geomech::CoulombPathChange& path, double injection_start);

// ℓ of every valid realization of `r` for settings.seismicity (which must be set). OpenMP over
// segments; the per-segment terms are added in segment order, so the result is the same for any
// thread count and on every process of a split run. InputError for an event on an unknown
// segment, a window outside the tracking grid's reach or a missing Coulomb path.
SeismicityLikelihood seismicity_likelihood(const PressureModel& pm, const SampledRealizations& r, const InputList& list,
                                           const RunSettings& settings);

}  // namespace slipscreen::probabilistic
