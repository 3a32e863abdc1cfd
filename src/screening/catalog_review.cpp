#include "screening/catalog_review.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/seismo/nearest_fault.hpp"
#include "core/stats/wilson_interval.hpp"
#include "formats/gis/crs.hpp"
#include "formats/table/iso_time.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::screening {

namespace {

double total_volume(const std::vector<scenario::WellSpec>& wells, double t) {
  double v = 0.0;
  for (const auto& w : wells) v += w.volume_until(t);
  return v;
}

// Summed cumulative volume of every scenario well, sampled at every rate change up to t_end
// (exact: rates are constant between changes, so the curve is piecewise linear). With a catalog
// reviewed from a date after injection began ([catalog] from), the history starts there, at
// the volume injected by then: Σ counts the events from that date, so it takes the volume
// injected from that date too (seismogenic_index.hpp).
std::optional<seismo::VolumeHistory> volume_history(const std::vector<scenario::WellSpec>& wells,
                                                    std::optional<double> from, double t_end) {
  std::set<double> times;
  for (const auto& w : wells)
    for (const auto& per : w.periods) {
      if (per.start < t_end) times.insert(per.start);
      if (per.end < t_end) times.insert(per.end);
    }
  times.insert(t_end);
  if (from && *from > *times.begin()) {
    times.erase(times.begin(), times.lower_bound(*from));
    if (*from < t_end) times.insert(*from);
  }
  seismo::VolumeHistory h;
  for (double t : times) {
    h.time.push_back(t);
    h.volume.push_back(total_volume(wells, t));
  }
  if (h.time.size() < 2 || !(h.volume.back() > 0.0)) return std::nullopt;
  return h;
}

// The r-t well: the one named, else the well that injected most by the end of the catalog.
const scenario::WellSpec* rt_well(const scenario::CatalogSpec& c, const PreparedRun& p, double catalog_end) {
  const scenario::WellSpec* best = nullptr;
  for (const auto& w : p.wells) {
    if (!c.rt_well.empty()) {
      if (w.id == c.rt_well) return &w;
      continue;
    }
    if (!w.periods.empty() && (!best || w.volume_until(catalog_end) > best->volume_until(catalog_end))) best = &w;
  }
  return best;
}

seismo::Catalog to_working_crs(const formats::CatalogReadResult& read, const PreparedRun& p) {
  const formats::Crs from = formats::Crs::from_user_string(read.catalog.crs, read.path + ": catalog CRS");
  const formats::Transformer tr(from, p.working);
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

// The footprint's area fraction at each output time: cells of the output grid, coarsened to at
// most kMapCells, with Δp ≥ the threshold (the coarse grid's overhang is outside the study area).
void footprint_fractions(CatalogReview& v, const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const auto& g = p.grid;
  const double x1 = g.x_origin + g.columns * g.cell_size;
  const double y0 = g.y_origin - g.rows * g.cell_size;
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
}

// The event's nearest segment, that segment's Δp and Δp_crit at the event time, whether the
// deterministic screen has it reach Δp_crit by then, and its P(slip) at the last output time at or
// before the event (`prob` may be null).
void segment_attributes(EventAgainstModel& m, const seismo::Event& ev, const seismo::NearestFault& nearest,
                        const scenario::ResolvedScenario& s, const screen::ScreenResult& r,
                        const ProbabilisticRun* prob, double z) {
  m.segment = nearest.segment;
  m.distance = nearest.distance;
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

void review_events(CatalogReview& v, const scenario::ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                   const ProbabilisticRun* prob) {
  const auto& g = p.grid;
  const double x0 = g.x_origin, x1 = g.x_origin + g.columns * g.cell_size;
  const double y1 = g.y_origin, y0 = g.y_origin - g.rows * g.cell_size;

  std::vector<hydro::WellSource> sources;
  for (const auto& w : p.inputs.wells) sources.push_back({w.id, w.x, w.y, w.radius, w.history});
  const hydro::PressureField field(std::move(sources), p.inputs.boundaries);

  footprint_fractions(v, s, p);
  const double first_injection = first_injection_time(s, p);
  const std::vector<seismo::FaultTrace> traces = segment_traces(p);
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
    if (!traces.empty()) segment_attributes(m, ev, nearest[e], s, r, prob, z);
    if (m.in_study_area) {
      area_dp.push_back(m.dp);
      v.footprint_expected += m.footprint_fraction;
    }
    v.events.push_back(m);
  }
  const double mean_f = area_dp.empty() ? 0.0 : v.footprint_expected / static_cast<double>(area_dp.size());
  v.footprint = seismo::footprint_count(area_dp, v.spec.footprint_threshold, std::clamp(mean_f, 0.0, 1.0));
}

// Per fault: the rates and expected counts of its segments summed, the largest ΔCFF.
void fault_rates(CatalogReview& v, const PreparedRun& p, std::size_t K) {
  std::map<std::string, std::size_t> index;
  for (std::size_t i = 0; i < v.rates.size(); ++i) {
    const auto& r = v.rates[i];
    const std::string& id = p.segments[i].fault_id;
    const auto [it, fresh] = index.try_emplace(id, v.fault_rates.size());
    if (fresh) v.fault_rates.push_back({id, std::vector<FaultRateSample>(K)});
    if (r.samples.empty()) continue;
    auto& f = v.fault_rates[it->second];
    for (std::size_t k = 0; k < K; ++k) {
      auto& a = f.samples[k];
      a.max_dcff = std::max(a.max_dcff, r.dcff[k]);
      a.background_rate += r.background_rate;
      a.rate += r.samples[k].rate;
      a.expected += r.samples[k].expected;
      a.background_expected += r.background_expected[k];
    }
  }
}

void review_rates(CatalogReview& v, const scenario::ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r) {
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
      h.coulomb_change.push_back(g.coulomb_change.at(g.tracked_dp[k]));
    }
    sr.history_start = h.time.front();
    for (double dp : g.dp) sr.dcff.push_back(g.coulomb_change.at(dp));
    try {
      const auto params = seismo::RateStateParameters::from_aftershock_duration(sr.background_rate, v.spec.a_sigma,
                                                                                v.spec.aftershock_duration);
      sr.samples = seismo::rate_response(h, params, s.output.times);
    } catch (const NumericalError& e) {
      sr.note = e.what();
    }
    for (double t : s.output.times) sr.background_expected.push_back(sr.background_rate * std::max(0.0, t - sr.history_start));
    v.rates.push_back(std::move(sr));
  }
  fault_rates(v, p, s.output.times.size());
}

}  // namespace

