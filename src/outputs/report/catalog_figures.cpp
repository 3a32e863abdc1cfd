#include "outputs/report/catalog_figures.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <fstream>

#include "core/errors.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "formats/drawing/canvas.hpp"
#include "formats/gis/run_layers.hpp"
#include "outputs/report/figure_support.hpp"
#include "outputs/report/plot.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
using formats::Canvas;
using formats::Colour;
using formats::Stroke;
using nlohmann::json;

namespace {

const Colour kInside = formats::rgb(0x0072b2);   // blue: event inside the Δp footprint
const Colour kOutside = formats::rgb(0xe69f00);  // orange: outside it
const Colour kFit = formats::rgb(0xd55e00);      // vermillion: fitted lines
const Colour kMc = formats::rgb(0x57606a);
const Colour kIncremental = formats::rgb(0x56b4e9).with_alpha(0.75);
const Colour kCumulative = formats::rgb(0x0072b2);

json read_json(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(path.string() + ": cannot open");
  json j = json::parse(in, nullptr, /*allow_exceptions=*/false);
  if (j.is_discarded()) throw InputError("file", path.filename().string(), "a JSON document", path.string());
  return j;
}

// A number of the summary at `pointer`; NaN when it is null or absent.
double json_number(const json& j, const std::string& pointer) {
  const json::json_pointer p(pointer);
  return j.contains(p) && j.at(p).is_number() ? j.at(p).get<double>() : std::nan("");
}

// Magnitudes at or above Mc, as the catalog statistics count them (relative tolerance 1e-9,
// core/seismo/seismogenic_index.hpp).
bool at_or_above(double m, double mc) { return m >= mc - 1e-9 * std::max(1.0, std::abs(mc)); }

struct Event {
  std::string id;
  double days, x, y, magnitude;
  bool inside;
};

std::vector<Event> read_events(const RunTable& t) {
  std::vector<Event> out;
  for (std::size_t i = 0; i < t.rows(); ++i)
    out.push_back({t.text(i, "event_id"), table_days(t, i, "time"), t.si(i, "x"), t.si(i, "y"), t.number(i, "magnitude"),
                   t.text(i, "in_footprint") == "yes"});
  return out;
}

// The r–t fronts' colours: Okabe–Ito hues other than the events' blue.
Colour front_colour(std::size_t i) {
  constexpr std::size_t kHues[] = {4, 2, 5, 0, 7};
  return category_colour(kHues[i % 5]);
}

std::string mag_text(double m) { return util::fixed_decimals(m, 2); }

Figure magnitude_time(const std::vector<Event>& events, double mc) {
  Figure f;
  f.name = "catalog_magnitude_time";
  f.title = "Magnitude against time of the reviewed events";
  f.reading = "One dot per reviewed event, sized by magnitude; blue events lie inside the modelled pressure footprint "
              "at their origin time, orange ones outside it. The grey line is the magnitude of completeness Mc.";
  f.data.header = {"event_id", "time_days_since_1970", "magnitude", "in_footprint"};
  for (const auto& e : events)
    f.data.rows.push_back({e.id, data_number(e.days), data_number(e.magnitude), e.inside ? "yes" : "no"});
  f.data.rows.push_back({"Mc", "", data_number(mc), ""});
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Magnitude–time", std::to_string(events.size()) + " reviewed events; Mc = " + mag_text(mc));
    page.legend_right({{"inside Δp footprint", kInside, LegendEntry::Mark::dot},
                       {"outside", kOutside, LegendEntry::Mark::dot},
                       {"Mc", kMc}});
    double t0 = events.front().days, t1 = t0, m0 = events.front().magnitude, m1 = m0;
    for (const auto& e : events) {
      t0 = std::min(t0, e.days), t1 = std::max(t1, e.days);
      m0 = std::min(m0, e.magnitude), m1 = std::max(m1, e.magnitude);
    }
    const double pad = std::max(30.0, (t1 - t0) * 0.03);
    Plot plot(c, page.body(), {t0 - pad, t1 + pad, "origin time", AxisKind::date},
              nice_axis(std::min(m0, mc) - 0.2, m1 + 0.2, "magnitude"));
    plot.axes();
    plot.hline(mc, {.colour = kMc, .width = 1.0, .dash = {4, 3}});
    // One clip for all events (a clip per dot would be one clip path per event in the SVG).
    c.clip(plot.frame());
    for (const auto& e : events)
      if (std::isfinite(e.days) && std::isfinite(e.magnitude))
        c.circle(plot.to_page(e.days, e.magnitude), 1.6 + 1.1 * std::max(0.0, e.magnitude - m0), e.inside ? kInside : kOutside,
                 Stroke{.colour = formats::kPaper, .width = 0.4});
    c.unclip();
    page.footer();
  };
  return f;
}

