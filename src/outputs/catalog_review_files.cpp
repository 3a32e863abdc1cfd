#include "outputs/catalog_review_files.hpp"

#include <algorithm>
#include <sstream>

#include "core/units/units.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "core/util/number_text.hpp"
#include "outputs/catalog_summary_json.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"
#include "outputs/rt_tables.hpp"

namespace slipscreen::outputs {
using formats::csv_field;
using util::fixed_decimals;
using formats::format_iso8601_utc;
using formats::write_text_file;

nlohmann::json catalog_review_json(const scenario::ResolvedScenario& s, const screening::PreparedRun& p, const screening::CatalogReview& v) {
  nlohmann::json j = catalog_summary_json(v.read, v.counts, v.summary);
  const auto& fc = v.footprint;
  std::size_t near_reached = 0, with_p = 0;
  for (const auto& e : v.events) {
    near_reached += e.segment_reached;
    with_p += e.probability_time.has_value();
  }
  nlohmann::json fronts = nlohmann::json::array();
  if (v.rt)
    for (std::size_t i = 0; i < v.rt->diffusivities.size(); ++i)
      fronts.push_back({{"diffusivity_m2_per_s", v.rt->diffusivities[i]}, {"fraction_inside", v.rt->fraction_inside[i]}});
  j["against_model"] = {
      {"scenario", s.file},
      {"working_crs", p.working.authority()},
      {"events_reviewed", v.events.size()},
      {"footprint",
       {{"threshold_MPa", v.spec.footprint_threshold / kMPa},
        {"events_in_study_area", fc.events},
        {"inside", fc.inside},
        {"expected_by_chance", v.footprint_expected},
        {"mean_area_fraction", fc.area_fraction},
        {"p_value", fc.p_value},
        {"method", "one-sided binomial tail with the mean area fraction (conservative, Hoeffding 1956)"}}},
      {"events_whose_nearest_segment_reached_dp_crit", near_reached},
      {"events_with_slip_probability", with_p},
      {"rt_view",
       v.rt ? nlohmann::json{{"well", v.rt->well},
                             {"start", format_iso8601_utc(v.rt->start)},
                             {"events_after_start", v.rt->points.size()},
                             {"fronts", fronts},
                             {"method", "triggering front r = sqrt(4 pi D t) (Shapiro et al. 1997)"}}
            : nlohmann::json(nullptr)},
      {"seismicity_rate", v.spec.rate_state ? nlohmann::json{{"method", v.poroelastic_path
                                                                           ? "Dieterich (1994) rate-and-state, dCFF along "
                                                                             "the poroelastic stress path"
                                                                           : "Dieterich (1994) rate-and-state, dCFF = mu dp"},
                                                             {"background_rate_per_km_per_year",
                                                              v.spec.background_rate_per_m * 1000.0 * units::kYear},
                                                             {"a_sigma_MPa", v.spec.a_sigma / kMPa},
                                                             {"aftershock_duration_years",
                                                              v.spec.aftershock_duration / units::kYear}}
                                            : nlohmann::json(nullptr)},
      {"catalog_end", format_iso8601_utc(v.catalog_end)}};
  for (const auto& a : v.assumptions) j["assumptions"].push_back(a);
  return j;
}

nlohmann::json catalog_manifest(const screening::CatalogReview& v) {
  const auto& c = v.spec;
  const auto opt = [](const std::optional<double>& x) { return x ? nlohmann::json(*x) : nlohmann::json(nullptr); };
  return {{"file", c.file},
          {"format", v.read.format},
          {"columns", c.columns},
          {"strict", c.strict},
          {"from_s", opt(c.from)},
          {"to_s", opt(c.to)},
          {"depth_min_m", opt(c.depth_min)},
          {"depth_max_m", opt(c.depth_max)},
          {"magnitude_types", c.magnitude_types},
          {"well_buffer_m", opt(c.well_buffer)},
          {"polygon_working_crs", c.polygon},
          {"bin_width", c.bin_width},
          {"mc_correction", c.mc_correction},
          {"mc", opt(c.mc)},
          {"bootstrap", c.bootstrap},
          {"bootstrap_confidence", c.bootstrap_confidence},
          {"shear_modulus_Pa", c.shear_modulus},
          {"forecast_magnitudes", c.forecast_magnitudes},
          {"length_regression", c.length_regression},
          {"footprint_threshold_Pa", c.footprint_threshold},
          {"rt_well", v.rt ? nlohmann::json(v.rt->well) : nlohmann::json(nullptr)},
          {"rate_state", c.rate_state ? nlohmann::json{{"background_rate_per_m_per_s", c.background_rate_per_m},
                                                       {"a_sigma_Pa", c.a_sigma},
                                                       {"aftershock_duration_s", c.aftershock_duration}}
                                      : nlohmann::json(nullptr)},
          {"records", v.read.records},
          {"unusable_records", v.read.rejected.size()},
          {"events_kept", v.catalog.events.size()}};
}

namespace {

std::string yes_no(bool b) { return b ? "yes" : "no"; }

// catalog_events.csv: every kept event with its attributes against the model.
std::string events_csv(const scenario::ResolvedScenario& s, const screening::PreparedRun& p,
                       const screening::CatalogReview& v) {
  const bool seg = !p.segments.empty();
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure, L = Quantity::length;
  std::ostringstream ev;
  // x_m, y_m: working-CRS coordinates, in the CRS's unit in either system.
  ev << "event_id,time,x_m,y_m," << u.column("depth", L) << ",magnitude,magnitude_type,in_study_area,"
     << u.column("dp", P) << ",in_footprint,footprint_area_fraction,nearest_segment,nearest_fault,"
     << u.column("distance", L) << ',' << u.column("segment_dp", P) << ',' << u.column("segment_dp_crit", P)
     << ",segment_reached_dp_crit,p_slip,p_slip_low,p_slip_high,p_slip_date,rt_time_since_start_days,"
     << u.column("rt_distance", L) << ",source\n";
  for (std::size_t i = 0; i < v.events.size(); ++i) {
    const auto& e = v.catalog.events[i];
    const auto& m = v.events[i];
    ev << csv_field(e.id) << "," << format_iso8601_utc(e.time) << "," << fixed_decimals(m.x, 1) << ","
       << fixed_decimals(m.y, 1) << "," << (e.depth ? u.text(*e.depth, L, 1) : "") << ","
       << fixed_decimals(e.magnitude, 2) << "," << csv_field(e.magnitude_type) << "," << yes_no(m.in_study_area) << ","
       << u.text(m.dp, P, 6) << "," << yes_no(m.dp >= v.spec.footprint_threshold) << ","
       << fixed_decimals(m.footprint_fraction, 6) << ",";
    if (seg)
      ev << csv_field(p.segments[m.segment].segment_id) << "," << csv_field(p.segments[m.segment].fault_id) << ","
         << u.text(m.distance, L, 1) << "," << u.text(m.segment_dp, P, 6) << ","
         << u.text(m.segment_dp_crit, P, 6) << "," << yes_no(m.segment_reached) << ",";
    else
      ev << ",,,,,,";
    if (m.probability_time)
      ev << fixed_decimals(m.p_slip, 6) << "," << fixed_decimals(m.p_low, 6) << "," << fixed_decimals(m.p_high, 6) << ","
         << util::format_iso_date(s.output.dates[*m.probability_time]) << ",";
    else
      ev << ",,,,";
    ev << (m.rt_time ? fixed_decimals(*m.rt_time / units::kDay, 4) : "") << ","
       << (m.rt_distance ? u.text(*m.rt_distance, L, 1) : "") << "," << csv_field(e.source) << "\n";
  }
  return ev.str();
}

// seismicity_rate.csv (per segment) and seismicity_rate_faults.csv (per fault: rates and counts
// summed over its segments, largest ΔCFF).
void write_rate_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                       const screening::PreparedRun& p, const screening::CatalogReview& v) {
  const double yr = units::kYear;
  const std::size_t K = s.output.times.size();
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  std::ostringstream t;
  t << "segment_id,fault_id,date," << u.column("dcff", P)
    << ",background_rate_per_year,rate_per_year,rate_ratio,expected_events,background_expected_events\n";
  for (std::size_t i = 0; i < v.rates.size(); ++i) {
    const auto& r = v.rates[i];
    const auto& sg = p.segments[i];
    for (std::size_t k = 0; k < K; ++k) {
      t << csv_field(sg.segment_id) << "," << csv_field(sg.fault_id) << ","
        << util::format_iso_date(s.output.dates[k]) << ",";
      if (r.samples.empty()) {
        t << ",," << ",,,\n";
        continue;
      }
      const auto& q = r.samples[k];
      t << u.text(r.dcff[k], P, 6) << "," << fixed_decimals(r.background_rate * yr, 6) << ","
        << fixed_decimals(q.rate * yr, 6) << "," << fixed_decimals(q.rate / r.background_rate, 6) << ","
        << fixed_decimals(q.expected, 6) << "," << fixed_decimals(r.background_expected[k], 6) << "\n";
    }
  }
  write_text_file(folder.output("catalog", "seismicity_rate.csv"), t.str());
  std::ostringstream ft;
  ft << "fault_id,date," << u.column("max_dcff", P)
     << ",background_rate_per_year,rate_per_year,rate_ratio,expected_events,background_expected_events\n";
  for (const auto& f : v.fault_rates)
    for (std::size_t k = 0; k < K; ++k) {
      const auto& a = f.samples[k];
      ft << csv_field(f.fault_id) << "," << util::format_iso_date(s.output.dates[k]) << ","
         << u.text(a.max_dcff, P, 6) << "," << fixed_decimals(a.background_rate * yr, 6) << ","
         << fixed_decimals(a.rate * yr, 6) << ","
         << (a.background_rate > 0 ? fixed_decimals(a.rate / a.background_rate, 6) : "") << ","
         << fixed_decimals(a.expected, 6) << "," << fixed_decimals(a.background_expected, 6) << "\n";
    }
  write_text_file(folder.output("catalog", "seismicity_rate_faults.csv"), ft.str());
}

// injected_volume.csv: the summed cumulative volume the seismogenic index was fitted to, at
// every rate change of every well (exact: the curve is linear in between).
std::string injected_volume_csv(const seismo::VolumeHistory& h, const OutputUnits& u) {
  std::string t = "time," + u.column("volume", Quantity::volume) + "\n";
  for (std::size_t i = 0; i < h.time.size(); ++i)
    t += format_iso8601_utc(h.time[i]) + ',' + u.text(h.volume[i], Quantity::volume, 3) + '\n';
  return t;
}

}  // namespace

