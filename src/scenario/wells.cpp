#include "scenario/wells.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <map>

#include "core/errors.hpp"
#include "core/util/trim.hpp"
#include "core/units/units.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "formats/gis/crs.hpp"
#include "scenario/csv_cells.hpp"
#include "scenario/plausibility.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

// True when `crs` names a projected CRS; false for a geographic one and for text OSR does not
// know (the run names an unknown CRS when it reprojects the wells).
bool is_projected(const std::string& crs) {
  try {
    return formats::Crs::from_user_string(crs).is_projected();
  } catch (const InputError&) {
    return false;
  }
}

// Every well of a file with a projected CRS at |x| <= 180 and |y| <= 90: degrees written as if
// they were projected coordinates.
void refuse_degrees_as_projected(const formats::CsvTable& t, const std::vector<WellSpec>& wells, std::size_t c_x,
                                 std::size_t c_y, const std::string& crs) {
  for (const auto& w : wells)
    if (!plausible::looks_like_degrees(w.x, w.y)) return;
  if (!is_projected(crs)) return;
  const formats::CsvRow& row = t.rows.front();
  throw InputError("x, y", util::trim(row.fields[c_x]) + ", " + util::trim(row.fields[c_y]),
                   "coordinates in " + crs + " (a projected CRS): every well has |x| <= 180 and |y| <= 90, "
                   "which look like longitude and latitude in degrees; write them in 'lon' and 'lat' columns "
                   "(WGS 84) or give x and y in the CRS's unit",
                   t.where(row, c_x));
}

WellStatus parse_status(const std::string& s, const std::string& field, const std::string& where) {
  std::string k = s;
  std::replace(k.begin(), k.end(), '-', '_');
  std::transform(k.begin(), k.end(), k.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (k.empty() || k == "active") return WellStatus::active;
  if (k == "shut_in" || k == "shutin") return WellStatus::shut_in;
  if (k == "plugged") return WellStatus::plugged;
  if (k == "proposed") return WellStatus::proposed;
  throw InputError(field, s, "a well status: active, shut-in, plugged or proposed", where);
}

}  // namespace

const char* status_name(WellStatus s) {
  switch (s) {
    case WellStatus::active: return "active";
    case WellStatus::shut_in: return "shut-in";
    case WellStatus::plugged: return "plugged";
    case WellStatus::proposed: return "proposed";
  }
  return "?";
}

double WellSpec::volume_until(double t) const {
  double v = 0;
  for (const auto& p : periods)
    if (p.start < t) v += p.rate * (std::min(t, p.end) - p.start);
  return v;
}

double WellSpec::reported_volume_until(double t) const {
  double v = 0;
  for (const auto& p : periods)
    if (p.start < t && !p.assumed) v += p.rate * (std::min(t, p.end) - p.start);
  return v;
}