Figure frequency_magnitude(const json& summary) {
  struct Bin {
    double m;
    double count, cumulative;
  };
  std::vector<Bin> bins;
  for (const auto& b : summary.at("frequency_magnitude"))
    bins.push_back({b.at("magnitude").get<double>(), b.at("count").get<double>(), 0});
  std::sort(bins.begin(), bins.end(), [](const Bin& a, const Bin& b) { return a.m < b.m; });
  double total = 0;
  for (auto it = bins.rbegin(); it != bins.rend(); ++it) it->cumulative = (total += it->count);
  const double mc = json_number(summary, "/completeness/mc"), a = json_number(summary, "/b_value/a"),
               b = json_number(summary, "/b_value/b"), sigma = json_number(summary, "/b_value/sigma");
  const double width = std::isfinite(json_number(summary, "/b_value/bin_width")) ? json_number(summary, "/b_value/bin_width")
                                                                                : 0.1;
  const bool fit = std::isfinite(a) && std::isfinite(b) && std::isfinite(mc);

  Figure f;
  f.name = "catalog_frequency_magnitude";
  f.title = "Frequency-magnitude distribution with Mc and the fitted b-value";
  f.reading = "Bars: events per magnitude bin; dots: events at or above each magnitude (log scale). The vertical line is "
              "Mc; the red line is log10 N(>=M) = a - bM with the maximum-likelihood b (Aki 1965, Utsu correction), "
              "drawn from Mc up.";
  f.data.header = {"magnitude", "count", "cumulative_count", "fit_log10_cumulative"};
  for (const auto& bn : bins)
    f.data.rows.push_back({data_number(bn.m), data_number(bn.count), data_number(bn.cumulative),
                           fit && at_or_above(bn.m, mc) ? data_number(a - b * bn.m) : ""});
  std::string sub = "Mc = " + mag_text(mc);
  if (fit) sub += ", b = " + mag_text(b) + " ± " + mag_text(sigma) + ", a = " + mag_text(a);
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Frequency–magnitude distribution", sub);
    std::vector<LegendEntry> legend = {{"events per bin", kIncremental, LegendEntry::Mark::band},
                                       {"events ≥ M", kCumulative, LegendEntry::Mark::dot},
                                       {"Mc", kMc}};
    if (fit) legend.push_back({"log₁₀ N = a − bM", kFit});
    page.legend_right(legend);
    const double lo_m = bins.front().m - width, hi_m = bins.back().m + width;
    Plot plot(c, page.body(), nice_axis(lo_m, hi_m, "magnitude"),
              nice_axis(0.8, std::max(10.0, total * 1.2), "number of events", AxisKind::log10));
    plot.axes();
    std::vector<double> left, right, base, top, m, cum;
    for (const auto& bn : bins) {
      if (bn.count > 0) {
        left.push_back(bn.m - width * 0.42), right.push_back(bn.m + width * 0.42);
        base.push_back(0.8), top.push_back(bn.count);
      }
      m.push_back(bn.m), cum.push_back(bn.cumulative);
    }
    plot.bars(left, right, base, top, kIncremental);
    plot.vline(mc, {.colour = kMc, .width = 1.0, .dash = {4, 3}}, "Mc");
    if (fit) {
      std::vector<double> x, y;
      for (const auto& bn : bins)
        if (at_or_above(bn.m, mc)) x.push_back(bn.m), y.push_back(std::pow(10.0, a - b * bn.m));
      plot.line(x, y, {.colour = kFit, .width = 1.4});
    }
    plot.dots(m, cum, 2.4, kCumulative, Stroke{.colour = formats::kPaper, .width = 0.4});
    page.footer();
  };
  return f;
}

