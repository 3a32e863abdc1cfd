#include "scenario/wells.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <map>

#include "core/errors.hpp"
#include "core/util/trim.hpp"
#include "core/units/units.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/suggest.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::scenario {

using units::Dimension;

namespace {

std::size_t need_column(const formats::CsvTable& t, std::string_view name, const std::vector<std::string>& also = {}) {
  if (auto c = t.column(name)) return *c;
  for (const auto& a : also)
    if (auto c = t.column(a)) return *c;
  std::vector<std::string> names;
  for (const auto& h : t.header) names.push_back(formats::split_header_unit(h).name);
  throw InputError("column '" + std::string(name) + "'", "(missing)",
                   "a header column named '" + std::string(name) + "'" + util::did_you_mean(name, names),
                   t.file + " line " + std::to_string(t.header_line));
}

double cell_number(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col) {
  const std::string s = util::trim(row.fields[col]);
  double v = 0;
  const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || ptr != s.data() + s.size() || s.empty() || !std::isfinite(v))
    throw InputError(formats::split_header_unit(t.header[col]).name, s, "a plain number (coordinate)", t.where(row, col));
  return v;
}

util::CivilDate parse_date_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col, bool month) {
  const std::string s = util::trim(row.fields[col]);
  const auto d = month ? util::parse_iso_month(s) : util::parse_iso_date(s);
  if (!d)
    throw InputError(formats::split_header_unit(t.header[col]).name, s,
                     month ? "a month as YYYY-MM, e.g. 2019-07"
                           : formats::date_expectation(s, "a date as YYYY-MM-DD, e.g. 2019-07-01"),
                     t.where(row, col));
  return *d;
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
    w.x = cell_number(t, row, c_x);
    w.y = cell_number(t, row, c_y);
    if (lonlat && (w.y < -90 || w.y > 90))
      throw InputError("lat", util::trim(row.fields[c_y]), "a latitude in [-90, 90] degrees", t.where(row, c_y));
    w.crs = crs;
    w.top = formats::cell_quantity(t, row, c_top, Dimension::length);
    w.bottom = formats::cell_quantity(t, row, c_bottom, Dimension::length);
    if (!(w.bottom > w.top))
      throw InputError("bottom", util::trim(row.fields[c_bottom]), "a depth below the top of the interval", t.where(row, c_bottom));
    w.radius = formats::cell_quantity(t, row, c_radius, Dimension::length);
    if (!(w.radius > 0 && w.radius < 5))
      throw InputError("radius", util::trim(row.fields[c_radius]), "a well radius between 0 and 5 m", t.where(row, c_radius));
    if (c_status) w.status = parse_status(util::trim(row.fields[*c_status]), "status", t.where(row, *c_status));
    w.proposed = w.status == WellStatus::proposed;
    w.source = t.where(row);
    wells.push_back(std::move(w));
  }
  if (wells.empty()) throw InputError("rows", "(none)", "at least one well", t.file);
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
  const std::string from = util::trim(s.substr(f + 6, t - f - 6)), to = util::trim(s.substr(t + 4));
  const auto d0 = util::parse_iso_date(from);
  const auto d1 = util::parse_iso_date(to);
  if (!d0 || !d1) throw InputError(field, s, formats::date_expectation(d0 ? to : from, expected), where);
  p.start = util::to_seconds(*d0);
  p.end = util::to_seconds(*d1);
  if (!(p.end > p.start)) throw InputError(field, s, "an end date after the start date", where);
  p.source = where;
  return p;
}

}  // namespace slipscreen::scenario