std::vector<WellSpec> read_wells(const formats::CsvTable& t, const std::string& scenario_crs) {
  const std::size_t c_id = need_column(t, "id", {"well", "well_id"});
  const bool lonlat = t.column("lon").has_value() || t.column("lat").has_value();
  const std::size_t c_x = need_column(t, lonlat ? "lon" : "x");
  const std::size_t c_y = need_column(t, lonlat ? "lat" : "y");
  const std::size_t c_top = need_column(t, "top");
  const std::size_t c_bottom = need_column(t, "bottom");
  const std::size_t c_radius = need_column(t, "radius");
  const auto c_status = t.column("status");

  std::string crs = t.comment_value("crs").value_or("");
  if (!crs.empty() && !scenario_crs.empty() && crs != scenario_crs)
    throw InputError("crs", crs, "the same CRS as the scenario's wells.crs ('" + scenario_crs + "')",
                     t.file + " (header comment)");
  if (crs.empty()) crs = scenario_crs;
  if (lonlat && is_projected(crs))
    throw InputError("crs", crs,
                     "a geographic CRS such as EPSG:4326 for 'lon' and 'lat' columns (degrees), or 'x' and 'y' "
                     "columns for a projected CRS",
                     t.file + (t.comment_value("crs") ? " (header comment)" : ""));
  if (crs.empty()) {
    if (!lonlat)
      throw InputError("crs", "(missing)", "a '# crs: EPSG:....' line before the header, or wells.crs in the scenario",
                       t.file);
    crs = "EPSG:4326";
  }

  std::vector<WellSpec> wells;
  std::map<std::string, std::size_t> seen;
  for (const auto& row : t.rows) {
    WellSpec w;
    w.id = util::trim(row.fields[c_id]);
    if (w.id.empty()) throw InputError("id", "", "a well id", t.where(row, c_id));
    if (auto it = seen.find(w.id); it != seen.end())
      throw InputError("id", w.id, "a well id not used before (first on line " + std::to_string(it->second) + ")",
                       t.where(row, c_id));
    seen.emplace(w.id, row.line);
    w.x = coordinate_cell(t, row, c_x, lonlat ? plausible::kLongitude : plausible::kProjectedCoordinate);
    w.y = coordinate_cell(t, row, c_y, lonlat ? plausible::kLatitude : plausible::kProjectedCoordinate);
    w.crs = crs;
    w.top = checked_cell(t, row, c_top, Dimension::length, plausible::kWellTop);
    w.bottom = checked_cell(t, row, c_bottom, Dimension::length, plausible::kWellBottom);
    if (!(w.bottom > w.top))
      throw InputError("bottom", util::trim(row.fields[c_bottom]), "a depth below the top of the interval", t.where(row, c_bottom));
    w.radius = checked_cell(t, row, c_radius, Dimension::length, plausible::kWellRadius);
    if (c_status) w.status = parse_status(util::trim(row.fields[*c_status]), "status", t.where(row, *c_status));
    w.proposed = w.status == WellStatus::proposed;
    w.source = t.where(row);
    wells.push_back(std::move(w));
  }
  if (wells.empty()) throw InputError("rows", "(none)", "at least one well", t.file);
  if (!lonlat) refuse_degrees_as_projected(t, wells, c_x, c_y, crs);
  return wells;
}

void check_periods(WellSpec& w) {
  std::stable_sort(w.periods.begin(), w.periods.end(),
                   [](const RatePeriod& a, const RatePeriod& b) { return a.start < b.start; });
  for (std::size_t i = 1; i < w.periods.size(); ++i) {
    const auto& a = w.periods[i - 1];
    const auto& b = w.periods[i];
    if (b.start < a.end)
      throw InputError("period", util::format_iso_date(util::date_at(b.start)) + " to " +
                                     util::format_iso_date(util::date_at(b.end)),
                       "no overlap with the period from " + util::format_iso_date(util::date_at(a.start)) + " to " +
                           util::format_iso_date(util::date_at(a.end)) + " of well '" + w.id + "' (" + a.source + ")",
                       b.source);
  }
}

namespace {

// The largest volume of a period: the largest plausible rate over its duration.
std::string volume_expected(double duration) {
  const double days = duration / units::kDay;
  return "a volume from 0 to " + util::number_text(plausible::kMaxRate * duration / units::kBarrel, 3) +
         " bbl for this " + util::number_text(days, 6) + "-day period (a mean rate of at most 1e6 bbl/d, 1.84 m3/s: a " +
         "larger rate is not one injection well)";
}

}  // namespace