Figure volume_figure(const std::vector<Event>& events, const RunTable& vol, const json& summary) {
  std::vector<double> vt, vv;  // days, m³
  for (std::size_t i = 0; i < vol.rows(); ++i) vt.push_back(table_days(vol, i, "time")), vv.push_back(vol.si(i, "volume"));
  const double mc_used = json_number(summary, "/completeness/mc"), b = json_number(summary, "/b_value/b"),
               sigma_index = json_number(summary, "/seismogenic_index/sigma");
  const double start = vt.front(), end = vt.back(), v0 = vv.front();
  // Cumulative volume at a time: the history is linear between its samples (injected_volume.csv).
  auto volume_at = [&](double d) {
    const auto it = std::upper_bound(vt.begin(), vt.end(), d);
    if (it == vt.begin()) return vv.front();
    if (it == vt.end()) return vv.back();
    const std::size_t k = static_cast<std::size_t>(it - vt.begin());
    return vv[k - 1] + (vv[k] - vv[k - 1]) * (d - vt[k - 1]) / (vt[k] - vt[k - 1]);
  };
  std::vector<std::pair<double, std::string>> counted;  // (days, id) of events ≥ Mc in the window
  for (const auto& e : events)
    if (at_or_above(e.magnitude, mc_used) && e.days >= start && e.days <= end) counted.push_back({e.days, e.id});
  std::sort(counted.begin(), counted.end());
  const bool fit = std::isfinite(sigma_index) && std::isfinite(b);
  const double per_m3 = fit ? std::pow(10.0, sigma_index - b * mc_used) : std::nan("");
  const double v_max = vv.back() - v0;

  Figure f;
  f.name = "catalog_volume";
  f.title = "Events at or above Mc against the injected volume, with the seismogenic-index fit";
  f.reading = "The step line counts the reviewed events at or above Mc against the volume all scenario wells had injected "
              "since the start of the review window when each occurred; the straight line is the seismogenic-index "
              "relation N = dV 10^(Sigma - b Mc) (Shapiro et al. 2010) with the fitted Sigma and b.";
  // The volume column in the unit the run wrote injected_volume.csv in (m3 or bbl).
  const DisplayUnit vu = unit_of(vol, "volume");
  f.data.header = {"what", "event_id", "time_days_since_1970", "volume_since_start_" + vu.suffix, "events"};
  std::vector<double> xs = {0}, ys = {0};
  for (std::size_t i = 0; i < counted.size(); ++i) {
    const double v = volume_at(counted[i].first) - v0;
    f.data.rows.push_back({"event", counted[i].second, data_number(counted[i].first), data_number(vu.shown(v)),
                           std::to_string(i + 1)});
    xs.push_back(v), ys.push_back(static_cast<double>(i));
    xs.push_back(v), ys.push_back(static_cast<double>(i + 1));
  }
  xs.push_back(v_max), ys.push_back(static_cast<double>(counted.size()));
  if (fit) {
    f.data.rows.push_back({"fit", "", data_number(start), "0", "0"});
    f.data.rows.push_back({"fit", "", data_number(end), data_number(vu.shown(v_max)), data_number(v_max * per_m3)});
  }
  const std::string window = util::format_iso_date(util::civil_from_days(static_cast<std::int64_t>(std::floor(start))));
  std::string sub = std::to_string(counted.size()) + " events ≥ Mc " + mag_text(mc_used) + " since " + window;
  if (fit) sub += "; Σ = " + mag_text(sigma_index) + ", b = " + mag_text(b);
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Events against injected volume", sub);
    std::vector<LegendEntry> legend = {{"events ≥ Mc", kCumulative}};
    if (fit) legend.push_back({"seismogenic-index fit", kFit});
    page.legend_right(legend);
    const double scale = 1e6;  // shown in 10⁶ m³
    const double y_hi = std::max(static_cast<double>(counted.size()), fit ? v_max * per_m3 : 0.0);
    Plot plot(c, page.body(), nice_axis(0, v_max / scale, "volume injected since " + window + " [10⁶ m³]"),
              nice_axis(0, std::max(1.0, y_hi), "events ≥ Mc"));
    plot.axes();
    if (fit) plot.line({0, v_max / scale}, {0, v_max * per_m3}, {.colour = kFit, .width = 1.2, .dash = {5, 3}});
    std::vector<double> x;
    for (double v : xs) x.push_back(v / scale);
    plot.line(x, ys, {.colour = kCumulative, .width = 1.6});
    page.footer();
  };
  return f;
}

