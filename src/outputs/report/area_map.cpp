#include "outputs/report/area_map.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <optional>

#include "core/util/number_text.hpp"
#include "formats/gis/run_layers.hpp"
#include "outputs/report/figure_support.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
namespace {

using formats::Box;
using formats::Colour;
using formats::HAlign;
using formats::Point;
using formats::Stroke;
using formats::VAlign;
using Line = std::vector<std::pair<double, double>>;

struct MapSegment {
  std::string id;
  Line line;
  double value = NAN;  // P(slip) or margin (SI)
};
struct MapWell {
  std::string id, status;
  bool proposed = false;
  double x = 0, y = 0;
};
struct MapEvent {
  double x = 0, y = 0, magnitude = 0;
};

struct MapData {
  std::optional<formats::RasterBandData> raster;
  double raster_max = 0;  // MPa (the raster's unit)
  std::vector<Line> footprint;
  double footprint_level = 0.1;  // MPa
  DisplayUnit pressure{"MPa", 1e6};  // the unit Δp is labelled in: the run's (the raster stays in MPa)
  std::vector<MapSegment> segments;
  std::vector<MapWell> wells;
  std::vector<MapEvent> events;
  bool probability = false;
  double p_max = 1;       // top of the P(slip) colour scale: the largest P(slip), rounded up to a nice value
  double margin_max = 1;  // for the margin colours, in the table's unit
  std::string margin_unit = "MPa";
  std::string date, crs;
  double x0 = 0, y0 = 0, x1 = 1, y1 = 1;  // extent, working CRS
};


std::string nice_length(double metres) {
  char buf[32];
  if (metres >= 1000) std::snprintf(buf, sizeof buf, "%g km", metres / 1000);
  else std::snprintf(buf, sizeof buf, "%g m", metres);
  return buf;
}

// The colour of a well status (Okabe–Ito; proposed wells also get a larger mark).
Colour status_colour(const std::string& status) {
  static const std::map<std::string, std::size_t> order = {{"active", 3}, {"shut-in", 1}, {"plugged", 7}, {"proposed", 4}};
  const auto it = order.find(status);
  return category_colour(it == order.end() ? 5 : it->second);
}

void draw_map(formats::Canvas& c, const MapData& m, const std::string& title) {
  FigurePage page(c, formats::markup_escape(title),
                  formats::markup_escape("at " + m.date + " · " + (m.crs.empty() ? std::string("working CRS") : m.crs)));
  if (m.probability) page.colour_bar_right(Ramp::probability, {0, m.p_max, "P(slip)"});
  else page.colour_bar_right(Ramp::probability, {0, m.margin_max, "margin [" + formats::markup_escape(m.margin_unit) + "]"});
  const double mpa = 1e6 / m.pressure.factor;  // the run's pressure unit per MPa
  if (m.raster)
    page.colour_bar_right(Ramp::pressure, {0, m.raster_max * mpa, "Δp [" + formats::markup_escape(m.pressure.suffix) + "]"});
  // One legend entry per status and mark, drawn with the map's own symbol: proposed wells are
  // triangles, existing wells circles.
  std::vector<LegendEntry> legend;
  std::vector<std::pair<std::string, bool>> kinds;
  for (const auto& w : m.wells)
    if (std::find(kinds.begin(), kinds.end(), std::pair{w.status, w.proposed}) == kinds.end())
      kinds.push_back({w.status, w.proposed});
  for (const auto& [st, proposed] : kinds)
    legend.push_back({formats::markup_escape(st) + (proposed && st != "proposed" ? " well (proposed)" : " well"),
                      status_colour(st), proposed ? LegendEntry::Mark::triangle : LegendEntry::Mark::dot});
  if (!m.events.empty()) legend.push_back({"earthquake (size: magnitude)", formats::rgb(0xffffff), LegendEntry::Mark::dot});
  if (!m.footprint.empty() || m.raster)
    legend.push_back({"Δp = " + util::number_text(m.footprint_level * mpa, 3) + " " + formats::markup_escape(m.pressure.suffix),
                      formats::rgb(0x0072b2), LegendEntry::Mark::line});
  // The map frame: the body with the data's aspect ratio (metres equal in x and y), above a
  // row of legend entries.
  const Box body = page.body();
  const double legend_h = 34;
  const double sx = (body.w - 4) / (m.x1 - m.x0), sy = (body.h - 18 - legend_h) / (m.y1 - m.y0);
  const double s = std::min(sx, sy);
  const Box frame{body.x + 2, body.y + 2, (m.x1 - m.x0) * s, (m.y1 - m.y0) * s};
  const auto at = [&](double x, double y) { return Point{frame.x + (x - m.x0) * s, frame.y + (m.y1 - y) * s}; };
  c.clip(frame);
  c.rectangle(frame, formats::rgb(0xf6f8fa), std::nullopt);
  if (m.raster) {
    const auto& r = *m.raster;
    formats::Image img{r.width, r.height, {}};
    img.rgba.resize(4u * r.width * r.height);
    for (std::size_t i = 0; i < r.values.size(); ++i) {
      const double v = r.values[i];
      const Colour col = ramp_colour(Ramp::pressure, m.raster_max > 0 ? v / m.raster_max : 0);
      const bool show = std::isfinite(v);
      img.rgba[4 * i] = static_cast<std::uint8_t>(std::lround(col.r * 255));
      img.rgba[4 * i + 1] = static_cast<std::uint8_t>(std::lround(col.g * 255));
      img.rgba[4 * i + 2] = static_cast<std::uint8_t>(std::lround(col.b * 255));
      img.rgba[4 * i + 3] = show ? 255 : 0;
    }
    const Point a = at(r.x0, r.y0), b = at(r.x0 + r.width * r.dx, r.y0 + r.height * r.dy);
    c.image(img, {a.x, a.y, b.x - a.x, b.y - a.y});
  }
  for (const auto& line : m.footprint) {
    std::vector<Point> pts;
    for (const auto& [x, y] : line) pts.push_back(at(x, y));
    c.line(pts, {.colour = formats::rgb(0x0072b2), .width = 1.1, .dash = {3, 2}});
  }
  // Fault segments: one path each, of the map's one segment width, over a casing of two paths
  // for all segments (a thin dark edge, then a white halo), so that dark (low P) colours stay
  // visible over the dark centre of the Δp raster and light ones over its light edge.
  std::vector<std::vector<Point>> traced;
  for (const auto& g : m.segments) {
    traced.emplace_back();
    for (const auto& [x, y] : g.line) traced.back().push_back(at(x, y));
  }
  c.lines(traced, {.colour = formats::kInk, .width = kSegmentStroke + 3.2});
  c.lines(traced, {.colour = formats::kPaper, .width = kSegmentStroke + 1.8});
  for (std::size_t i = 0; i < m.segments.size(); ++i) {
    const auto& g = m.segments[i];
    const auto& pts = traced[i];
    const double t = m.probability ? g.value / m.p_max : 1.0 - std::clamp(g.value / m.margin_max, 0.0, 1.0);
    const Colour col = std::isfinite(g.value) ? ramp_colour(Ramp::probability, t) : formats::rgb(0x9aa4ae);
    c.line(pts, {.colour = col, .width = kSegmentStroke});
  }
  double mmin = INFINITY;
  for (const auto& e : m.events) mmin = std::min(mmin, e.magnitude);
  for (const auto& e : m.events)
    c.circle(at(e.x, e.y), 1.2 + 1.1 * std::max(0.0, e.magnitude - mmin), std::nullopt,
             Stroke{.colour = formats::kInk.with_alpha(0.7), .width = 0.4});
  for (const auto& w : m.wells) {
    const Point p = at(w.x, w.y);
    if (w.proposed) {
      well_triangle(c, p, 6, status_colour(w.status), Stroke{.colour = formats::kInk, .width = 0.8});
      // On a label box: readable over the dark centre of the Δp raster as over its light edge.
      label_box(c, {p.x + 7, p.y - 4}, formats::markup_escape(w.id), {.size = 7, .bold = true, .v = VAlign::bottom});
    } else {
      c.circle(p, 3, status_colour(w.status), Stroke{.colour = formats::kInk, .width = 0.6});
    }
  }
  c.unclip();
  c.rectangle(frame, std::nullopt, Stroke{.width = 0.7});
  // Scale bar: a nice length near a quarter of the frame.
  const double target = (m.x1 - m.x0) / 4;
  const double mag = std::pow(10.0, std::floor(std::log10(target)));
  const double len = target / mag >= 5 ? 5 * mag : target / mag >= 2 ? 2 * mag : mag;
  const double bx = frame.x + 8, by = frame.bottom() - 10;
  c.rectangle({bx - 4, by - 12, len * s + 8 + 40, 18}, formats::rgb(0xffffff, 0.8), std::nullopt);
  c.rectangle({bx, by - 3, len * s / 2, 3}, formats::kInk, Stroke{.width = 0.5});
  c.rectangle({bx + len * s / 2, by - 3, len * s / 2, 3}, formats::rgb(0xffffff), Stroke{.width = 0.5});
  c.text({bx + len * s + 4, by}, nice_length(len), {.size = 7, .v = VAlign::baseline});
  // Grid-north arrow (the map is drawn in the projected CRS: up is grid north, not true north).
  const double ax = frame.right() - 16, ay = frame.y + 10;
  c.polygon({{ax, ay}, {ax + 5, ay + 14}, {ax, ay + 11}, {ax - 5, ay + 14}}, formats::kInk, std::nullopt);
  c.text({ax, ay + 16}, "grid N", {.size = 6.5, .h = HAlign::centre, .v = VAlign::top});
  {
    double lx = frame.x, ly = frame.bottom() + 22;
    for (const auto& e : legend) {
      const double w = c.measure(e.label, {.size = 7.5}).w + 24;
      if (lx + w > body.right()) lx = frame.x, ly += 12;
      if (e.mark == LegendEntry::Mark::dot) c.circle({lx + 5, ly}, 3, e.colour, Stroke{.colour = formats::kInk, .width = 0.5});
      else if (e.mark == LegendEntry::Mark::triangle) well_triangle(c, {lx + 5, ly}, 4.6, e.colour, Stroke{.width = 0.5});
      else c.line({{lx, ly}, {lx + 11, ly}}, {.colour = e.colour, .width = 1.4, .dash = {3, 2}});
      c.text({lx + 15, ly}, e.label, {.size = 7.5, .v = VAlign::middle});
      lx += w;
    }
  }
  c.text({frame.x, frame.bottom() + 4}, formats::markup_escape("CRS: " + (m.crs.empty() ? std::string("working CRS") : m.crs) +
                                                                 " · axes in metres"),
         {.size = 7, .colour = formats::rgb(0x57606a), .v = VAlign::top});
  page.footer();
}

}  // namespace

