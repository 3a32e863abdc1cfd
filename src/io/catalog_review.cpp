#include "io/catalog_review.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <sstream>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/seismo/nearest_fault.hpp"
#include "core/stats/wilson_interval.hpp"
#include "core/units/units.hpp"
#include "io/catalog_summary_json.hpp"
#include "io/crs.hpp"
#include "io/iso_time.hpp"
#include "io/probabilistic_run.hpp"
#include "io/run_outputs.hpp"

namespace slipscreen::io {

namespace {

constexpr double kMPa = 1e6;

double total_volume(const std::vector<WellSpec>& wells, double t) {
  double v = 0.0;
  for (const auto& w : wells) v += w.volume_until(t);
  return v;
}

// Summed cumulative volume of every scenario well, sampled at every rate change up to t_end
// (exact: rates are constant between changes, so the curve is piecewise linear).
std::optional<seismo::VolumeHistory> volume_history(const std::vector<WellSpec>& wells, double t_end) {
  std::set<double> times;
  for (const auto& w : wells)
    for (const auto& per : w.periods) {
      if (per.start < t_end) times.insert(per.start);
      if (per.end < t_end) times.insert(per.end);
    }
  times.insert(t_end);
  seismo::VolumeHistory h;
  for (double t : times) {
    h.time.push_back(t);
    h.volume.push_back(total_volume(wells, t));
  }
  if (h.time.size() < 2 || !(h.volume.back() > 0.0)) return std::nullopt;
  return h;
}

// The r-t well: the one named, else the well that injected most by the end of the catalog.
const WellSpec* rt_well(const CatalogSpec& c, const PreparedRun& p, double catalog_end) {
  const WellSpec* best = nullptr;
  for (const auto& w : p.wells) {
    if (!c.rt_well.empty()) {
      if (w.id == c.rt_well) return &w;
      continue;
    }
    if (!w.periods.empty() && (!best || w.volume_until(catalog_end) > best->volume_until(catalog_end))) best = &w;
  }
  return best;
}

seismo::Catalog to_working_crs(const CatalogReadResult& read, const PreparedRun& p) {
  const Crs from = Crs::from_user_string(read.catalog.crs, read.path + ": catalog CRS");
  const Transformer tr(from, p.working);
  std::size_t i = 0;
  return seismo::reprojected(
      read.catalog,
      [&](double x, double y) {
        const auto& e = read.catalog.events[i++];
        const geometry::Point2 q = tr({x, y}, e.source.empty() ? read.path : e.source);
        return std::array<double, 2>{q.x, q.y};
      },
      seismo::CoordinateKind::projected, p.working.authority().empty() ? p.working.name() : p.working.authority());
}

void review_events(CatalogReview& v, const ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                   const ProbabilisticRun* prob) {
  const auto& g = p.grid;
  const double x0 = g.x_origin, x1 = g.x_origin + g.columns * g.cell_size;
  const double y1 = g.y_origin, y0 = g.y_origin - g.rows * g.cell_size;

  std::vector<hydro::WellSource> sources;
  for (const auto& w : p.inputs.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), p.inputs.boundaries);

  // Footprint area fractions at the output times on the coarsened output grid.
  v.footprint_grid = geometry::coarsened(g, g.cell_size, kMapCells);
  const auto& fg = v.footprint_grid;
  const std::vector<hydro::GridSource> gs = grid_sources(p);
  v.footprint_fractions.assign(s.output.times.size(), 0.0);
  if (!gs.empty() && fg.cell_count() > 0) {
    const hydro::PressureGrid pg = hydro::pressure_grid(grid_geometry(fg), grid_formation(p), gs, s.output.times);
    for (std::size_t k = 0; k < s.output.times.size(); ++k) {
      std::size_t inside = 0, cells = 0;
      for (int j = 0; j < fg.rows; ++j)
        for (int i = 0; i < fg.columns; ++i) {
          const auto c = fg.cell_centre(i, j);
          if (c.x > x1 || c.y < y0) continue;  // the coarse grid's overhang is outside the study area
          ++cells;
          inside += pg.at(k, static_cast<std::size_t>(i), static_cast<std::size_t>(j)) >= v.spec.footprint_threshold;
        }
      v.footprint_fractions[k] = cells ? static_cast<double>(inside) / static_cast<double>(cells) : 0.0;
    }
  }
  double first_injection = s.output.times.back();
  for (const auto& w : p.wells)
    if (!w.periods.empty()) first_injection = std::min(first_injection, w.periods.front().start);