Figure rt_figure(const RunTable& ev, const RunTable& fr, const json& summary) {
  struct Front {
    double d;
    std::vector<double> t, r;
  };
  std::vector<Front> fronts;
  for (std::size_t i = 0; i < fr.rows(); ++i) {
    const double d = fr.si(i, "diffusivity");
    if (fronts.empty() || fronts.back().d != d) fronts.push_back({d, {}, {}});
    fronts.back().t.push_back(fr.si(i, "time_since_start") / 86400.0);
    fronts.back().r.push_back(fr.si(i, "front_radius"));
  }
  std::vector<double> et, er;
  std::vector<std::string> ids;
  for (std::size_t i = 0; i < ev.rows(); ++i) {
    ids.push_back(ev.text(i, "event_id"));
    et.push_back(ev.si(i, "time_since_start") / 86400.0);
    er.push_back(ev.si(i, "distance"));
  }
  const std::string well = summary.value("/against_model/rt_view/well"_json_pointer, std::string("?"));
  const std::string start = summary.value("/against_model/rt_view/start"_json_pointer, std::string("?"));

  Figure f;
  f.name = "catalog_rt";
  f.title = "Distance from the r-t well against time since its first injection, with triggering fronts";
  f.reading = "Each dot is an event after the first injection of well " + well +
              "; each curve is the triggering front r = sqrt(4 pi D t) (Shapiro et al. 1997) for one hydraulic "
              "diffusivity D. Events far outside every front are hard to explain by pressure diffusion from this well.";
  // Distances in the unit the run wrote rt_events.csv in (m or ft).
  const DisplayUnit du = unit_of(ev, "distance");
  f.data.header = {"what", "event_id", "diffusivity_m2_per_s", "time_since_start_days", "distance_" + du.suffix};
  for (std::size_t i = 0; i < ids.size(); ++i)
    f.data.rows.push_back({"event", ids[i], "", data_number(et[i]), data_number(du.shown(er[i]))});
  for (const auto& fo : fronts)
    for (std::size_t k = 0; k < fo.t.size(); ++k)
      f.data.rows.push_back({"front", "", data_number(fo.d), data_number(fo.t[k]), data_number(du.shown(fo.r[k]))});
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "r–t view around " + formats::markup_escape(well),
                    std::to_string(ids.size()) + " events since " + formats::markup_escape(start.substr(0, 10)));
    std::vector<LegendEntry> legend = {{"event", kInside, LegendEntry::Mark::dot}};
    for (std::size_t i = 0; i < fronts.size(); ++i)
      legend.push_back({"D = " + data_number(fronts[i].d) + " m²/s", front_colour(i)});
    page.legend_right(legend, "triggering fronts");
    double t_hi = 1, r_hi = 1;
    for (double v : et) t_hi = std::max(t_hi, v);
    for (double v : er) r_hi = std::max(r_hi, v);
    Plot plot(c, page.body(), nice_axis(0, t_hi / 365.25, "years since first injection"),
              nice_axis(0, r_hi * 1.1 / 1000.0, "distance from the well [km]"));
    plot.axes();
    for (std::size_t i = 0; i < fronts.size(); ++i) {
      std::vector<double> x, y;
      for (std::size_t k = 0; k < fronts[i].t.size(); ++k) x.push_back(fronts[i].t[k] / 365.25), y.push_back(fronts[i].r[k] / 1000.0);
      plot.line(x, y, {.colour = front_colour(i), .width = 1.4});
    }
    std::vector<double> x, y;
    for (std::size_t i = 0; i < et.size(); ++i) x.push_back(et[i] / 365.25), y.push_back(er[i] / 1000.0);
    plot.dots(x, y, 2.2, kInside, Stroke{.colour = formats::kPaper, .width = 0.4});
    page.footer();
  };
  return f;
}