std::vector<ReadmeFile> catalog_review_readme(const screening::CatalogReview& v) {
  std::vector<ReadmeFile> files = {
      {"catalog_summary.json", "catalog review: counts, completeness, b-value, bounds, seismogenic index, forecasts, "
                               "the footprint against chance, assumptions"},
      {"catalog_events.csv", "catalog review: one row per kept event against the model (dp, nearest fault segment, "
                             "its dp_crit, P(slip), r-t values), coordinates in the working CRS"},
      {"seismicity_rate.csv", "seismicity rate (Dieterich 1994) per fault segment and output time against the "
                              "background"},
      {"seismicity_rate_faults.csv", "seismicity rate (Dieterich 1994) per fault and output time, summed over its "
                                     "segments"}};
  if (v.volume_history)
    files.push_back({"injected_volume.csv", "catalog review: cumulative volume (m3) injected by all scenario wells while the "
                                            "catalog ran, at every rate change (the seismogenic index's history)"});
  if (v.rt) {
    files.push_back({"rt_events.csv", rt_events_description(*v.rt)});
    files.push_back({"rt_fronts.csv", rt_fronts_description(*v.rt)});
  }
  return files;
}

void write_catalog_review(const formats::RunFolder& folder, const scenario::ResolvedScenario& s, const screening::PreparedRun& p,
                          const screening::CatalogReview& v) {
  write_text_file(folder.output("catalog", "catalog_summary.json"),
             catalog_review_json(s, p, v).dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n");
  write_text_file(folder.output("catalog", "catalog_events.csv"), events_csv(s, p, v));
  if (v.volume_history)
    write_text_file(folder.output("catalog", "injected_volume.csv"),
                    injected_volume_csv(*v.volume_history, OutputUnits(s.output.units)));
  if (v.rt) {
    const OutputUnits u(s.output.units);
    write_text_file(folder.output("catalog", "rt_events.csv"), rt_events_csv(v.catalog, *v.rt, u));
    write_text_file(folder.output("catalog", "rt_fronts.csv"), rt_fronts_csv(*v.rt, u));
  }
  if (!v.rates.empty()) write_rate_tables(folder, s, p, v);
}

}  // namespace slipscreen::outputs