  std::vector<seismo::FaultTrace> traces;
  for (const auto& seg : p.segments) {
    seismo::FaultTrace t;
    for (const auto& q : seg.trace.vertices) t.push_back({q.x, q.y});
    traces.push_back(std::move(t));
  }
  const std::vector<seismo::NearestFault> nearest =
      traces.empty() || v.catalog.events.empty() ? std::vector<seismo::NearestFault>(v.catalog.events.size())
                                                 : seismo::nearest_faults(v.catalog, traces);
  const double z = prob ? stats::z_for_confidence(prob->confidence) : 0.0;
  std::vector<hydro::FieldPoint> event_points;
  std::vector<double> event_times;
  for (const auto& ev : v.catalog.events) {
    event_points.push_back({ev.x, ev.y});
    event_times.push_back(ev.time);
  }
  const std::vector<double> event_dp =
      field.evaluate_each(field.prepare(event_points), event_times, p.inputs.formation);
  std::vector<double> area_dp;
  for (std::size_t e = 0; e < v.catalog.events.size(); ++e) {
    const auto& ev = v.catalog.events[e];
    EventAgainstModel m;
    m.x = ev.x;
    m.y = ev.y;
    m.in_study_area = ev.x >= x0 && ev.x <= x1 && ev.y >= y0 && ev.y <= y1;
    m.dp = event_dp[e];
    m.footprint_fraction = seismo::footprint_fraction_at(s.output.times, v.footprint_fractions, first_injection, ev.time);
    if (!traces.empty()) {
      m.segment = nearest[e].segment;
      m.distance = nearest[e].distance;
      const auto& sr = r.segments[m.segment];
      const auto it = std::upper_bound(r.tracked_times.begin(), r.tracked_times.end(), ev.time);
      if (it != r.tracked_times.begin() && !sr.tracked_dp.empty())
        m.segment_dp = sr.tracked_dp[static_cast<std::size_t>(it - r.tracked_times.begin()) - 1];
      m.segment_dp_crit = sr.dp_crit;
      m.segment_reached = sr.first_crossing && *sr.first_crossing <= ev.time;
      const auto ko = std::upper_bound(s.output.times.begin(), s.output.times.end(), ev.time);
      if (prob && ko != s.output.times.begin()) {
        const std::size_t k = static_cast<std::size_t>(ko - s.output.times.begin()) - 1;
        const auto ci = stats::wilson_interval(prob->result.segments[m.segment].slipped_by[k], prob->result.realizations, z);
        m.probability_time = k;
        m.p_slip = slip_probability(*prob, m.segment, k);
        m.p_low = ci.lower;
        m.p_high = ci.upper;
      }
    }
    if (m.in_study_area) {
      area_dp.push_back(m.dp);
      v.footprint_expected += m.footprint_fraction;
    }
    v.events.push_back(m);
  }
  const double mean_f = area_dp.empty() ? 0.0 : v.footprint_expected / static_cast<double>(area_dp.size());
  v.footprint = seismo::footprint_count(area_dp, v.spec.footprint_threshold, std::clamp(mean_f, 0.0, 1.0));
}

void review_rates(CatalogReview& v, const ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r) {
  if (!v.spec.rate_state) return;
  for (std::size_t i = 0; i < p.segments.size(); ++i) {
    SegmentRate sr;
    sr.background_rate = v.spec.background_rate_per_m * p.segments[i].trace.length_m;
    const auto& g = r.segments[i];
    seismo::CoulombHistory h;
    const double t0 = std::min(s.output.times.front(), r.tracked_times.empty() ? s.output.times.front() : r.tracked_times.front());
    if (r.tracked_times.empty() || t0 < r.tracked_times.front()) {
      h.time.push_back(t0);
      h.coulomb_change.push_back(0.0);
    }
    for (std::size_t k = 0; k < r.tracked_times.size(); ++k) {
      h.time.push_back(r.tracked_times[k]);
      h.coulomb_change.push_back(g.friction * g.tracked_dp[k]);
    }
    sr.history_start = h.time.front();
    for (double dp : g.dp) sr.dcff.push_back(g.friction * dp);
    try {
      const auto params = seismo::RateStateParameters::from_aftershock_duration(sr.background_rate, v.spec.a_sigma,
                                                                                v.spec.aftershock_duration);
      sr.samples = seismo::rate_response(h, params, s.output.times);
    } catch (const NumericalError& e) {
      sr.note = e.what();
    }
    v.rates.push_back(std::move(sr));
  }
}

}  // namespace

