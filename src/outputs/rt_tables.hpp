#pragma once
// The tables of the r-t view (screening/rt_view.hpp) as CSV texts (RFC 4180, one header line,
// no comment lines), and the one-line descriptions of them for the run folder's README.txt.
//   rt_events.csv  event_id,time,time_since_start_days,distance_m,magnitude,diffusivity_through_point_m2_per_s
//   rt_fronts.csv  diffusivity_m2_per_s,time_since_start_days,front_radius_m (one row per diffusivity and time)
// Distances and radii follow the output units (distance_ft, front_radius_ft); diffusivities stay m2/s.
//
// Source of the fronts: Shapiro, Huenges & Borm (1997), r = sqrt(4 π D t)
// (core/seismo/triggering_front.hpp).
#include <string>

#include "core/seismo/catalog.hpp"
#include "outputs/output_units.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::outputs {

std::string rt_events_csv(const seismo::Catalog& c, const screening::RtView& v, const OutputUnits& u);
std::string rt_fronts_csv(const screening::RtView& v, const OutputUnits& u);

std::string rt_events_description(const screening::RtView& v);
std::string rt_fronts_description(const screening::RtView& v);

}  // namespace slipscreen::outputs
