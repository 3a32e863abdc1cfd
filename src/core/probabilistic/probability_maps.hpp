#pragma once
// Slip-probability maps for unmapped faults: at every pixel centre, the number of realizations
// in which a fault of the most dangerous orientation (and optionally of a given orientation)
// has slipped by each output time (docs/uncertainty.md; docs/outputs.md for the rasters).
//
// Method: each pixel is a one-point segment; the stress is uniform over the map, so every
// pixel shares the realization's Δp_crit (SampledRealizations::map_dp_crit). Slip by t when
// max_{t' ≤ t} Δp(t') ≥ Δp_crit (Coulomb criterion restated through Δp_crit; slip_tracker.hpp),
// with Δp from the pressure model's tables and a surrogate at the pixel centres
// (hydro/pressure_surrogate.hpp, Theis 1935). When a pixel lies farther from a source than
// every check point, the tables are rebuilt on a grid reaching ln(r²_max/(4 D_min)) + 0.1.
// Realizations already critical before injection (Δp_crit ≤ 0) are counted apart, once for
// the whole map, and never among the injection-induced counts.
//
// Symbols: Δp_crit [Pa], D_min [m²/s], r²_max the largest squared pixel–source distance [m²].
// Accuracy: that of the pressure model (tables and surrogate in D).
#include <cstdint>
#include <optional>
#include <vector>

#include "core/probabilistic/pressure_model.hpp"
#include "core/probabilistic/realization_split.hpp"
#include "core/probabilistic/realization_sampler.hpp"
#include "core/probabilistic/screen_inputs.hpp"

namespace slipscreen::probabilistic {

struct ProbabilityMaps {
  // Injection-induced slip counts [pixel * outputs + t]; `oriented` is empty unless
  // RunSettings::map_strike and map_dip are given.
  std::vector<std::uint64_t> dangerous, oriented;
  std::uint64_t dangerous_already_critical = 0, oriented_already_critical = 0;
};

// Counts for every pixel of settings.map_points (empty maps when there are none), over the valid
// realizations in `columns` (nothing: all of them; realization_split.hpp).
ProbabilityMaps probability_maps(const PressureModel& model, const SampledRealizations& r, const RunSettings& settings,
                                 std::optional<ColumnRange> columns = std::nullopt);

}  // namespace slipscreen::probabilistic