CatalogReview review_catalog(const ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                             const ProbabilisticRun* prob) {
  CatalogReview v;
  v.spec = *s.catalog;
  for (const auto& seg : p.segments) {
    v.segment_ids.push_back(seg.segment_id);
    v.segment_faults.push_back(seg.fault_id);
  }
  const CatalogSpec& c = v.spec;
  const CatalogFormat fmt = c.format == "csv"       ? CatalogFormat::csv
                            : c.format == "quakeml" ? CatalogFormat::quakeml
                                                    : CatalogFormat::automatic;
  CatalogColumns columns;
  if (!c.columns.empty()) {
    try {
      columns = parse_catalog_columns(c.columns);
    } catch (const InputError& e) {
      throw InputError(std::string("catalog.columns: ") + e.what(), c.columns, "a column mapping (docs/catalogs.md)", c.where);
    }
  }
  v.read = read_catalog(c.path.string(), fmt, columns, c.strict);
  v.read.path = c.file;
  const seismo::Catalog working = to_working_crs(v.read, p);

  seismo::CatalogFilter f;
  f.start = c.from;
  f.end = c.to;
  f.depth_min = c.depth_min;
  f.depth_max = c.depth_max;
  f.magnitude_types = c.magnitude_types;
  f.strict = c.strict;
  f.polygon = c.polygon;
  if (c.well_buffer) {
    for (const auto& w : p.wells) f.buffer_points.push_back({w.x, w.y});
    f.buffer_radius = *c.well_buffer;
  }
  seismo::FilterResult kept = seismo::apply_filter(working, f);
  v.counts = kept.counts;
  v.catalog = std::move(kept.catalog);

  const double t_end = s.output.times.back();
  v.catalog_end = c.to ? *c.to : (v.catalog.events.empty() ? s.output.times.front() : seismo::times(v.catalog).back());
  seismo::SummaryOptions so;
  so.bin_width = c.bin_width;
  so.mc_correction = c.mc_correction;
  so.fixed_mc = c.mc;
  so.bootstrap_resamples = c.bootstrap;
  so.bootstrap_confidence = c.bootstrap_confidence;
  so.seed = s.seed;
  so.net_volume = total_volume(p.wells, t_end);
  so.shear_modulus = c.shear_modulus;
  so.volume_history = volume_history(p.wells, std::min(v.catalog_end, t_end));  // Σ: volume while the catalog ran
  so.planned_volume = std::max(0.0, total_volume(p.wells, t_end) - total_volume(p.wells, std::min(v.catalog_end, t_end)));
  so.forecast_magnitudes = c.forecast_magnitudes;
  std::map<std::string, double> lengths;
  for (const auto& seg : p.segments) lengths[seg.fault_id] += seg.trace.length_m;
  for (const auto& [id, len] : lengths) so.faults.push_back({id, len});
  so.regression = c.length_regression == "subsurface" ? seismo::LengthRegression::subsurface_rupture_length_all
                                                      : seismo::LengthRegression::surface_rupture_length_all;
  v.summary = seismo::summarize_catalog(v.catalog, so);

  review_events(v, s, p, r, prob);

  if (const WellSpec* w = rt_well(c, p, v.catalog_end); w && !w->periods.empty()) {
    std::vector<double> d = c.diffusivities;
    if (d.empty()) {
      d.push_back(p.inputs.formation.diffusivity);
      if (prob && prob->result.diffusivity_max > prob->result.diffusivity_min) {
        d.push_back(prob->result.diffusivity_min);
        d.push_back(prob->result.diffusivity_max);
      }
    }
    v.rt = make_rt_view(v.catalog, {w->x, w->y}, w->periods.front().start, d, w->id);
    for (const auto& pt : v.rt->points) {
      v.events[pt.event].rt_time = pt.t;
      v.events[pt.event].rt_distance = pt.r;
    }
  }
  review_rates(v, s, p, r);

  auto& a = v.assumptions;
  a.push_back("Events are placed by their epicentres in the working CRS; depth is not used for distances or Δp "
              "(the pressure model is two-dimensional in the injected formation).");
  a.push_back("The net volume for the McGarr (2014) bound is the total injected by all scenario wells up to the last "
              "output time, planned volumes included.");
  a.push_back("Forecasts use the volume the scenario wells inject after the end of the reviewed catalog (" +
              format_iso8601_utc(v.catalog_end) + ") up to the last output time, with the observed Σ and b.");
  a.push_back("Footprint: events inside the output grid's extent with modelled Δp at their own place and time of at "
              "least the threshold, against the number expected by chance from the footprint's area fraction at "
              "each event time (one-sided binomial test with the mean fraction; conservative).");
  if (p.grid.cell_count() == 0)
    a.push_back("No output grid (output.rasters = false): no study area, so the footprint test counts no events.");
  a.push_back("P(slip) of an event's nearest segment is the injection-induced probability at the last output time "
              "at or before the event (probabilities are computed at output times).");
  if (c.rate_state)
    a.push_back("Seismicity rates: Dieterich (1994) rate-and-state response to ΔCFF = μ Δp on each segment (no "
                "poroelastic stress change), background rate per km of trace, Aσ and t_a as given.");
  return v;
}

