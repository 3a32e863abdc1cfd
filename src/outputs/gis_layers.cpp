#include "outputs/gis_layers.hpp"

#include <cmath>
#include <limits>
#include <optional>

#include "core/stats/wilson_interval.hpp"
#include "core/units/units.hpp"
#include "core/util/number_text.hpp"
#include "formats/gis/contour.hpp"
#include "formats/gis/geopackage.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/gis_styles.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"

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

// The fields of the layers, with the kind of quantity each holds: the one place that names a
// field's unit (its name's suffix and its alias) and converts its SI value. Pressures, lengths and
// volumes follow the run's unit system (outputs/output_units.hpp): their Field::name is the base
// name, "<base>_<suffix>" in the layer (`dp` -> `dp_MPa` | `dp_psi`). The other kinds are written
// the same way in both systems and their names are whole (`strike_deg`, `volume_reported_bbl`).
enum class Kind { none, pressure, length, volume, volume_bbl, angle, duration_days };

struct Field {
  std::string name;
  FieldType type;
  Kind kind = Kind::none;
  std::string label;  // for people; the alias is "<label> (<unit>)"
};

std::optional<Quantity> system_quantity(Kind k) {
  switch (k) {
    case Kind::pressure: return Quantity::pressure;
    case Kind::length: return Quantity::length;
    case Kind::volume: return Quantity::volume;
    default: return std::nullopt;
  }
}

std::string unit_of(Kind k, const OutputUnits& u) {
  switch (k) {
    case Kind::none: return "";
    case Kind::pressure: return std::string(u.symbol(Quantity::pressure));
    case Kind::length: return std::string(u.symbol(Quantity::length));
    case Kind::volume: return u.system() == units::UnitSystem::si ? "m³" : std::string(u.symbol(Quantity::volume));
    case Kind::volume_bbl: return "bbl";
    case Kind::angle: return "°";
    case Kind::duration_days: return "days";
  }
  return "";
}

std::string field_name(const Field& f, const OutputUnits& u) {
  const auto q = system_quantity(f.kind);
  return q ? u.column(f.name, *q) : f.name;
}

// An SI value in the field's unit (pressure in Pa, length in m, volume in m³, angle in rad,
// duration in s).
double in_unit(Kind k, double si, const OutputUnits& u) {
  if (const auto q = system_quantity(k)) return u.value(si, *q);
  switch (k) {
    case Kind::volume_bbl: return si / units::kBarrel;
    case Kind::angle: return si * kRadToDeg;
    case Kind::duration_days: return si / units::kDay;
    default: return si;
  }
}

std::vector<FieldSpec> specs(const std::vector<Field>& fields, const OutputUnits& u) {
  std::vector<FieldSpec> out;
  for (const auto& f : fields)
    out.emplace_back(field_name(f, u), f.type,
                     f.label.empty() ? "" : f.kind == Kind::none ? f.label : f.label + " (" + unit_of(f.kind, u) + ")");
  return out;
}

FieldValue flag(bool b) { return static_cast<std::int64_t>(b); }

std::string gpkg_date_field(const util::CivilDate& d) {
  std::string s = util::format_iso_date(d);
  for (char& c : s)
    if (c == '-') c = '_';
  return s;
}

