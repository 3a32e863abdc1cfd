#include "outputs/catalog_summary_json.hpp"

#include <cmath>

#include "formats/table/iso_time.hpp"

namespace slipscreen::outputs {
namespace {

using nlohmann::json;

json finite(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }

json note_or_null(const std::string& note) { return note.empty() ? json(nullptr) : json(note); }

// The catalog as read and the filter's counts.
void read_and_filter(json& j, const formats::CatalogReadResult& read, const seismo::FilterCounts& c) {
  json rejected = json::array();
  for (const auto& r : read.rejected) rejected.push_back({{"line", r.line}, {"reason", r.reason}});
  j["catalog"] = {{"path", read.path},
                  {"format", read.format},
                  {"columns", read.columns.empty() ? json(nullptr) : json(read.columns)},
                  {"description", read.catalog.description},
                  {"crs", read.catalog.crs},
                  {"records", read.records},
                  {"events_read", read.catalog.events.size()},
                  {"rejected_count", read.rejected.size()},
                  {"rejected", rejected},
                  {"warnings", read.warnings}};
  j["filter"] = {{"input", c.input},
                 {"kept", c.kept},
                 {"outside_time_window", c.outside_time},
                 {"outside_polygon", c.outside_polygon},
                 {"outside_buffer", c.outside_buffer},
                 {"outside_depth_range", c.outside_depth},
                 {"missing_depth", c.missing_depth},
                 {"other_magnitude_type", c.other_magnitude_type},
                 {"unknown_magnitude_type", c.unknown_magnitude_type},
                 {"below_minimum_magnitude", c.below_magnitude}};
}

json completeness_json(const seismo::CatalogSummary& s) {
  json mc = {{"method", s.mc_given ? "given" : "maximum curvature (Wiemer & Wyss 2000)"},
             {"mc", s.has_mc ? finite(s.mc) : json(nullptr)},
             {"events_at_or_above_mc", s.events_at_or_above_mc},
             {"note", note_or_null(s.mc_note)}};
  if (s.completeness) {
    mc["mc_maximum_curvature"] = s.completeness->mc_curvature;
    mc["correction"] = s.completeness->correction;
  }
  return mc;
}

json b_value_json(const seismo::CatalogSummary& s) {
  json b = {{"method", "Aki (1965) maximum likelihood, Utsu binning correction; sigma Shi & Bolt (1982)"},
            {"note", note_or_null(s.b_note)}};
  if (s.b) {
    b["b"] = finite(s.b->b);
    b["sigma"] = finite(s.b->sigma);
    b["a"] = finite(s.b->a);
    b["n"] = s.b->n;
    b["mean_magnitude"] = finite(s.b->mean);
    b["bin_width"] = s.b->bin_width;
  } else {
    b["b"] = nullptr;
  }
  if (s.bootstrap)
    b["bootstrap"] = {{"lower", s.bootstrap->lower},           {"upper", s.bootstrap->upper},
                      {"median", s.bootstrap->median},         {"confidence", s.bootstrap->confidence},
                      {"resamples", s.bootstrap->resamples},   {"seed", s.bootstrap->seed}};
  else if (!s.bootstrap_note.empty())
    b["bootstrap"] = {{"note", s.bootstrap_note}};
  return b;
}

json seismogenic_index_json(const seismo::CatalogSummary& s) {
  json si = {{"method", "Shapiro et al. (2010), Poisson maximum likelihood"},
             {"note", note_or_null(s.seismogenic_index_note)}};
  if (s.seismogenic_index) {
    const auto& f = *s.seismogenic_index;
    si["sigma"] = finite(f.sigma);
    si["sigma_se_count"] = finite(f.sigma_count_se);
    si["sigma_se_b"] = finite(f.sigma_b_se);
    si["events"] = f.events;
    si["volume_m3"] = f.volume;
    si["window_start"] = formats::format_iso8601_utc(f.window_start);
    si["window_end"] = formats::format_iso8601_utc(f.window_end);
  } else {
    si["sigma"] = nullptr;
  }
  return si;
}

}  // namespace

json catalog_summary_json(const formats::CatalogReadResult& read, const seismo::FilterCounts& c,
                          const seismo::CatalogSummary& s) {
  json j;
  j["caution"] = kScreeningCaution;
  read_and_filter(j, read, c);
  j["events"] = s.events;
  j["first_time"] = s.first_time ? json(formats::format_iso8601_utc(*s.first_time)) : json(nullptr);
  j["last_time"] = s.last_time ? json(formats::format_iso8601_utc(*s.last_time)) : json(nullptr);
  j["magnitude_min"] = s.min_magnitude ? finite(*s.min_magnitude) : json(nullptr);
  j["magnitude_max"] = s.max_magnitude ? finite(*s.max_magnitude) : json(nullptr);
  json fmd = json::array();
  for (const auto& b : s.fmd) fmd.push_back({{"magnitude", b.centre}, {"count", b.count}});
  j["frequency_magnitude"] = fmd;

  j["completeness"] = completeness_json(s);
  j["b_value"] = b_value_json(s);
  if (s.mcgarr_moment)
    j["mcgarr_bound"] = {{"method", "McGarr (2014) M0 <= G dV; Mw = (2/3)(log10 M0 - 9.1) (IASPEI 2013)"},
                         {"net_volume_m3", s.net_volume},
                         {"shear_modulus_Pa", s.shear_modulus},
                         {"max_moment_N_m", finite(*s.mcgarr_moment)},
                         {"max_mw", s.mcgarr_mw ? finite(*s.mcgarr_mw) : json(nullptr)}};
  else
    j["mcgarr_bound"] = nullptr;

  j["seismogenic_index"] = seismogenic_index_json(s);
  json fc = json::array();
  for (const auto& f : s.forecasts)
    fc.push_back({{"magnitude", f.magnitude},
                  {"planned_volume_m3", f.planned_volume},
                  {"expected_events", finite(f.expected)},
                  {"probability_at_least_one", finite(f.probability)}});
  j["forecasts"] = fc;
  j["forecast_note"] = note_or_null(s.forecast_note);
  json fb = json::array();
  for (const auto& f : s.fault_bounds)
    fb.push_back({{"fault", f.name},
                  {"length_m", f.length},
                  {"magnitude", finite(f.estimate.magnitude)},
                  {"sd", f.estimate.sd},
                  {"extrapolated", f.estimate.extrapolated}});
  j["fault_length_bounds"] = {{"regression", s.regression}, {"faults", fb}};
  j["assumptions"] = s.assumptions;
  return j;
}

}  // namespace slipscreen::outputs