nlohmann::json catalog_review_json(const ResolvedScenario& s, const PreparedRun& p, const CatalogReview& v) {
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
      fronts.push_back({{"diffusivity_m2_s", v.rt->diffusivities[i]}, {"fraction_inside", v.rt->fraction_inside[i]}});
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
      {"seismicity_rate", v.spec.rate_state ? nlohmann::json{{"method", "Dieterich (1994) rate-and-state, dCFF = mu dp"},
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

nlohmann::json catalog_manifest(const CatalogReview& v) {
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

}  // namespace

void write_catalog_review(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                          const CatalogReview& v) {
  write_text_file(folder.output("catalog", "catalog_summary.json"),
             catalog_review_json(s, p, v).dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n");
  const bool seg = !p.segments.empty();
  std::ostringstream ev;
  ev << "event_id,time,x_m,y_m,depth_m,magnitude,magnitude_type,in_study_area,dp_MPa,in_footprint,"
        "footprint_area_fraction,nearest_segment,nearest_fault,distance_m,segment_dp_MPa,segment_dp_crit_MPa,"
        "segment_reached_dp_crit,p_slip,p_slip_low,p_slip_high,p_slip_date,rt_days_since_start,rt_distance_m,source\n";
  for (std::size_t i = 0; i < v.events.size(); ++i) {
    const auto& e = v.catalog.events[i];
    const auto& m = v.events[i];
    ev << csv_field(e.id) << "," << format_iso8601_utc(e.time) << "," << fixed_decimals(m.x, 1) << ","
       << fixed_decimals(m.y, 1) << "," << (e.depth ? fixed_decimals(*e.depth, 1) : "") << ","
       << fixed_decimals(e.magnitude, 2) << "," << csv_field(e.magnitude_type) << "," << yes_no(m.in_study_area) << ","
       << fixed_decimals(m.dp / kMPa, 6) << "," << yes_no(m.dp >= v.spec.footprint_threshold) << ","
       << fixed_decimals(m.footprint_fraction, 6) << ",";
    if (seg)
      ev << csv_field(p.segments[m.segment].segment_id) << "," << csv_field(p.segments[m.segment].fault_id) << ","
         << fixed_decimals(m.distance, 1) << "," << fixed_decimals(m.segment_dp / kMPa, 6) << ","
         << fixed_decimals(m.segment_dp_crit / kMPa, 6) << "," << yes_no(m.segment_reached) << ",";
    else
      ev << ",,,,,,";
    if (m.probability_time)
      ev << fixed_decimals(m.p_slip, 6) << "," << fixed_decimals(m.p_low, 6) << "," << fixed_decimals(m.p_high, 6) << ","
         << util::format_iso_date(s.output.dates[*m.probability_time]) << ",";
    else
      ev << ",,,,";
    ev << (m.rt_time ? fixed_decimals(*m.rt_time / units::kDay, 4) : "") << ","
       << (m.rt_distance ? fixed_decimals(*m.rt_distance, 1) : "") << "," << csv_field(e.source) << "\n";
  }
  write_text_file(folder.output("catalog", "catalog_events.csv"), ev.str());
  if (v.rt) {
    write_text_file(folder.output("catalog", "rt_events.csv"), rt_events_csv(v.catalog, *v.rt));
    write_text_file(folder.output("catalog", "rt_fronts.csv"), rt_fronts_csv(*v.rt));
  }
  if (!v.rates.empty()) {
    const double yr = units::kYear;
    std::ostringstream t;
    t << "segment_id,fault_id,date,dcff_MPa,background_rate_per_year,rate_per_year,rate_ratio,"
         "expected_events,background_expected_events\n";
    // Per fault: rates and counts summed over its segments, largest ΔCFF.
    std::map<std::string, std::vector<std::array<double, 5>>> faults;
    std::vector<std::string> order;
    const std::size_t K = s.output.times.size();
    for (std::size_t i = 0; i < v.rates.size(); ++i) {
      const auto& r = v.rates[i];
      const auto& sg = p.segments[i];
      auto [it, fresh] = faults.try_emplace(sg.fault_id, std::vector<std::array<double, 5>>(K, {0, 0, 0, 0, 0}));
      if (fresh) order.push_back(sg.fault_id);
      for (std::size_t k = 0; k < K; ++k) {
        const double bg = r.background_rate * std::max(0.0, s.output.times[k] - r.history_start);
        t << csv_field(sg.segment_id) << "," << csv_field(sg.fault_id) << ","
          << util::format_iso_date(s.output.dates[k]) << ",";
        if (r.samples.empty()) {
          t << ",," << ",,,\n";
          continue;
        }
        const auto& q = r.samples[k];
        t << fixed_decimals(r.dcff[k] / kMPa, 6) << "," << fixed_decimals(r.background_rate * yr, 6) << ","
          << fixed_decimals(q.rate * yr, 6) << "," << fixed_decimals(q.rate / r.background_rate, 6) << ","
          << fixed_decimals(q.expected, 6) << "," << fixed_decimals(bg, 6) << "\n";
        auto& a = it->second[k];
        a[0] = std::max(a[0], r.dcff[k]);
        a[1] += r.background_rate;
        a[2] += q.rate;
        a[3] += q.expected;
        a[4] += bg;
      }
    }
    write_text_file(folder.output("catalog", "seismicity_rate.csv"), t.str());
    std::ostringstream ft;
    ft << "fault_id,date,max_dcff_MPa,background_rate_per_year,rate_per_year,rate_ratio,expected_events,"
          "background_expected_events\n";
    for (const auto& id : order)
      for (std::size_t k = 0; k < K; ++k) {
        const auto& a = faults[id][k];
        ft << csv_field(id) << "," << util::format_iso_date(s.output.dates[k]) << "," << fixed_decimals(a[0] / kMPa, 6)
           << "," << fixed_decimals(a[1] * yr, 6) << "," << fixed_decimals(a[2] * yr, 6) << ","
           << (a[1] > 0 ? fixed_decimals(a[2] / a[1], 6) : "") << "," << fixed_decimals(a[3], 6) << ","
           << fixed_decimals(a[4], 6) << "\n";
      }
    write_text_file(folder.output("catalog", "seismicity_rate_faults.csv"), ft.str());
  }
}

}  // namespace slipscreen::io