// The reviewed catalog's events with their attributes against the model (catalog_review.hpp).
VectorLayer earthquake_layer(const ResolvedScenario& s, const PreparedRun& p, const CatalogReview& v) {
  using Q = Kind;
  const OutputUnits u(s.output.units);
  const auto si = [&u](Kind k, double x) { return FieldValue(in_unit(k, x, u)); };
  VectorLayer layer("earthquakes", GeometryType::point,
                    specs({{"event_id", FieldType::string, Q::none, "event"},
                           {"time_utc", FieldType::datetime, Q::none, "time (UTC)"},
                           {"depth", FieldType::real, Q::length, "depth"},
                           {"magnitude", FieldType::real, Q::none, "magnitude"},
                           {"magnitude_type", FieldType::string, Q::none, "magnitude type"},
                           {"in_study_area", FieldType::boolean, Q::none, "in the study area"},
                           {"dp", FieldType::real, Q::pressure, "Δp at the event"},
                           {"in_footprint", FieldType::boolean, Q::none, "inside the Δp footprint"},
                           {"nearest_segment", FieldType::string, Q::none, "nearest fault segment"},
                           {"nearest_fault", FieldType::string, Q::none, "nearest fault"},
                           {"distance", FieldType::real, Q::length, "distance to that segment"},
                           {"segment_dp", FieldType::real, Q::pressure, "segment Δp"},
                           {"segment_dp_crit", FieldType::real, Q::pressure, "segment Δp_crit"},
                           {"segment_reached", FieldType::boolean, Q::none, "segment Δp reached Δp_crit"},
                           {"footprint_area_fraction", FieldType::real, Q::none, "footprint share of the area"},
                           {"p_slip", FieldType::real, Q::none, "segment P(slip)"},
                           {"p_slip_low", FieldType::real, Q::none, "segment P(slip), interval low"},
                           {"p_slip_high", FieldType::real, Q::none, "segment P(slip), interval high"},
                           {"p_slip_date", FieldType::date, Q::none, "date of that P(slip)"},
                           {"rt_time_since_start_days", FieldType::real, Q::duration_days, "r–t: time since start"},
                           {"rt_distance", FieldType::real, Q::length, "r–t: distance"}}, u),
                    "Earthquakes of the reviewed catalog against the model (screening estimate)");
  const FieldValue none = std::monostate{};
  for (std::size_t i = 0; i < v.events.size(); ++i) {
    const auto& e = v.catalog.events[i];
    const auto& m = v.events[i];
    const bool seg = !p.segments.empty();
    VectorFeature f;
    f.geometry = {{m.x, m.y}};
    f.values = {e.id, e.time, e.depth ? si(Q::length, *e.depth) : none, e.magnitude,
                e.magnitude_type, flag(m.in_study_area), si(Q::pressure, m.dp),
                flag(m.dp >= v.spec.footprint_threshold),
                seg ? FieldValue(p.segments[m.segment].segment_id) : none,
                seg ? FieldValue(p.segments[m.segment].fault_id) : none, seg ? si(Q::length, m.distance) : none,
                seg ? si(Q::pressure, m.segment_dp) : none,
                seg && std::isfinite(m.segment_dp_crit) ? si(Q::pressure, m.segment_dp_crit) : none,
                flag(m.segment_reached), m.footprint_fraction,
                m.probability_time ? FieldValue(m.p_slip) : none, m.probability_time ? FieldValue(m.p_low) : none,
                m.probability_time ? FieldValue(m.p_high) : none,
                m.probability_time ? FieldValue(util::format_iso_date(s.output.dates[*m.probability_time])) : none,
                m.rt_time ? si(Q::duration_days, *m.rt_time) : none,
                m.rt_distance ? si(Q::length, *m.rt_distance) : none};
    layer.features.push_back(std::move(f));
  }
  layer.styles.push_back(earthquakes_by_magnitude(layer));
  return layer;
}

// Each output time's validity for the time-aware layers: from its date until the next output
// time's (the last open: NULL).
FieldValue valid_until(const ResolvedScenario& s, std::size_t k) {
  return k + 1 < s.output.times.size() ? FieldValue(s.output.times[k + 1]) : FieldValue(std::monostate{});
}

const formats::TemporalFields kTime{"date", "valid_until"};