// The Δp raster and the threshold are in MPa (pressure_change.tif, catalog_summary.json), and so
// is the figure's data (the raster's values as they are); the colour bar and the subtitle are in
// the run's pressure unit `pu`.
Figure event_map(const std::vector<Event>& events, const formats::RasterBandData& dp, double threshold,
                 const std::vector<formats::LayerFeature>& faults, const std::vector<formats::LayerFeature>& wells,
                 const DisplayUnit& pu) {
  const double per_mpa = 1e6 / pu.factor;  // the run's pressure unit per MPa
  double dp_max = threshold;
  for (double v : dp.values)
    if (std::isfinite(v)) dp_max = std::max(dp_max, v);
  // Whether a cell is inside the footprint (false outside the grid). Takes the band, so that the
  // drawing below holds no reference to this function's arguments.
  const auto in_print = [threshold](const formats::RasterBandData& b, int col, int row) {
    if (col < 0 || row < 0 || col >= b.width || row >= b.height) return false;
    const double v = b.values[static_cast<std::size_t>(row) * b.width + col];
    return std::isfinite(v) && v >= threshold;
  };
  Figure f;
  f.name = "catalog_event_map";
  f.title = "Reviewed events over the modelled pressure change at " + dp.description;
  f.reading = "Colours: modelled dp at " + dp.description +
              (pu.suffix == "MPa" ? std::string(" (pressure_change.tif, MPa)")
                                  : " in " + pu.suffix + " (pressure_change.tif holds MPa)") +
              "; the black outline encloses "
              "the cells at or above the review's footprint threshold. Dots are the reviewed events, blue when inside "
              "the footprint at their own origin time. Grey lines are the fault segments, triangles the wells.";
  f.width = kFigureWidth;
  f.height = 400;
  f.data.header = {"what", "id", "x_m", "y_m", "magnitude", "in_footprint", "dp_MPa"};  // the raster's own values
  // Cell centres x0 + (col + ½)·dx, y0 + (row + ½)·dy (the GeoTIFF's geotransform, north-up).
  for (int r = 0; r < dp.height; ++r)
    for (int col = 0; col < dp.width; ++col) {
      const double v = dp.values[static_cast<std::size_t>(r) * dp.width + col];
      f.data.rows.push_back({"cell", "", data_number(dp.x0 + (col + 0.5) * dp.dx), data_number(dp.y0 + (r + 0.5) * dp.dy), "",
                             in_print(dp, col, r) ? "yes" : "no", data_number(v)});
    }
  for (const auto& e : events)
    f.data.rows.push_back({"event", e.id, data_number(e.x), data_number(e.y), data_number(e.magnitude),
                           e.inside ? "yes" : "no", ""});
  const std::string sub = "Footprint: Δp ≥ " + util::number_text(threshold * per_mpa, 3) + " " +
                          formats::markup_escape(pu.suffix) + "; " + std::to_string(events.size()) + " events";
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Events over the pressure footprint, " + formats::markup_escape(dp.description), sub);
    page.legend_right({{"event inside footprint", kInside, LegendEntry::Mark::dot},
                       {"event outside", kOutside, LegendEntry::Mark::dot},
                       {"footprint outline", formats::kInk},
                       {"fault segment", formats::rgb(0x3a3f45)},
                       {"well", formats::kInk, LegendEntry::Mark::triangle}});
    page.colour_bar_right(Ramp::pressure, {0, dp_max * per_mpa, "Δp [" + formats::markup_escape(pu.suffix) + "]"});
    // Equal scales in x and y (a map), in km.
    const double x0 = dp.x0 / 1000, x1 = (dp.x0 + dp.width * dp.dx) / 1000;
    const double y1 = dp.y0 / 1000, y0 = (dp.y0 + dp.height * dp.dy) / 1000;
    const Plot probe(c, page.body(), {x0, x1, ""}, {y0, y1, ""});
    const double per_pt = std::max((x1 - x0) / probe.frame().w, (y1 - y0) / probe.frame().h);
    const double cx = (x0 + x1) / 2, cy = (y0 + y1) / 2;
    const double hw = per_pt * probe.frame().w / 2, hh = per_pt * probe.frame().h / 2;
    Plot plot(c, page.body(), {cx - hw, cx + hw, "easting [km]"}, {cy - hh, cy + hh, "northing [km]"});
    // The raster as one image scaled into the plot, each cell a sharp square.
    formats::Image img{dp.width, dp.height, {}};
    img.rgba.reserve(4u * dp.values.size());
    for (double v : dp.values) {
      const Colour k = std::isfinite(v) ? ramp_colour(Ramp::pressure, v / dp_max) : formats::kPaper;
      for (double ch : {k.r, k.g, k.b, std::isfinite(v) ? 1.0 : 0.0})
        img.rgba.push_back(static_cast<std::uint8_t>(std::lround(ch * 255)));
    }
    const formats::Point tl = plot.to_page(x0, y1), br = plot.to_page(x1, y0);
    c.image(img, {tl.x, tl.y, br.x - tl.x, br.y - tl.y});
    plot.axes();
    // The footprint's outline: the cell edges between cells inside and outside it, one path.
    const double cw = dp.dx / 1000, ch = -dp.dy / 1000;
    std::vector<std::vector<formats::Point>> edges;
    for (int r = 0; r <= dp.height; ++r)
      for (int col = 0; col <= dp.width; ++col) {
        const double ex = x0 + col * cw, ny = y1 - r * ch;
        if (in_print(dp, col, r) != in_print(dp, col - 1, r) && r < dp.height)
          edges.push_back({plot.to_page(ex, ny), plot.to_page(ex, ny - ch)});
        if (in_print(dp, col, r) != in_print(dp, col, r - 1) && col < dp.width)
          edges.push_back({plot.to_page(ex, ny), plot.to_page(ex + cw, ny)});
      }
    c.clip(plot.frame());
    c.lines(edges, {.width = 1.2});
    c.unclip();
    c.clip(plot.frame());
    std::vector<std::vector<formats::Point>> lines;
    for (const auto& fault : faults)
      for (const auto& part : fault.parts) {
        lines.emplace_back();
        for (const auto& [px, py] : part) lines.back().push_back(plot.to_page(px / 1000, py / 1000));
      }
    c.lines(lines, {.colour = formats::rgb(0x3a3f45), .width = 1.3});
    c.unclip();
    c.clip(plot.frame());
    for (const auto& e : events)
      if (std::isfinite(e.x) && std::isfinite(e.y))
        c.circle(plot.to_page(e.x / 1000, e.y / 1000), 2.2, e.inside ? kInside : kOutside,
                 Stroke{.colour = formats::kPaper, .width = 0.4});
    c.unclip();
    // The wells over the events, and the proposed ones named on a label box as on the area map:
    // readable over the dark Δp centre.
    for (const auto& w : wells)
      for (const auto& part : w.parts)
        for (const auto& [px, py] : part) {
          const formats::Point q = plot.to_page(px / 1000, py / 1000);
          well_triangle(c, q, 4.2, formats::kInk, Stroke{.colour = formats::kPaper, .width = 0.5});
        }
    for (const auto& w : wells)
      if (proposed_well(w) && !w.parts.empty() && !w.parts[0].empty()) {
        const formats::Point q = plot.to_page(w.parts[0][0].first / 1000, w.parts[0][0].second / 1000);
        label_box(c, {q.x + 6, q.y - 3}, formats::markup_escape(feature_field(w, "well_id")),
                  {.size = 7, .bold = true, .v = formats::VAlign::bottom});
      }
    page.footer();
  };
  return f;
}

}  // namespace

