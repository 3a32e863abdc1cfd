#pragma once
// Wells and injection histories from CSV (docs/scenario.md, "Wells" and "Histories"), and the
// inline planned schedules of proposed wells ("2e4 bbl/d from 2027-01-01 to 2030-01-01").
#include <string>
#include <string_view>
#include <vector>

#include "core/units/units.hpp"
#include "formats/table/csv.hpp"
#include "scenario/unset.hpp"

namespace slipscreen::scenario {

enum class WellStatus { active, shut_in, plugged, proposed };
const char* status_name(WellStatus s);

// A constant rate over [start, end) (seconds since 1970-01-01), m^3/s, >= 0.
struct RatePeriod {
  double start = 0, end = 0;
  double rate = 0;
  std::string source;  // "histories.csv line 14" (for messages)
  bool assumed = false;  // an assumed continuation (histories.continue_active_until), not reported
};

struct WellSpec {
  std::string id;
  double x = 0, y = 0;   // in `crs` (lon/lat in degrees when geographic)
  std::string crs;
  double top = kUnset, bottom = kUnset;  // m, injection interval (depths)
  double radius = kUnset;                // m
  WellStatus status = WellStatus::active;
  bool proposed = false;
  std::vector<RatePeriod> periods;  // sorted, non-overlapping; gaps mean no injection
  std::string source;               // where it was defined

  double volume_until(double t) const;           // m^3 injected before time t
  double reported_volume_until(double t) const;  // the same without assumed continuations
};

// Wells table: id, x and y (or lon and lat), top, bottom, radius, optional status. Values carry
// units in the cell ("2300 m") or the header ("top [m]"). `crs` comes from a "# crs: ..."
// comment line or from `scenario_crs`; lon/lat columns default to EPSG:4326.
std::vector<WellSpec> read_wells(const formats::CsvTable& table, const std::string& scenario_crs);

// Histories table: well, then month (YYYY-MM) or start and end (YYYY-MM-DD, end exclusive),
// then volume (per row) or rate (mean over the period). Adds sorted, non-overlapping periods
// to the wells; an unknown well id, bad date, negative or unitless value, or overlapping
// periods of one well is an InputError naming file, line, column and value.
void read_histories(const formats::CsvTable& table, std::vector<WellSpec>& wells);

// One planned-schedule entry "<rate> from <date> to <date>". `where` names its place.
RatePeriod parse_schedule_entry(std::string_view text, const std::string& where, const std::string& field);

// Active wells (status active, with a history) continue after their last reported period at
// the mean rate of their last 12 reported months (or fewer, if the history is shorter), until
// `until` (s). Wells whose history already reaches `until` are unchanged.
void continue_active_wells(std::vector<WellSpec>& wells, double until, const std::string& where);

// Sorts a well's periods and refuses overlaps (naming both sources).
void check_periods(WellSpec& well);


}  // namespace slipscreen::scenario
