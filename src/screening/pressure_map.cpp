#include "screening/pressure_map.hpp"

#include "core/hydro/pressure_grid.hpp"

namespace slipscreen::screening {

PressureMap pressure_map(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const auto& g = p.grid;
  PressureMap map;
  map.dp.assign(s.output.times.size(), std::vector<double>(g.cell_count(), 0.0));
  const std::vector<hydro::GridSource> sources = grid_sources(p);
  if (sources.empty()) return map;
  const hydro::PressureGrid grid = hydro::pressure_grid(grid_geometry(g), grid_formation(p), sources, s.output.times);
  for (std::size_t k = 0; k < map.dp.size(); ++k)
    for (int j = 0; j < g.rows; ++j)
      for (int i = 0; i < g.columns; ++i)
        map.dp[k][g.index(i, j)] = grid.at(k, static_cast<std::size_t>(i), static_cast<std::size_t>(j));
  return map;
}

}  // namespace slipscreen::screening
