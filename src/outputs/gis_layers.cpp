#include "outputs/gis_layers.hpp"

#include <cmath>
#include <limits>

#include "core/stats/wilson_interval.hpp"
#include "core/units/units.hpp"
#include "formats/gis/geopackage.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/output_text.hpp"

namespace slipscreen::outputs {

using formats::FieldSpec;
using formats::FieldType;
using formats::FieldValue;
using formats::GeometryType;
using formats::RunFolder;
using formats::VectorFeature;
using formats::VectorLayer;
using scenario::ResolvedScenario;
using screening::CatalogReview;
using screening::PreparedRun;
using screening::ProbabilisticRun;

namespace {

std::string gpkg_date_field(const util::CivilDate& d) {
  std::string s = util::format_iso_date(d);
  for (char& c : s)
    if (c == '-') c = '_';
  return s;
}

// The reviewed catalog's events with their attributes against the model (catalog_review.hpp).
VectorLayer earthquake_layer(const ResolvedScenario& s, const PreparedRun& p, const CatalogReview& v) {
  VectorLayer layer("earthquakes", GeometryType::point,
                    {{"event_id", FieldType::string},        {"time_utc", FieldType::string},
                     {"depth_m", FieldType::real},           {"magnitude", FieldType::real},
                     {"magnitude_type", FieldType::string},  {"in_study_area", FieldType::integer},
                     {"dp_MPa", FieldType::real},            {"in_footprint", FieldType::integer},
                     {"nearest_segment", FieldType::string}, {"nearest_fault", FieldType::string},
                     {"distance_m", FieldType::real},        {"segment_dp_MPa", FieldType::real},
                     {"segment_dp_crit_MPa", FieldType::real}, {"segment_reached", FieldType::integer},
                     {"footprint_area_fraction", FieldType::real}, {"p_slip", FieldType::real},
                     {"p_slip_low", FieldType::real},        {"p_slip_high", FieldType::real},
                     {"p_slip_date", FieldType::date},       {"rt_time_since_start_days", FieldType::real},
                     {"rt_distance_m", FieldType::real}},
                    "Earthquakes of the reviewed catalog against the model (screening estimate)");
  const FieldValue none = std::monostate{};
  for (std::size_t i = 0; i < v.events.size(); ++i) {
    const auto& e = v.catalog.events[i];
    const auto& m = v.events[i];
    const bool seg = !p.segments.empty();
    VectorFeature f;
    f.geometry = {{m.x, m.y}};
    f.values = {e.id, formats::format_iso8601_utc(e.time), e.depth ? FieldValue(*e.depth) : none, e.magnitude,
                e.magnitude_type, static_cast<std::int64_t>(m.in_study_area), m.dp / kMPa,
                static_cast<std::int64_t>(m.dp >= v.spec.footprint_threshold),
                seg ? FieldValue(p.segments[m.segment].segment_id) : none,
                seg ? FieldValue(p.segments[m.segment].fault_id) : none, seg ? FieldValue(m.distance) : none,
                seg ? FieldValue(m.segment_dp / kMPa) : none,
                seg && std::isfinite(m.segment_dp_crit) ? FieldValue(m.segment_dp_crit / kMPa) : none,
                static_cast<std::int64_t>(m.segment_reached), m.footprint_fraction,
                m.probability_time ? FieldValue(m.p_slip) : none, m.probability_time ? FieldValue(m.p_low) : none,
                m.probability_time ? FieldValue(m.p_high) : none,
                m.probability_time ? FieldValue(util::format_iso_date(s.output.dates[*m.probability_time])) : none,
                m.rt_time ? FieldValue(*m.rt_time / units::kDay) : none,
                m.rt_distance ? FieldValue(*m.rt_distance) : none};
    layer.features.push_back(std::move(f));
  }
  return layer;
}

}  // namespace

ReadmeFile gis_layers_readme(const ResolvedScenario& s, bool probabilistic, bool review) {
  return {s.output.files.geopackage,
          std::string("GeoPackage: layers fault_segments (the screen's results") +
              (probabilistic ? " and P(slip) per output time" : "") + "), wells (injected volumes)" +
              (review ? ", earthquakes (the reviewed events against the model)" : "")};
}

void write_gis_layers(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                  const screen::ScreenResult& r, bool reproducible, const ProbabilisticRun* prob,
                  const CatalogReview* review) {
  std::vector<FieldSpec> fields = {
      {"segment_id", FieldType::string},   {"fault_id", FieldType::string},      {"segment_index", FieldType::integer},
      {"strike_deg", FieldType::real},     {"dip_deg", FieldType::real},         {"friction", FieldType::real},
      {"sigma_n_eff_MPa", FieldType::real}, {"tau_MPa", FieldType::real},        {"slip_tendency", FieldType::real},
      {"dp_crit_MPa", FieldType::real},    {"status", FieldType::string},        {"peak_dp_MPa", FieldType::real},
      {"margin_MPa", FieldType::real},     {"first_crossing", FieldType::date}};
  for (const auto& d : s.output.dates) fields.push_back({"dp_" + gpkg_date_field(d) + "_MPa", FieldType::real});
  if (prob) {  // probabilistic screen: one probability column per output time, ready to style
    for (const auto& d : s.output.dates) fields.push_back({"p_slip_" + gpkg_date_field(d), FieldType::real});
    fields.push_back({"p_slip_final_ci_high", FieldType::real});
    fields.push_back({"p_already_critical", FieldType::real});
    fields.push_back({"dp_crit_p50_MPa", FieldType::real});
  }
  VectorLayer segs("fault_segments", GeometryType::line_string, fields,
                   "Fault segments with the deterministic screen (screening estimate)");
  for (std::size_t i = 0; i < r.segments.size(); ++i) {
    const auto& g = r.segments[i];
    const auto& seg = p.segments[i];
    double strike = std::fmod(p.inputs.segments[i].strike * kRadToDeg + 360.0, 360.0);
    VectorFeature f;
    f.geometry = seg.trace.vertices;
    f.values = {seg.segment_id, seg.fault_id, static_cast<std::int64_t>(seg.index), strike, seg.dip_rad * kRadToDeg,
                g.friction, g.effective_normal_stress / kMPa, g.shear_stress / kMPa, g.slip_tendency,
                std::isinf(g.dp_crit) ? std::numeric_limits<double>::quiet_NaN() : g.dp_crit / kMPa,
                status_text(g.status), g.peak_dp / kMPa,
                std::isinf(g.dp_crit) ? std::numeric_limits<double>::quiet_NaN() : (g.dp_crit - g.peak_dp) / kMPa,
                g.first_crossing ? FieldValue(date_of(*g.first_crossing)) : FieldValue(std::monostate{})};
    for (double v : g.dp) f.values.emplace_back(v / kMPa);
    if (prob) {
      const auto& ps = prob->result.segments[i];
      const auto n = prob->result.realizations;
      for (std::size_t k = 0; k < s.output.dates.size(); ++k) f.values.emplace_back(slip_probability(*prob, i, k));
      f.values.emplace_back(
          stats::wilson_interval(ps.slipped_by.back(), n, stats::z_for_confidence(prob->confidence)).upper);
      f.values.emplace_back(static_cast<double>(ps.already_critical) / static_cast<double>(n));
      f.values.emplace_back(ps.dp_crit.empty() ? std::numeric_limits<double>::quiet_NaN()
                                               : ps.dp_crit.quantile(0.5) / kMPa);
    }
    segs.features.push_back(std::move(f));
  }
  const double t_end = s.output.times.back();
  VectorLayer wells("wells", GeometryType::point,
                    {{"well_id", FieldType::string}, {"status", FieldType::string}, {"proposed", FieldType::integer},
                     {"top_m", FieldType::real}, {"bottom_m", FieldType::real}, {"radius_m", FieldType::real},
                     {"first_injection", FieldType::date}, {"last_injection", FieldType::date},
                     {"volume_until", FieldType::date}, {"volume_m3", FieldType::real}, {"volume_bbl", FieldType::real},
                     {"volume_reported_bbl", FieldType::real}},
                    "Wells with injected volumes up to the last output time (reported, planned and assumed)");
  for (const auto& w : p.wells) {
    VectorFeature f;
    f.geometry = {{w.x, w.y}};
    const bool any = !w.periods.empty();
    const double v = w.volume_until(t_end);
    f.values = {w.id, std::string(status_name(w.status)), static_cast<std::int64_t>(w.proposed), w.top, w.bottom,
                w.radius, any ? FieldValue(date_of(w.periods.front().start)) : FieldValue(std::monostate{}),
                any ? FieldValue(date_of(w.periods.back().end - 1.0)) : FieldValue(std::monostate{}),
                util::format_iso_date(s.output.dates.back()), v, v / units::kBarrel,
                w.reported_volume_until(t_end) / units::kBarrel};
    wells.features.push_back(std::move(f));
  }
  formats::GeoPackageOptions go;
  if (reproducible) go.timestamp = util::format_iso_date(s.output.dates.back()) + "T00:00:00Z";
  std::vector<VectorLayer> layers{std::move(segs), std::move(wells)};
  if (review) layers.push_back(earthquake_layer(s, p, *review));
  write_geopackage(folder.output("output.files.geopackage", s.output.files.geopackage), p.working, layers, go);
}

}  // namespace slipscreen::outputs
