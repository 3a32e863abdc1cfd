#pragma once
// The r-t view around a well, shared by `slipscreen catalog` and the scenario run: event
// distance against time since injection start, with triggering fronts (its tables are written
// by outputs/rt_tables.hpp).
//
// Source of the fronts: Shapiro, Huenges & Borm (1997), r = sqrt(4 π D t) (triggering front of
// pore-pressure diffusion; core/seismo/triggering_front.hpp).
#include <array>
#include <string>
#include <vector>

#include "core/seismo/catalog.hpp"
#include "core/seismo/triggering_front.hpp"

namespace slipscreen::screening {

struct RtView {
  std::string well;                      // well id ("" when given as a point)
  std::array<double, 2> position{};      // in the catalog's coordinates
  double start = 0.0;                    // s since 1970, injection start
  std::vector<double> diffusivities;     // m²/s, increasing
  std::vector<seismo::RtPoint> points;   // events after the start
  std::vector<double> fraction_inside;   // per diffusivity
};

// Builds the view for the events of `c` (geographic: geodesic distance; projected: planar).
RtView make_rt_view(const seismo::Catalog& c, std::array<double, 2> position, double start,
                    std::vector<double> diffusivities, std::string well = "");

}  // namespace slipscreen::screening