std::vector<Figure> area_map_figures(const ReportSource& s) {
  const std::string gpkg = geopackage_file(s);
  if (gpkg.empty() || !s.has_layer(gpkg, "fault_segments")) return {};
  MapData base;  // what every map shares: geometry, extent, units
  // Segment values by date: date -> id -> (value, text as the table holds it).
  std::map<std::string, std::map<std::string, std::pair<double, std::string>>> values;
  std::vector<std::string> value_header;
  if (has_probabilistic(s)) {
    base.probability = true;
    const RunTable& t = s.table("segment_probability.csv");
    const std::size_t id = t.column("segment_id"), date = t.column("date"), p = t.column("p_slip");
    for (std::size_t r = 0; r < t.rows(); ++r) values[t.text(r, date)][t.text(r, id)] = {t.number(r, p), t.text(r, p)};
    base.pressure = unit_of(t, "dp_p50");
    value_header = {"segment_id", "date", "p_slip"};
  } else {
    const RunTable& t = s.table(segment_times_file(s));
    base.margin_unit = t.quantity_unit("margin");
    const std::size_t id = t.column("segment_id"), date = t.column("date"), mg = t.column("margin_" + base.margin_unit);
    for (std::size_t r = 0; r < t.rows(); ++r) values[t.text(r, date)][t.text(r, id)] = {t.number(r, mg), t.text(r, mg)};
    base.pressure = unit_of(t, "margin");
    value_header = {"segment_id", "date", "margin_" + base.margin_unit};
  }
  if (values.empty()) return {};
  // The dates drawn: the last output time, or each (ISO dates sort in time order).
  std::vector<std::string> dates;
  for (const auto& entry : values) dates.push_back(entry.first);
  if (!s.maps_each) dates = {dates.back()};
  // One colour scale for all maps drawn, so that they can be compared.
  double largest = 0;
  base.margin_max = 0;
  for (const auto& d : dates)
    for (const auto& entry : values[d]) {
      largest = std::max(largest, entry.second.first);
      base.margin_max = std::max(base.margin_max, entry.second.first);
    }
  base.p_max = std::min(1.0, nice_axis(0, std::max(largest, 0.01), "").hi);
  if (!(base.margin_max > 0)) base.margin_max = 1;

  std::vector<std::string> segment_ids;
  for (const auto& f : s.layer(gpkg, "fault_segments")) {
    if (f.parts.empty()) continue;
    MapSegment g;
    g.id = feature_field(f, "segment_id");
    g.line = f.parts.front();
    for (std::size_t i = 1; i < f.parts.size(); ++i) g.line.insert(g.line.end(), f.parts[i].begin(), f.parts[i].end());
    base.segments.push_back(std::move(g));
  }
  if (s.has_layer(gpkg, "wells"))
    for (const auto& f : s.layer(gpkg, "wells")) {
      if (f.parts.empty() || f.parts[0].empty()) continue;
      base.wells.push_back({feature_field(f, "well_id"), feature_field(f, "status"), proposed_well(f),
                            f.parts[0][0].first, f.parts[0][0].second});
    }
  if (s.has_layer(gpkg, "earthquakes"))
    for (const auto& f : s.layer(gpkg, "earthquakes")) {
      if (f.parts.empty() || f.parts[0].empty()) continue;
      base.events.push_back({f.parts[0][0].first, f.parts[0][0].second, std::atof(feature_field(f, "magnitude").c_str())});
    }
  const auto threshold = s.manifest.value("parameters", nlohmann::json::object())
                             .value("catalog", nlohmann::json::object())
                             .value("footprint_threshold_Pa", 0.1e6);
  base.footprint_level = threshold / 1e6;
  // The rasters' bands by their description (the band's ISO date); the extent is the raster's,
  // else the data's with a margin.
  const std::string raster = pressure_raster_file(s);
  std::vector<formats::RasterBandData> bands;
  if (!raster.empty() && RunTable::exists(s.folder, raster)) {
    if (s.maps_each) bands = formats::read_raster_bands(s.folder / raster);
    else bands.push_back(s.last_band(raster));
  }
  if (!bands.empty()) {
    const auto& r = bands.back();
    base.crs = r.crs_name + (r.crs_authority.empty() ? "" : " (" + r.crs_authority + ")");
    base.x0 = std::min(r.x0, r.x0 + r.width * r.dx);
    base.x1 = std::max(r.x0, r.x0 + r.width * r.dx);
    base.y0 = std::min(r.y0, r.y0 + r.height * r.dy);
    base.y1 = std::max(r.y0, r.y0 + r.height * r.dy);
    base.raster_max = 0;
    for (const auto& b : bands)
      for (double v : b.values)
        if (std::isfinite(v)) base.raster_max = std::max(base.raster_max, v);
    if (!(base.raster_max > 0)) base.raster_max = 1;
  } else {
    base.x0 = base.y0 = INFINITY;
    base.x1 = base.y1 = -INFINITY;
    const auto grow = [&](double x, double y) {
      base.x0 = std::min(base.x0, x), base.x1 = std::max(base.x1, x), base.y0 = std::min(base.y0, y), base.y1 = std::max(base.y1, y);
    };
    for (const auto& g : base.segments)
      for (const auto& [x, y] : g.line) grow(x, y);
    for (const auto& w : base.wells) grow(w.x, w.y);
    const double pad = std::max({(base.x1 - base.x0) * 0.08, (base.y1 - base.y0) * 0.08, 500.0});
    base.x0 -= pad, base.x1 += pad, base.y0 -= pad, base.y1 += pad;
    base.crs = s.manifest.value("parameters", nlohmann::json::object())
                   .value("scenario", nlohmann::json::object())
                   .value("region", nlohmann::json::object())
                   .value("crs", std::string());
  }

  std::vector<Figure> out;
  for (const auto& date : dates) {
    MapData m = base;
    m.date = date;
    const auto& at_date = values[date];
    FigureData data;
    data.header = value_header;
    for (auto& g : m.segments) {
      const auto it = at_date.find(g.id);
      if (it != at_date.end()) g.value = it->second.first;
      data.rows.push_back({g.id, date, it != at_date.end() ? it->second.second : ""});
    }
    // The band of this date (its description); without one, the map has no raster.
    const auto band = std::find_if(bands.begin(), bands.end(),
                                   [&](const formats::RasterBandData& b) { return b.description.substr(0, 10) == date.substr(0, 10); });
    if (band != bands.end() || (!s.maps_each && !bands.empty())) {
      m.raster = band != bands.end() ? *band : bands.back();
      m.footprint = formats::contour_lines(*m.raster, m.footprint_level);
    }
    Figure f;
    f.name = s.maps_each ? "area_map_" + date.substr(0, 10) : std::string("area_map");
    f.title = m.probability ? "Fault segments by P(slip) over the pressure change, " + m.date
                            : "Fault segments by margin to failure over the pressure change, " + m.date;
    f.reading = std::string(m.probability ? "Segments are coloured by their probability of having slipped by this date "
                                            "(yellow: highest)"
                                          : "Segments are coloured by Δp_crit − Δp at this date (yellow: smallest margin)") +
                "; the background is the modelled Δp and the dashed blue line its footprint contour; triangles are "
                "proposed wells, circles existing wells and open circles earthquakes sized by magnitude.";
    f.width = kFigureWidth;
    f.height = 400;
    f.data = std::move(data);
    f.draw = [m = std::move(m), title = f.title](formats::Canvas& c) { draw_map(c, m, title); };
    out.push_back(std::move(f));
  }
  return out;
}

}  // namespace slipscreen::outputs::report
