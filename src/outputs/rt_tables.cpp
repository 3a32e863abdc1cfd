#include "outputs/rt_tables.hpp"

#include <algorithm>
#include <cstdio>
#include <sstream>

#include "core/caution.hpp"
#include "core/seismo/triggering_front.hpp"
#include "core/units/units.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::outputs {
namespace {

}  // namespace

using formats::csv_field;
using util::fixed_decimals;
using formats::format_iso8601_utc;

std::string rt_events_csv(const seismo::Catalog& c, const screening::RtView& v) {
  std::ostringstream t;
  t << "# r-t view: distance from " << (v.well.empty() ? "the point" : "well " + v.well) << " at ("
    << util::number_text(v.position[0], 10) << ", " << util::number_text(v.position[1], 10) << ") against time since "
    << format_iso8601_utc(v.start) << ". " << kScreeningCaution << "\n";
  t << "event_id,time,days_since_start,distance_m,magnitude,diffusivity_through_point_m2_s\n";
  for (const auto& p : v.points) {
    const auto& e = c.events[p.event];
    t << csv_field(e.id) << "," << format_iso8601_utc(e.time) << "," << fixed_decimals(p.t / units::kDay, 4) << ","
      << fixed_decimals(p.r, 1) << "," << util::number_text(e.magnitude, 4) << "," << util::number_text(p.d_fit, 6) << "\n";
  }
  return t.str();
}

std::string rt_fronts_csv(const screening::RtView& v) {
  std::ostringstream fc;
  fc << "# Triggering fronts r = sqrt(4 pi D t) (Shapiro et al. 1997). " << kScreeningCaution << "\n";
  fc << "days_since_start";
  for (double d : v.diffusivities) fc << ",front_m_D_" << util::number_text(d, 4) << "_m2_s";
  fc << "\n";
  double t_max = 0.0;
  for (const auto& p : v.points) t_max = std::max(t_max, p.t);
  if (t_max <= 0.0) t_max = 365.25 * units::kDay;
  const int n = 200;
  for (int k = 0; k <= n; ++k) {
    const double tt = t_max * k / n;
    fc << fixed_decimals(tt / units::kDay, 4);
    for (double d : v.diffusivities) fc << "," << fixed_decimals(seismo::front_radius(d, tt), 1);
    fc << "\n";
  }
  return fc.str();
}

}  // namespace slipscreen::outputs
