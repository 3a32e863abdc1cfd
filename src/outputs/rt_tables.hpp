#pragma once
// The tables of the r-t view (screening/rt_view.hpp): CSV texts (RFC 4180; the first line a '#'
// comment naming the method and the caution).
//
// Source of the fronts: Shapiro, Huenges & Borm (1997), r = sqrt(4 π D t)
// (core/seismo/triggering_front.hpp).
#include <string>

#include "core/seismo/catalog.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::outputs {

std::string rt_events_csv(const seismo::Catalog& c, const screening::RtView& v);
std::string rt_fronts_csv(const screening::RtView& v);

}  // namespace slipscreen::outputs