std::vector<Figure> catalog_figures(const ReportSource& src) {
  std::vector<Figure> out;
  const bool reviewed = src.manifest.contains("screens") && src.manifest["screens"].value("catalog_review", false);
  if (!reviewed || !RunTable::exists(src.folder, "catalog_events.csv")) return out;
  const json summary = read_json(src.folder / "catalog_summary.json");
  const std::vector<Event> events = read_events(src.table("catalog_events.csv"));
  const double mc = json_number(summary, "/completeness/mc");
  if (!events.empty()) out.push_back(magnitude_time(events, mc));
  if (!summary.value("frequency_magnitude", json::array()).empty()) out.push_back(frequency_magnitude(summary));
  if (RunTable::exists(src.folder, "injected_volume.csv") && std::isfinite(mc))
    out.push_back(volume_figure(events, src.table("injected_volume.csv"), summary));
  if (RunTable::exists(src.folder, "rt_events.csv") && RunTable::exists(src.folder, "rt_fronts.csv"))
    out.push_back(rt_figure(src.table("rt_events.csv"), src.table("rt_fronts.csv"),
                            summary));
  if (RunTable::exists(src.folder, "pressure_change.tif")) {
    const double threshold = json_number(summary, "/against_model/footprint/threshold_MPa");
    std::vector<formats::LayerFeature> faults, wells;
    if (RunTable::exists(src.folder, "screen.gpkg")) {
      faults = src.layer("screen.gpkg", "fault_segments");
      wells = src.layer("screen.gpkg", "wells");
    }
    const auto& band = src.last_band("pressure_change.tif");
    if (std::isfinite(threshold)) out.push_back(event_map(events, band, threshold, faults, wells, pressure_unit(src)));
  }
  return out;
}

}  // namespace slipscreen::outputs::report
