#include "io/run_outputs.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>
#include <fstream>

#include "core/errors.hpp"
#include "core/hydro/pressure_grid.hpp"
#include "core/units/units.hpp"
#include "io/catalog_review.hpp"
#include "io/geotiff_writer.hpp"
#include "io/iso_time.hpp"
#include "core/stats/wilson_interval.hpp"
#include "io/manifest.hpp"
#include "io/probabilistic_run.hpp"
#include "io/vector_writer.hpp"
#include "slipscreen/version.hpp"

namespace slipscreen::io {

void append_fixed(std::string& out, double v, int decimals) {
  if (std::isnan(v)) return;
  if (std::isinf(v)) {
    out += v > 0 ? "inf" : "-inf";
    return;
  }
  char buf[352];  // enough for any finite double in fixed notation with a few decimals
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed, decimals);
  const std::string_view s(buf, static_cast<std::size_t>(r.ptr - buf));
  // "-0.000" is "0.000"
  out += s[0] == '-' && s.find_first_not_of("-0.") == std::string_view::npos ? s.substr(1) : s;
}

std::string fixed_decimals(double v, int decimals) {
  std::string s;
  append_fixed(s, v, decimals);
  return s;
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

namespace {

constexpr double kMPa = 1e6;
constexpr double kRadToDeg = 180.0 / 3.14159265358979323846;

std::string date_of(double t) { return util::format_iso_date(util::date_at(t)); }

std::string status_text(geomech::CriticalStatus s) {
  switch (s) {
    case geomech::CriticalStatus::below_failure: return "below_failure";
    case geomech::CriticalStatus::already_critical: return "already_critical";
    case geomech::CriticalStatus::never: return "never";
  }
  return "?";
}

class CsvOut {
 public:
  explicit CsvOut(const std::filesystem::path& p) : path_(p), out_(p, std::ios::binary) {
    if (!out_) throw IoError(p.string() + ": cannot create the file");
  }
  void row(const std::vector<std::string>& fields) {
    for (std::size_t i = 0; i < fields.size(); ++i) out_ << (i ? "," : "") << csv_field(fields[i]);
    out_ << "\n";
  }
  void text(std::string_view s) { out_.write(s.data(), static_cast<std::streamsize>(s.size())); }
  void close() {
    out_.close();
    if (!out_) throw IoError(path_.string() + ": write error");
  }

 private:
  std::filesystem::path path_;
  std::ofstream out_;
};

void write_tables(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                  const screen::ScreenResult& r) {
  const std::size_t W = p.wells.size(), K = s.output.times.size();
  {
    CsvOut t(folder.output("output.files.segment_times", s.output.files.segment_times));
    t.row({"segment_id", "fault_id", "date", "dp_MPa", "dp_crit_MPa", "margin_MPa", "dp_reaches_dp_crit",
           "check_point", "leading_well", "leading_well_share"});
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      for (std::size_t k = 0; k < K; ++k) {
        std::size_t lead = 0;
        for (std::size_t w = 1; w < W; ++w)
          if (g.well_share[k * W + w] > g.well_share[k * W + lead]) lead = w;
        const bool has = W > 0 && g.dp[k] > 0;
        t.row({p.segments[i].segment_id, p.segments[i].fault_id, util::format_iso_date(s.output.dates[k]),
               fixed_decimals(g.dp[k] / kMPa, 6), fixed_decimals(g.dp_crit / kMPa, 6),
               fixed_decimals((g.dp_crit - g.dp[k]) / kMPa, 6), g.dp[k] >= g.dp_crit ? "yes" : "no",
               std::to_string(g.dp_point[k]), has ? p.wells[lead].id : "",
               has ? fixed_decimals(g.well_share[k * W + lead], 6) : ""});
      }
    }
    t.close();
  }
  {
    const std::filesystem::path name = std::filesystem::path(s.output.files.segment_times).parent_path() / "well_shares.csv";
    CsvOut t(folder.output("output.files.segment_times", name.generic_string()));
    t.row({"segment_id", "date", "well_id", "dp_MPa", "share"});
    // W rows per segment and time (8 million in a regional screen): formatted into one buffer.
    std::vector<std::string> dates, wells;
    for (const auto& d : s.output.dates) dates.push_back(csv_field(util::format_iso_date(d)) + ',');
    for (const auto& w : p.wells) wells.push_back(csv_field(w.id) + ',');
    std::string buf;
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      const std::string seg = csv_field(p.segments[i].segment_id) + ',';
      for (std::size_t k = 0; k < K; ++k)
        for (std::size_t w = 0; w < W; ++w) {
          buf += seg;
          buf += dates[k];
          buf += wells[w];
          append_fixed(buf, g.dp[k] * g.well_share[k * W + w] / kMPa, 6);
          buf += ',';
          append_fixed(buf, g.well_share[k * W + w], 6);
          buf += '\n';
        }
      if (buf.size() > (1u << 20)) {
        t.text(buf);
        buf.clear();
      }
    }
    t.text(buf);
    t.close();
  }
  {
    CsvOut t(folder.output("output.files.segments", s.output.files.segments));
    t.row({"segment_id", "fault_id", "segment_index", "length_m", "centre_x_m", "centre_y_m", "strike_deg",
           "dip_deg", "friction", "sigma_n_MPa", "sigma_n_eff_MPa", "tau_MPa", "slip_tendency", "dilation_tendency",
           "slip_sense", "dp_crit_MPa", "status", "dp_final_MPa", "peak_dp_MPa", "peak_date", "margin_MPa",
           "first_crossing_date"});
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      const auto& seg = p.segments[i];
      double strike = p.inputs.segments[i].strike * kRadToDeg;
      strike = std::fmod(strike + 360.0, 360.0);
      t.row({seg.segment_id, seg.fault_id, std::to_string(seg.index), fixed_decimals(seg.trace.length_m, 1),
             fixed_decimals(seg.trace.centre.x, 1), fixed_decimals(seg.trace.centre.y, 1), fixed_decimals(strike, 2),
             fixed_decimals(seg.dip_rad * kRadToDeg, 2), fixed_decimals(g.friction, 3),
             fixed_decimals(g.normal_stress / kMPa, 4), fixed_decimals(g.effective_normal_stress / kMPa, 4),
             fixed_decimals(g.shear_stress / kMPa, 4), fixed_decimals(g.slip_tendency, 4),
             fixed_decimals(g.dilation_tendency, 4), geomech::to_string(g.sense), fixed_decimals(g.dp_crit / kMPa, 6),
             status_text(g.status), fixed_decimals(g.dp.back() / kMPa, 6), fixed_decimals(g.peak_dp / kMPa, 6),
             g.peak_dp > 0 ? date_of(g.peak_time) : "", fixed_decimals((g.dp_crit - g.peak_dp) / kMPa, 6),
             g.first_crossing ? date_of(*g.first_crossing) : ""});
    }
    t.close();
  }
}

