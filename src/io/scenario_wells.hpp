#pragma once
// Wells and injection histories from CSV (docs/scenario.md, "Wells" and "Histories"), and the
// inline planned schedules of proposed wells ("2e4 bbl/d from 2027-01-01 to 2030-01-01").
#include <string>
#include <string_view>
#include <vector>

#include "core/units/units.hpp"
#include "io/csv.hpp"
#include "io/scenario.hpp"

namespace slipscreen::io {

// Wells table: id, x and y (or lon and lat), top, bottom, radius, optional status. Values carry
// units in the cell ("2300 m") or the header ("top [m]"). `crs` comes from a "# crs: ..."
// comment line or from `scenario_crs`; lon/lat columns default to EPSG:4326.
std::vector<WellSpec> read_wells(const CsvTable& table, const std::string& scenario_crs);

// Histories table: well, then month (YYYY-MM) or start and end (YYYY-MM-DD, end exclusive),
// then volume (per row) or rate (mean over the period). Adds sorted, non-overlapping periods
// to the wells; an unknown well id, bad date, negative or unitless value, or overlapping
// periods of one well is an InputError naming file, line, column and value.
void read_histories(const CsvTable& table, std::vector<WellSpec>& wells);

// One planned-schedule entry "<rate> from <date> to <date>". `where` names its place.
RatePeriod parse_schedule_entry(std::string_view text, const std::string& where, const std::string& field);

// Sorts a well's periods and refuses overlaps (naming both sources).
void check_periods(WellSpec& well);

// A value with a unit from a CSV cell (unit in the cell, or in the column header).
double cell_quantity(const CsvTable& table, const CsvRow& row, std::size_t col, units::Dimension d);

}  // namespace slipscreen::io