// The catalog statistics' options from [catalog] and the scenario's volumes: the net volume up to
// the last output time (McGarr bound), the volume history while the catalog ran (Σ) and the volume
// injected after it (forecasts).
seismo::SummaryOptions summary_options(const CatalogReview& v, const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const scenario::CatalogSpec& c = v.spec;
  const double t_end = s.output.times.back();
  seismo::SummaryOptions so;
  so.bin_width = c.bin_width;
  so.mc_correction = c.mc_correction;
  so.fixed_mc = c.mc;
  so.bootstrap_resamples = c.bootstrap;
  so.bootstrap_confidence = c.bootstrap_confidence;
  so.seed = s.seed;
  so.net_volume = total_volume(p.wells, t_end);
  so.shear_modulus = c.shear_modulus;
  so.volume_history = volume_history(p.wells, c.from, std::min(v.catalog_end, t_end));  // Σ: volume while the catalog ran
  so.planned_volume = std::max(0.0, total_volume(p.wells, t_end) - total_volume(p.wells, std::min(v.catalog_end, t_end)));
  so.forecast_magnitudes = c.forecast_magnitudes;
  std::map<std::string, double> lengths;
  for (const auto& seg : p.segments) lengths[seg.fault_id] += seg.trace.length_m;
  for (const auto& [id, len] : lengths) so.faults.push_back({id, len});
  so.regression = c.length_regression == "subsurface" ? seismo::LengthRegression::subsurface_rupture_length_all
                                                      : seismo::LengthRegression::surface_rupture_length_all;
  return so;
}