void write_raster(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p) {
  const auto& g = p.grid;
  const hydro::GridGeometry geo = grid_geometry(g);
  const hydro::GridFormation formation = grid_formation(p);
  const std::vector<hydro::GridSource> sources = grid_sources(p);
  std::vector<RasterBand> bands(s.output.times.size());
  if (sources.empty()) {
    for (std::size_t k = 0; k < bands.size(); ++k) bands[k] = {util::format_iso_date(s.output.dates[k]), std::vector<float>(g.cell_count(), 0.0f)};
  } else {
    const hydro::PressureGrid grid = hydro::pressure_grid(geo, formation, sources, s.output.times);
    for (std::size_t k = 0; k < bands.size(); ++k) {
      bands[k].description = util::format_iso_date(s.output.dates[k]);
      bands[k].values.resize(g.cell_count());
      for (int j = 0; j < g.rows; ++j)
        for (int i = 0; i < g.columns; ++i)
          bands[k].values[g.index(i, j)] =
              static_cast<float>(grid.at(k, static_cast<std::size_t>(i), static_cast<std::size_t>(j)) / kMPa);
    }
  }
  GeoTiffOptions opt;
  opt.cloud_optimized = s.output.cog;
  opt.unit = "MPa";
  opt.metadata = {{"QUANTITY", "pore-pressure change from injection (Theis superposition), MPa"},
                  {"CAUTION", kScreeningCaution},
                  {"SCENARIO", s.file}};
  write_geotiff(folder.output("output.files.pressure_raster", s.output.files.pressure_raster), g, p.working, bands, opt);
}

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
                     {"p_slip_date", FieldType::date},       {"rt_days_since_start", FieldType::real},
                     {"rt_distance_m", FieldType::real}},
                    "Earthquakes of the reviewed catalog against the model (screening estimate)");
  const FieldValue none = std::monostate{};
  for (std::size_t i = 0; i < v.events.size(); ++i) {
    const auto& e = v.catalog.events[i];
    const auto& m = v.events[i];
    const bool seg = !p.segments.empty();
    VectorFeature f;
    f.geometry = {{m.x, m.y}};
    f.values = {e.id, format_iso8601_utc(e.time), e.depth ? FieldValue(*e.depth) : none, e.magnitude,
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

void write_layers(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                  const screen::ScreenResult& r, const RunOptions& o, const ProbabilisticRun* prob,
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
  GeoPackageOptions go;
  if (o.reproducible) go.timestamp = util::format_iso_date(s.output.dates.back()) + "T00:00:00Z";
  std::vector<VectorLayer> layers{std::move(segs), std::move(wells)};
  if (review) layers.push_back(earthquake_layer(s, p, *review));
  write_geopackage(folder.output("output.files.geopackage", s.output.files.geopackage), p.working, layers, go);
}

}  // namespace

void write_run_outputs(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                       const screen::ScreenResult& r, const RunOptions& o, const ProbabilisticRun* probabilistic,
                       const CatalogReview* review) {
  if (s.output.tables) write_tables(folder, s, p, r);
  if (s.output.rasters) write_raster(folder, s, p);
  if (s.output.geopackage) write_layers(folder, s, p, r, o, probabilistic, review);
  if (probabilistic) write_probabilistic_outputs(folder, s, p, *probabilistic);
  if (review) write_catalog_review(folder, s, p, *review);

  ManifestContent m;
  m.command_line = o.command_line;
  m.seed = s.seed;
  m.caution = kScreeningCaution;
  m.include_timestamp = !o.reproducible;
  m.inputs = p.manifest_inputs;
  const auto& st = p.inputs.stress;
  m.parameters = {{"scenario", to_json(s)},
                  {"run",
                   {{"screen", "deterministic"},
                    {"tracking_grid", kTrackingGridStatement},
                    {"tracked_times", r.tracked_times.size()},
                    {"faults", p.fault_count},
                    {"segments", p.segments.size()},
                    {"wells", p.wells.size()},
                    {"meridian_convergence_deg", p.convergence_rad * kRadToDeg},
                    {"stress_at_reference_depth_Pa",
                     {{"sv", st.sv}, {"shmax", st.shmax}, {"shmin", st.shmin}, {"pore_pressure", st.pore_pressure}}},
                    {"theis", {{"diffusivity_m2_per_s", p.inputs.formation.diffusivity},
                               {"pressure_per_rate_Pa_s_per_m3", p.inputs.formation.pressure_per_rate}}},
                    {"well_radius_clamped", r.radius_clamped}}}};
  if (probabilistic) m.parameters["probabilistic"] = probabilistic->manifest;
  if (review) m.parameters["catalog"] = catalog_manifest(*review);
  write_manifest(folder.output("output.files.manifest", s.output.files.manifest), m, folder.staging());
}

}  // namespace slipscreen::io
