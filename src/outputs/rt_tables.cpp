#include "outputs/rt_tables.hpp"

#include <algorithm>
#include <sstream>

#include "core/seismo/triggering_front.hpp"
#include "core/units/units.hpp"
#include "core/util/number_text.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::outputs {

using formats::csv_field;
using formats::format_iso8601_utc;
using util::fixed_decimals;

std::string rt_events_csv(const seismo::Catalog& c, const screening::RtView& v, const OutputUnits& u) {
  std::ostringstream t;
  t << "event_id,time,time_since_start_days," << u.column("distance", Quantity::length)
    << ",magnitude,diffusivity_through_point_m2_per_s\n";
  for (const auto& p : v.points) {
    const auto& e = c.events[p.event];
    t << csv_field(e.id) << "," << format_iso8601_utc(e.time) << "," << fixed_decimals(p.t / units::kDay, 4) << ","
      << u.text(p.r, Quantity::length, 1) << "," << util::number_text(e.magnitude, 4) << "," << util::number_text(p.d_fit, 6) << "\n";
  }
  return t.str();
}

std::string rt_fronts_csv(const screening::RtView& v, const OutputUnits& u) {
  double t_max = 0.0;
  for (const auto& p : v.points) t_max = std::max(t_max, p.t);
  if (t_max <= 0.0) t_max = 365.25 * units::kDay;
  const int n = 200;
  std::ostringstream fc;
  fc << "diffusivity_m2_per_s,time_since_start_days," << u.column("front_radius", Quantity::length) << "\n";
  for (double d : v.diffusivities)
    for (int k = 0; k <= n; ++k) {
      const double tt = t_max * k / n;
      fc << util::number_text(d, 4) << "," << fixed_decimals(tt / units::kDay, 4) << ","
         << u.text(seismo::front_radius(d, tt), Quantity::length, 1) << "\n";
    }
  return fc.str();
}

std::string rt_events_description(const screening::RtView& v) {
  return "r-t view: each event's distance from " + (v.well.empty() ? std::string("the point") : "well " + v.well) +
         " at (" + util::number_text(v.position[0], 10) + ", " + util::number_text(v.position[1], 10) +
         ") against time since " + format_iso8601_utc(v.start) +
         ", with the diffusivity whose front passes through the event";
}

std::string rt_fronts_description(const screening::RtView& v) {
  std::string ds;
  for (double d : v.diffusivities) ds += (ds.empty() ? "" : ", ") + util::number_text(d, 4);
  return "r-t view: triggering-front radius r = sqrt(4 pi D t) (Shapiro et al. 1997) against time since " +
         format_iso8601_utc(v.start) + ", one row per diffusivity (" + ds + " m2/s) and time";
}

}  // namespace slipscreen::outputs