void read_histories(const formats::CsvTable& t, std::vector<WellSpec>& wells) {
  const std::size_t c_well = need_column(t, "well", {"well_id", "id"});
  const auto c_month = t.column("month");
  std::size_t c_start = 0, c_end = 0;
  if (!c_month) {
    c_start = need_column(t, "start");
    c_end = need_column(t, "end");
  }
  const auto c_volume = t.column("volume");
  const auto c_rate = t.column("rate");
  if (c_volume.has_value() == c_rate.has_value())
    throw InputError("columns", c_volume ? "volume and rate" : "(neither)", "exactly one of the columns 'volume' or 'rate'",
                     t.file + " line " + std::to_string(t.header_line));

  std::map<std::string, WellSpec*> by_id;
  std::vector<std::string> ids;
  for (auto& w : wells) {
    by_id[w.id] = &w;
    ids.push_back(w.id);
  }
  for (const auto& row : t.rows) {
    const std::string id = util::trim(row.fields[c_well]);
    auto it = by_id.find(id);
    if (it == by_id.end())
      throw InputError("well", id, "a well id from the wells table" + util::did_you_mean(id, ids), t.where(row, c_well));
    RatePeriod p;
    if (c_month) {
      const auto m = parse_date_cell(t, row, *c_month, true);
      p.start = util::to_seconds(m);
      p.end = util::to_seconds(util::add_months(m, 1));
    } else {
      p.start = util::to_seconds(parse_date_cell(t, row, c_start, false));
      p.end = util::to_seconds(parse_date_cell(t, row, c_end, false));
      if (!(p.end > p.start))
        throw InputError("end", util::trim(row.fields[c_end]), "a date after the start date (the end is exclusive)",
                         t.where(row, c_end));
    }
    const std::size_t c = c_volume ? *c_volume : *c_rate;
    const double v = formats::cell_quantity(t, row, c, c_volume ? Dimension::volume : Dimension::volume_rate);
    if (v < 0)
      throw InputError(formats::split_header_unit(t.header[c]).name, util::trim(row.fields[c]), "a value >= 0 (injection)", t.where(row, c));
    p.rate = c_volume ? v / (p.end - p.start) : v;
    if (!plausible::kInjectionRate.contains(p.rate))
      throw InputError(formats::split_header_unit(t.header[c]).name, util::trim(row.fields[c]),
                       c_volume ? volume_expected(p.end - p.start) : plausible::kInjectionRate.expected, t.where(row, c));
    p.source = t.where(row);
    it->second->periods.push_back(p);
  }
  for (auto& w : wells) check_periods(w);
}

void continue_active_wells(std::vector<WellSpec>& wells, double until, const std::string& where) {
  for (auto& w : wells) {
    if (w.status != WellStatus::active || w.periods.empty() || !(w.periods.back().end < until)) continue;
    const double end = w.periods.back().end;
    const double from = util::to_seconds(util::add_months(util::date_at(end), -12));
    double volume = 0;
    for (const auto& p : w.periods) {
      const double a = std::max(p.start, from), b = p.end;
      if (b > a) volume += p.rate * (b - a);
    }
    const double duration = end - std::max(from, w.periods.front().start);  // gaps count as zero
    RatePeriod p;
    p.start = end;
    p.end = until;
    p.rate = duration > 0 ? volume / duration : 0.0;
    p.source = where + " (continued at the mean rate of the last 12 reported months)";
    p.assumed = true;
    w.periods.push_back(p);
  }
}

RatePeriod parse_schedule_entry(std::string_view text, const std::string& where, const std::string& field) {
  const std::string expected = "'<rate> from <YYYY-MM-DD> to <YYYY-MM-DD>', e.g. '2e4 bbl/d from 2027-01-01 to 2030-01-01'";
  const std::string s(text);
  const auto f = s.find(" from ");
  const auto t = s.find(" to ", f == std::string::npos ? 0 : f);
  if (f == std::string::npos || t == std::string::npos) throw InputError(field, s, expected, where);
  RatePeriod p;
  try {
    p.rate = units::parse(s.substr(0, f), Dimension::volume_rate, field);
  } catch (const InputError& e) {
    throw e.located(where);
  }
  if (p.rate < 0) throw InputError(field, s, "a rate >= 0 (injection)", where);
  if (!plausible::kInjectionRate.contains(p.rate)) throw InputError(field, s, plausible::kInjectionRate.expected, where);
  const std::string from = util::trim(s.substr(f + 6, t - f - 6)), to = util::trim(s.substr(t + 4));
  const auto d0 = util::parse_iso_date(from);
  const auto d1 = util::parse_iso_date(to);
  if (!d0 || !d1) throw InputError(field, s, formats::date_expectation(d0 ? to : from, expected), where);
  if (!plausible::plausible_date(*d0) || !plausible::plausible_date(*d1))
    throw InputError(field, s, std::string("dates from 1900-01-01 to 2200-12-31"), where);
  p.start = util::to_seconds(*d0);
  p.end = util::to_seconds(*d1);
  if (!(p.end > p.start)) throw InputError(field, s, "an end date after the start date", where);
  p.source = where;
  return p;
}

}  // namespace slipscreen::scenario