// Long form: one line per fault segment and output time, time-aware in QGIS.
VectorLayer segment_times_layer(const ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                                const ProbabilisticRun* prob) {
  using Q = Kind;
  const OutputUnits u(s.output.units);
  const auto si = [&u](Kind k, double x) { return FieldValue(in_unit(k, x, u)); };
  std::vector<Field> fields = {{"segment_id", FieldType::string, Q::none, "fault segment"},
                               {"fault_id", FieldType::string, Q::none, "fault"},
                               {"date", FieldType::datetime, Q::none, "output time (UTC)"},
                               {"valid_until", FieldType::datetime, Q::none, "next output time (UTC)"},
                               {"dp", FieldType::real, Q::pressure, "Δp"},
                               {"dp_crit", FieldType::real, Q::pressure, "Δp_crit"},
                               {"margin", FieldType::real, Q::pressure, "margin Δp_crit − Δp"},
                               {"dp_reaches_dp_crit", FieldType::boolean, Q::none, "Δp reaches Δp_crit"}};
  if (prob) {
    fields.push_back({"p_slip", FieldType::real, Q::none, "P(slip by the date)"});
    fields.push_back({"p_slip_ci_low", FieldType::real, Q::none, "P(slip), interval low"});
    fields.push_back({"p_slip_ci_high", FieldType::real, Q::none, "P(slip), interval high"});
  }
  VectorLayer layer("segment_times", GeometryType::line_string, specs(fields, u),
                    "Fault segments at each output time (long form, time-aware; screening estimate)");
  const double nan = std::numeric_limits<double>::quiet_NaN();
  for (std::size_t i = 0; i < r.segments.size(); ++i) {
    const auto& g = r.segments[i];
    const bool finite = std::isfinite(g.dp_crit);
    for (std::size_t k = 0; k < s.output.times.size(); ++k) {
      VectorFeature f(p.segments[i].trace.vertices, {});
      f.values = {p.segments[i].segment_id, p.segments[i].fault_id, s.output.times[k], valid_until(s, k),
                  si(Q::pressure, g.dp[k]), finite ? si(Q::pressure, g.dp_crit) : nan,
                  finite ? si(Q::pressure, g.dp_crit - g.dp[k]) : nan, flag(g.dp[k] >= g.dp_crit)};
      if (prob) {
        const auto ci = stats::wilson_interval(prob->result.segments[i].slipped_by[k], prob->result.realizations,
                                               stats::z_for_confidence(prob->confidence));
        f.values.insert(f.values.end(), {slip_probability(*prob, i, k), ci.lower, ci.upper});
      }
      layer.features.push_back(std::move(f));
    }
  }
  if (prob) {
    layer.styles.push_back(segments_by_probability(layer, "p_slip", "P(slip by the date), time-aware", kTime));
    layer.styles.push_back(
        lines_by_dp(layer, u.column("dp", Quantity::pressure), "Δp at the date, time-aware", u, kTime));
  } else {
    layer.styles.push_back(
        lines_by_dp(layer, u.column("dp", Quantity::pressure), "Δp at the date, time-aware", u, kTime));
  }
  return layer;
}

// The area where Δp ≥ the footprint threshold at each output time, from the Δp raster.
VectorLayer footprint_layer(const ResolvedScenario& s, const PreparedRun& p, const screening::PressureMap& map) {
  using Q = Kind;
  const OutputUnits u(s.output.units);
  const auto si = [&u](Kind k, double x) { return FieldValue(in_unit(k, x, u)); };
  VectorLayer layer("dp_footprint", GeometryType::multi_polygon,
                    specs({{"date", FieldType::datetime, Q::none, "output time (UTC)"},
                           {"valid_until", FieldType::datetime, Q::none, "next output time (UTC)"},
                           {"threshold", FieldType::real, Q::pressure, "footprint threshold Δp"},
                           {"area_km2", FieldType::real, Q::none, "area (km²)"}}, u),
                    "Where dp >= the footprint threshold at each output time (contours of the dp raster; "
                    "screening estimate)");
  for (std::size_t k = 0; k < map.dp.size(); ++k) {
    VectorFeature f;
    f.polygons = formats::area_at_or_above(p.grid, map.dp[k], s.output.footprint);
    double area = 0;
    for (const auto& poly : f.polygons)
      for (std::size_t ring = 0; ring < poly.rings.size(); ++ring) {
        const auto& v = poly.rings[ring];
        double twice = 0;  // shoelace: exterior counter-clockwise or not, holes subtract
        for (std::size_t j = 0; j + 1 < v.size(); ++j) twice += v[j].x * v[j + 1].y - v[j + 1].x * v[j].y;
        area += (ring == 0 ? 1.0 : -1.0) * std::abs(twice) / 2.0;
      }
    f.values = {s.output.times[k], valid_until(s, k), si(Q::pressure, s.output.footprint), area / 1e6};
    layer.features.push_back(std::move(f));
  }
  layer.styles.push_back(footprint_style(layer, kTime));
  return layer;
}

}  // namespace