// The r-t view around the r-t well, with fronts for the given diffusivities (or the run's D and
// the probabilistic screen's sampled range); each event gets its r-t coordinates.
void review_rt(CatalogReview& v, const PreparedRun& p, const ProbabilisticRun* prob) {
  const scenario::CatalogSpec& c = v.spec;
  if (const scenario::WellSpec* w = rt_well(c, p, v.catalog_end); w && !w->periods.empty()) {
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
}

void state_assumptions(CatalogReview& v, const PreparedRun& p) {
  auto& a = v.assumptions;
  const scenario::CatalogSpec& c = v.spec;
  v.poroelastic_path = p.inputs.stress_path_kappa > 0.0;
  a.push_back("Events are placed by their epicentres in the working CRS; depth is not used for distances or Δp "
              "(the pressure model is two-dimensional in the injected formation).");
  a.push_back("The net volume for the McGarr (2014) bound is the total injected by all scenario wells up to the last "
              "output time, planned volumes included.");
  a.push_back("Forecasts use the volume the scenario wells inject after the end of the reviewed catalog (" +
              formats::format_iso8601_utc(v.catalog_end) + ") up to the last output time, with the observed Σ and b.");
  a.push_back("Footprint: events inside the output grid's extent with modelled Δp at their own place and time of at "
              "least the threshold, against the number expected by chance from the footprint's area fraction at "
              "each event time (one-sided binomial test with the mean fraction; conservative).");
  if (p.grid.cell_count() == 0)
    a.push_back("No output grid (output.rasters = false): no study area, so the footprint test counts no events.");
  a.push_back("P(slip) of an event's nearest segment is the injection-induced probability at the last output time "
              "at or before the event (probabilities are computed at output times).");
  if (c.rate_state)
    a.push_back(std::string("Seismicity rates: Dieterich (1994) rate-and-state response to ") +
                (v.poroelastic_path
                     ? "ΔCFF on each segment along the poroelastic stress path (Δσh = κΔp, Engelder & Fischer 1994)"
                     : "ΔCFF = μ Δp on each segment (no poroelastic stress change)") +
                ", background rate per km of trace, Aσ and t_a as given.");
}

seismo::FilterResult filtered_catalog(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const scenario::CatalogSpec& c = *s.catalog;
  const seismo::Catalog working = to_working_crs(*p.catalog, p);
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
  return seismo::apply_filter(working, f);
}

std::vector<seismo::FaultTrace> segment_traces(const PreparedRun& p) {
  std::vector<seismo::FaultTrace> traces;
  for (const auto& seg : p.segments) {
    seismo::FaultTrace t;
    for (const auto& q : seg.trace.vertices) t.push_back({q.x, q.y});
    traces.push_back(std::move(t));
  }
  return traces;
}

double first_injection_time(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  double first = s.output.times.back();
  for (const auto& w : p.wells)
    if (!w.periods.empty()) first = std::min(first, w.periods.front().start);
  return first;
}

CatalogReview review_catalog(const scenario::ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                             const ProbabilisticRun* prob) {
  CatalogReview v;
  v.spec = *s.catalog;
  for (const auto& seg : p.segments) {
    v.segment_ids.push_back(seg.segment_id);
    v.segment_faults.push_back(seg.fault_id);
  }
  const scenario::CatalogSpec& c = v.spec;
  v.read = *p.catalog;  // read by prepare_run, before any computing
  seismo::FilterResult kept = filtered_catalog(s, p);
  v.counts = kept.counts;
  v.catalog = std::move(kept.catalog);

  v.catalog_end = c.to ? *c.to : (v.catalog.events.empty() ? s.output.times.front() : seismo::times(v.catalog).back());
  const seismo::SummaryOptions options = summary_options(v, s, p);
  v.volume_history = options.volume_history;
  v.summary = seismo::summarize_catalog(v.catalog, options);

  review_events(v, s, p, r, prob);
  review_rt(v, p, prob);
  review_rates(v, s, p, r);
  state_assumptions(v, p);
  return v;
}

}  // namespace slipscreen::screening
