#include "screening/pressure_map.hpp"

#include "core/hydro/pressure_field.hpp"
#include "core/hydro/pressure_grid.hpp"

namespace slipscreen::screening {

PressureMap pressure_map(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const auto& g = p.grid;
  PressureMap map;
  map.dp.assign(s.output.times.size(), std::vector<double>(g.cell_count(), 0.0));
  const std::vector<hydro::GridSource> sources = grid_sources(p);
  if (sources.empty()) return map;
  // The fast path's interpolation bound is derived for E1 (docs/pressure-grid.md); a leaky
  // formation (Hantush & Jacob 1955) takes the exact direct sum at every pixel instead.
  const hydro::PressureGrid grid = [&] {
    if (p.inputs.formation.leakage_rate > 0.0) {
      std::vector<hydro::WellSource> wells;
      for (const auto& w : p.inputs.wells) wells.push_back({w.id, w.x, w.y, w.radius, w.history});
      const hydro::PressureField field(std::move(wells), p.inputs.boundaries);
      return hydro::pressure_grid_direct(grid_geometry(g), field, p.inputs.formation, s.output.times);
    }
    return hydro::pressure_grid(grid_geometry(g), grid_formation(p), sources, s.output.times);
  }();
  for (std::size_t k = 0; k < map.dp.size(); ++k)
    for (int j = 0; j < g.rows; ++j)
      for (int i = 0; i < g.columns; ++i)
        map.dp[k][g.index(i, j)] = grid.at(k, static_cast<std::size_t>(i), static_cast<std::size_t>(j));
  return map;
}

}  // namespace slipscreen::screening
