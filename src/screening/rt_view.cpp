#include "screening/rt_view.hpp"

#include <algorithm>

#include "core/seismo/epicentral_distance.hpp"

namespace slipscreen::screening {

RtView make_rt_view(const seismo::Catalog& c, std::array<double, 2> position, double start,
                    std::vector<double> diffusivities, std::string well) {
  RtView v;
  v.well = std::move(well);
  v.position = position;
  v.start = start;
  std::sort(diffusivities.begin(), diffusivities.end());
  diffusivities.erase(std::unique(diffusivities.begin(), diffusivities.end()), diffusivities.end());
  v.diffusivities = std::move(diffusivities);
  std::vector<double> r;
  for (const auto& e : c.events) r.push_back(seismo::epicentral_distance(c.kind, position[0], position[1], e.x, e.y));
  v.points = seismo::rt_points(seismo::times(c), r, start);
  for (double d : v.diffusivities) v.fraction_inside.push_back(seismo::fraction_inside_front(v.points, d));
  return v;
}

}  // namespace slipscreen::screening
