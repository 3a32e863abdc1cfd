#pragma once
// The pore-pressure change over the output grid at every output time: the fast grid engine
// (core/hydro/pressure_grid.hpp, Theis superposition with image wells; accuracy stated there)
// over the prepared run's wells. Written as pressure_change.tif by outputs/pressure_raster.hpp.
#include <vector>

#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

struct PressureMap {
  // Pa; dp[k][grid.index(i, j)] at output time k (all zero when the run has no wells)
  std::vector<std::vector<double>> dp;
};

PressureMap pressure_map(const scenario::ResolvedScenario& s, const PreparedRun& p);

}  // namespace slipscreen::screening
