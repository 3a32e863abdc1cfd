// The pressure observations file (docs/conditioning.md); see observations.hpp.
#include "scenario/observations.hpp"

#include <cmath>

#include "core/errors.hpp"
#include "core/util/trim.hpp"
#include "scenario/csv_cells.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {
namespace {

using units::Dimension;

// Observed pressure changes and their standard deviations: up to 200 MPa (common practice: no
// injection raises pore pressure by more than the overburden at 15 km, ~350 MPa, and screens
// stay far below).
constexpr plausible::Range kObservedChange{-200e6, 200e6, false, false, "a pressure change from -200 to 200 MPa"};
constexpr plausible::Range kObservedSd{0.0, 200e6, true, false, "a standard deviation in (0, 200 MPa]"};
constexpr plausible::Range kObservedPressure{0.0, 400e6, false, false, "an absolute pressure from 0 to 400 MPa"};
constexpr plausible::Range kObservedDepth{0.0, 15000.0, true, false, "a depth below the surface in (0, 15 km]"};

}  // namespace

std::vector<PressureObservationSpec> read_pressure_observations(const formats::CsvTable& t, const std::string& default_crs,
                                                                double pore_pressure_gradient) {
  const std::size_t c_id = need_column(t, "id", {"well"});
  const bool lonlat = t.column("lon").has_value() || t.column("lat").has_value();
  const std::size_t c_x = need_column(t, lonlat ? "lon" : "x");
  const std::size_t c_y = need_column(t, lonlat ? "lat" : "y");
  const std::size_t c_date = need_column(t, "date");
  const auto c_dp = t.column("dp");
  const auto c_p = t.column("p");
  const auto c_depth = t.column("depth");
  if (c_dp && (c_p || c_depth))
    throw InputError("columns", "dp and " + std::string(c_p ? "p" : "depth"),
                     "either a 'dp' column (pressure change) or 'p' and 'depth' columns (absolute pressure), not both",
                     t.file + " line " + std::to_string(t.header_line));
  if (!c_dp && !(c_p && c_depth))
    throw InputError(c_p ? "column 'depth'" : c_depth ? "column 'p'" : "column 'dp'", "(missing)",
                     "a 'dp' column (observed pressure change, e.g. 'dp [psi]') or 'p' and 'depth' columns "
                     "(absolute pressure at a depth, Δp = p − p0 from the region's pore_pressure_gradient)",
                     t.file + " line " + std::to_string(t.header_line));
  const std::size_t c_sd = need_column(t, "sd");
  std::string crs = t.comment_value("crs").value_or(default_crs);
  if (crs.empty())
    throw InputError("crs", "(missing)", "a '# crs: EPSG:....' line before the header, or a wells CRS in the scenario",
                     t.file);
  if (lonlat && !t.comment_value("crs")) crs = "EPSG:4326";

  std::vector<PressureObservationSpec> out;
  for (const auto& row : t.rows) {
    PressureObservationSpec o;
    o.id = util::trim(row.fields[c_id]);
    if (o.id.empty()) throw InputError("id", "", "the id of the monitoring point (a well id)", t.where(row, c_id));
    o.x = coordinate_cell(t, row, c_x, lonlat ? plausible::kLongitude : plausible::kProjectedCoordinate);
    o.y = coordinate_cell(t, row, c_y, lonlat ? plausible::kLatitude : plausible::kProjectedCoordinate);
    o.crs = crs;
    o.date = parse_date_cell(t, row, c_date, false);
    o.time = util::to_seconds(o.date);
    if (c_dp) {
      o.dp = checked_cell(t, row, *c_dp, Dimension::pressure, kObservedChange);
    } else {
      const double p = checked_cell(t, row, *c_p, Dimension::pressure, kObservedPressure);
      const double depth = checked_cell(t, row, *c_depth, Dimension::length, kObservedDepth);
      o.dp = p - pore_pressure_gradient * depth;
    }
    o.sd = checked_cell(t, row, c_sd, Dimension::pressure, kObservedSd);
    o.source = t.where(row);
    out.push_back(std::move(o));
  }
  if (out.empty()) throw InputError("rows", "(none)", "at least one observation", t.file);
  return out;
}

}  // namespace slipscreen::scenario