ReadmeFile gis_layers_readme(const ResolvedScenario& s, bool probabilistic, bool review, bool footprint) {
  const OutputUnits u(s.output.units);
  return {s.output.files.geopackage,
          std::string("GeoPackage, styled for QGIS (layer_styles): layers fault_segments (the screen's results") +
              (probabilistic ? " and P(slip) per output time" : "") + "), segment_times (one line per segment and " +
              "output time, time-aware" + (probabilistic ? ", with P(slip)" : "") + "), wells (injected volumes)" +
              (footprint ? ", dp_footprint (where dp >= " +
                               util::number_text(u.value(s.output.footprint, Quantity::pressure), 6) + " " +
                               std::string(u.symbol(Quantity::pressure)) + " at each output time)"
                         : "") +
              (review ? ", earthquakes (the reviewed events against the model)" : "")};
}

void write_gis_layers(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                      const screen::ScreenResult& r, bool reproducible, const ProbabilisticRun* prob,
                      const CatalogReview* review, const screening::PressureMap* pressure) {
  using Q = Kind;
  const OutputUnits u(s.output.units);
  const auto si = [&u](Kind k, double x) { return FieldValue(in_unit(k, x, u)); };
  std::vector<Field> fields = {
      {"segment_id", FieldType::string, Q::none, "fault segment"},
      {"fault_id", FieldType::string, Q::none, "fault"},
      {"segment_index", FieldType::integer, Q::none, "segment along the fault"},
      {"strike_deg", FieldType::real, Q::angle, "strike (true north)"},
      {"dip_deg", FieldType::real, Q::angle, "dip"},
      {"friction", FieldType::real, Q::none, "friction coefficient"},
      {"sigma_n_eff", FieldType::real, Q::pressure, "effective normal stress"},
      {"tau", FieldType::real, Q::pressure, "shear stress"},
      {"slip_tendency", FieldType::real, Q::none, "slip tendency"},
      {"dp_crit", FieldType::real, Q::pressure, "Δp_crit"},
      {"status", FieldType::string, Q::none, "status"},
      {"peak_dp", FieldType::real, Q::pressure, "peak Δp"},
      {"margin", FieldType::real, Q::pressure, "margin Δp_crit − peak Δp"},
      {"first_crossing", FieldType::date, Q::none, "first date Δp reaches Δp_crit"}};
  for (const auto& d : s.output.dates)
    fields.push_back({"dp_" + gpkg_date_field(d), FieldType::real, Q::pressure, "Δp on " + util::format_iso_date(d)});
  if (prob) {  // probabilistic screen: one probability column per output time, ready to style
    for (const auto& d : s.output.dates)
      fields.push_back({"p_slip_" + gpkg_date_field(d), FieldType::real, Q::none, "P(slip by " + util::format_iso_date(d) + ")"});
    fields.push_back({"p_slip_final_ci_high", FieldType::real, Q::none, "P(slip by the last date), interval high"});
    fields.push_back({"p_already_critical", FieldType::real, Q::none, "P(critical before injection)"});
    fields.push_back({"dp_crit_p50", FieldType::real, Q::pressure, "Δp_crit, median"});
  }
  VectorLayer segs("fault_segments", GeometryType::line_string, specs(fields, u),
                   "Fault segments with the deterministic screen (screening estimate)");
  const double nan = std::numeric_limits<double>::quiet_NaN();
  for (std::size_t i = 0; i < r.segments.size(); ++i) {
    const auto& g = r.segments[i];
    const auto& seg = p.segments[i];
    const bool finite = std::isfinite(g.dp_crit);
    double strike = std::fmod(p.inputs.segments[i].strike * kRadToDeg + 360.0, 360.0);
    VectorFeature f;
    f.geometry = seg.trace.vertices;
    f.values = {seg.segment_id, seg.fault_id, static_cast<std::int64_t>(seg.index), strike, si(Q::angle, seg.dip_rad),
                g.friction, si(Q::pressure, g.effective_normal_stress), si(Q::pressure, g.shear_stress), g.slip_tendency,
                finite ? si(Q::pressure, g.dp_crit) : nan, status_text(g.status), si(Q::pressure, g.peak_dp),
                finite ? si(Q::pressure, g.dp_crit - g.peak_dp) : nan,
                g.first_crossing ? FieldValue(date_of(*g.first_crossing)) : FieldValue(std::monostate{})};
    for (double v : g.dp) f.values.push_back(si(Q::pressure, v));
    if (prob) {
      const auto& ps = prob->result.segments[i];
      const auto n = prob->result.realizations;
      for (std::size_t k = 0; k < s.output.dates.size(); ++k) f.values.emplace_back(slip_probability(*prob, i, k));
      f.values.emplace_back(
          stats::wilson_interval(ps.slipped_by.back(), n, stats::z_for_confidence(prob->confidence)).upper);
      f.values.emplace_back(static_cast<double>(ps.already_critical) / static_cast<double>(n));
      f.values.push_back(ps.dp_crit.empty() ? FieldValue(nan) : si(Q::pressure, ps.dp_crit.quantile(0.5)));
    }
    segs.features.push_back(std::move(f));
  }
  const std::string last = util::format_iso_date(s.output.dates.back());
  if (prob) {
    segs.styles.push_back(segments_by_probability(segs, "p_slip_" + gpkg_date_field(s.output.dates.back()),
                                                  "P(slip by " + last + "), the last output time"));
    segs.styles.push_back(segments_by_margin(segs, u.column("margin", Quantity::pressure),
                                             "Margin Δp_crit − peak Δp (deterministic)", u));
  } else {
    segs.styles.push_back(segments_by_margin(segs, u.column("margin", Quantity::pressure),
                                             "Margin Δp_crit − peak Δp (deterministic)", u));
  }

  const double t_end = s.output.times.back();
  // In SI the injected volume is also given in bbl (the unit volumes are reported in); in oilfield
  // units `volume_bbl` is the volume itself, written once.
  const bool si_units = u.system() == units::UnitSystem::si;
  std::vector<Field> well_fields = {{"well_id", FieldType::string, Q::none, "well"},
                                    {"status", FieldType::string, Q::none, "status"},
                                    {"proposed", FieldType::boolean, Q::none, "proposed"},
                                    {"top", FieldType::real, Q::length, "injection interval top"},
                                    {"bottom", FieldType::real, Q::length, "injection interval bottom"},
                                    {"radius", FieldType::real, Q::length, "well radius"},
                                    {"first_injection", FieldType::date, Q::none, "first injection"},
                                    {"last_injection", FieldType::date, Q::none, "last injection"},
                                    {"volume_until", FieldType::date, Q::none, "volumes up to"},
                                    {"volume", FieldType::real, Q::volume, "injected volume"}};
  if (si_units) well_fields.push_back({"volume_bbl", FieldType::real, Q::volume_bbl, "injected volume"});
  well_fields.push_back({"volume_reported_bbl", FieldType::real, Q::volume_bbl, "reported volume"});
  VectorLayer wells("wells", GeometryType::point, specs(well_fields, u),
                    "Wells with injected volumes up to the last output time (reported, planned and assumed)");
  for (const auto& w : p.wells) {
    VectorFeature f;
    f.geometry = {{w.x, w.y}};
    const bool any = !w.periods.empty();
    const double v = w.volume_until(t_end);
    f.values = {w.id, std::string(status_name(w.status)), flag(w.proposed), si(Q::length, w.top),
                si(Q::length, w.bottom), si(Q::length, w.radius),
                any ? FieldValue(date_of(w.periods.front().start)) : FieldValue(std::monostate{}),
                any ? FieldValue(date_of(w.periods.back().end - 1.0)) : FieldValue(std::monostate{}), last,
                si(Q::volume, v)};
    if (si_units) f.values.push_back(si(Q::volume_bbl, v));
    f.values.push_back(si(Q::volume_bbl, w.reported_volume_until(t_end)));
    wells.features.push_back(std::move(f));
  }
  wells.styles.push_back(wells_by_status(wells));

  formats::GeoPackageOptions go;
  if (reproducible) go.timestamp = last + "T00:00:00Z";
  std::vector<VectorLayer> layers;
  layers.push_back(std::move(segs));
  layers.push_back(segment_times_layer(s, p, r, prob));
  layers.push_back(std::move(wells));
  if (pressure) layers.push_back(footprint_layer(s, p, *pressure));
  if (review) layers.push_back(earthquake_layer(s, p, *review));
  write_geopackage(folder.output("output.files.geopackage", s.output.files.geopackage), p.working, layers, go);
}

}  // namespace slipscreen::outputs
