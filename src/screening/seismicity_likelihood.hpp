#pragma once
// The observed earthquakes a conditioned run weighs its realizations with ([observations]
// seismicity = true; docs/conditioning.md, "Seismicity"): the [catalog] events after its filters,
// at or above the catalog review's Mc, from the first injection (or the catalog's `from`, if
// later) to the end of the catalog (its `to`, else its last event; at most the last output
// time), each assigned to the nearest fault segment within seismicity_distance (map distance,
// seismo::nearest_faults) or else to a background pool of constant rate.
//
// The pool's rate is its maximum-likelihood value n_pool / (t1 − t0), the same in every
// realization, so the pool carries no weight (it only completes ln L). The segments' Dieterich
// (1994) inputs: r = background_rate_per_km × trace length, Aσ from [catalog.rate_state] or
// [uncertainty.seismicity], τ̇_r = Aσ / t_a of [catalog.rate_state] (the tectonic stressing
// rate, held fixed when Aσ is uncertain).
#include <cstddef>
#include <optional>
#include <string>

#include "core/probabilistic/screen_inputs.hpp"
#include "screening/prepare.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::screening {

// What the seismicity likelihood used, for the console and the manifest.
struct SeismicityUse {
  probabilistic::SeismicityData data;
  double mc = 0.0;                     // the catalog review's Mc
  double distance = 0.0;               // m: seismicity_distance
  std::size_t catalog_events = 0;      // after the [catalog] filters
  std::size_t below_mc = 0;            // left out: below Mc
  std::size_t outside_window = 0;      // left out: before t0 or after t1
  std::size_t used = 0, assigned = 0, pool = 0;  // used = assigned + pool
};

// The events and inputs above; std::nullopt without [observations] seismicity = true.
// InputError naming [observations] seismicity for a catalog without Mc or whose period ends
// before the window starts (the catalog's file for a place the working CRS cannot hold).
// Zero events in the window is allowed: the likelihood is then that of no event, −Σ ∫ λ_s dt.
std::optional<SeismicityUse> seismicity_use(const scenario::ResolvedScenario& s, const PreparedRun& p);

}  // namespace slipscreen::screening
