#include "outputs/report/area_map.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <optional>

#include "formats/gis/run_layers.hpp"
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
  if (m.raster) page.colour_bar_right(Ramp::pressure, {0, m.raster_max, "Δp [MPa]"});
  std::vector<LegendEntry> legend;
  std::vector<std::string> statuses;
  for (const auto& w : m.wells)
    if (std::find(statuses.begin(), statuses.end(), w.status) == statuses.end()) statuses.push_back(w.status);
  for (const auto& st : statuses) legend.push_back({formats::markup_escape(st) + " well", status_colour(st), LegendEntry::Mark::dot});
  if (!m.events.empty()) legend.push_back({"earthquake (size: magnitude)", formats::rgb(0xffffff), LegendEntry::Mark::dot});
  if (!m.footprint.empty() || m.raster) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "Δp = %g MPa", m.footprint_level);
    legend.push_back({buf, formats::rgb(0x0072b2), LegendEntry::Mark::line});
  }
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
  // Fault segments: one path each, of the map's one segment width, with a thin dark casing below
  // them drawn as a single path so that light colours stay visible.
  for (const auto& g : m.segments) {
    std::vector<Point> pts;
    for (const auto& [x, y] : g.line) pts.push_back(at(x, y));
    c.line(pts, {.colour = formats::kInk, .width = kSegmentStroke + 1.3});
  }
  for (const auto& g : m.segments) {
    std::vector<Point> pts;
    for (const auto& [x, y] : g.line) pts.push_back(at(x, y));
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
      const double r = 6;
      c.polygon({{p.x, p.y - r}, {p.x + r * 0.87, p.y + r * 0.5}, {p.x - r * 0.87, p.y + r * 0.5}}, status_colour(w.status),
                Stroke{.colour = formats::kInk, .width = 0.8});
      c.text({p.x + 7, p.y - 4}, formats::markup_escape(w.id), {.size = 7, .bold = true, .v = VAlign::bottom});
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
  if (gpkg.empty() || !formats::has_layer(s.folder / gpkg, "fault_segments")) return {};
  MapData m;
  FigureData data;
  // Segment values at the last output time.
  std::map<std::string, std::pair<double, std::string>> value;  // id -> (value, text)
  if (has_probabilistic(s)) {
    m.probability = true;
    const RunTable t = RunTable::read(s.folder, "segment_probability.csv");
    const std::size_t id = t.column("segment_id"), date = t.column("date"), p = t.column("p_slip");
    for (std::size_t r = 0; r < t.rows(); ++r) m.date = std::max(m.date, t.text(r, date));
    for (std::size_t r = 0; r < t.rows(); ++r)
      if (t.text(r, date) == m.date) value[t.text(r, id)] = {t.number(r, p), t.text(r, p)};
    double largest = 0;
    for (const auto& entry : value) largest = std::max(largest, entry.second.first);
    m.p_max = std::min(1.0, nice_axis(0, std::max(largest, 0.01), "").hi);
    data.header = {"segment_id", "date", "p_slip"};
  } else {
    const RunTable t = RunTable::read(s.folder, segment_times_file(s));
    m.margin_unit = t.quantity_unit("margin");
    const std::size_t id = t.column("segment_id"), date = t.column("date"), mg = t.column("margin_" + m.margin_unit);
    for (std::size_t r = 0; r < t.rows(); ++r) m.date = std::max(m.date, t.text(r, date));
    m.margin_max = 0;
    for (std::size_t r = 0; r < t.rows(); ++r)
      if (t.text(r, date) == m.date) {
        value[t.text(r, id)] = {t.number(r, mg), t.text(r, mg)};
        m.margin_max = std::max(m.margin_max, t.number(r, mg));
      }
    if (!(m.margin_max > 0)) m.margin_max = 1;
    data.header = {"segment_id", "date", "margin_" + m.margin_unit};
  }
  for (auto& f : formats::read_layer(s.folder / gpkg, "fault_segments")) {
    MapSegment g;
    g.id = f.fields["segment_id"];
    if (f.parts.empty()) continue;
    g.line = f.parts.front();
    for (std::size_t i = 1; i < f.parts.size(); ++i) g.line.insert(g.line.end(), f.parts[i].begin(), f.parts[i].end());
    const auto it = value.find(g.id);
    if (it != value.end()) g.value = it->second.first;
    data.rows.push_back({g.id, m.date, it != value.end() ? it->second.second : ""});
    m.segments.push_back(std::move(g));
  }
  if (formats::has_layer(s.folder / gpkg, "wells"))
    for (auto& f : formats::read_layer(s.folder / gpkg, "wells")) {
      if (f.parts.empty() || f.parts[0].empty()) continue;
      const std::string proposed = f.fields["proposed"];
      m.wells.push_back({f.fields["well_id"], f.fields["status"], proposed == "1" || proposed == "yes" || proposed == "true",
                         f.parts[0][0].first, f.parts[0][0].second});
    }
  if (formats::has_layer(s.folder / gpkg, "earthquakes"))
    for (auto& f : formats::read_layer(s.folder / gpkg, "earthquakes")) {
      if (f.parts.empty() || f.parts[0].empty()) continue;
      m.events.push_back({f.parts[0][0].first, f.parts[0][0].second, std::atof(f.fields["magnitude"].c_str())});
    }
  // The extent: the raster's, else the data's with a margin.
  const std::string raster = pressure_raster_file(s);
  const auto threshold = s.manifest.value("parameters", nlohmann::json::object())
                             .value("catalog", nlohmann::json::object())
                             .value("footprint_threshold_Pa", 0.1e6);
  m.footprint_level = threshold / 1e6;
  if (!raster.empty() && RunTable::exists(s.folder, raster)) {
    m.raster = formats::read_raster_band(s.folder / raster, 0);
    for (double v : m.raster->values)
      if (std::isfinite(v)) m.raster_max = std::max(m.raster_max, v);
    if (!(m.raster_max > 0)) m.raster_max = 1;
    m.crs = m.raster->crs_name + (m.raster->crs_authority.empty() ? "" : " (" + m.raster->crs_authority + ")");
    m.footprint = formats::contour_lines(*m.raster, m.footprint_level);
    const auto& r = *m.raster;
    m.x0 = std::min(r.x0, r.x0 + r.width * r.dx);
    m.x1 = std::max(r.x0, r.x0 + r.width * r.dx);
    m.y0 = std::min(r.y0, r.y0 + r.height * r.dy);
    m.y1 = std::max(r.y0, r.y0 + r.height * r.dy);
  } else {
    m.x0 = m.y0 = INFINITY;
    m.x1 = m.y1 = -INFINITY;
    const auto grow = [&](double x, double y) {
      m.x0 = std::min(m.x0, x), m.x1 = std::max(m.x1, x), m.y0 = std::min(m.y0, y), m.y1 = std::max(m.y1, y);
    };
    for (const auto& g : m.segments)
      for (const auto& [x, y] : g.line) grow(x, y);
    for (const auto& w : m.wells) grow(w.x, w.y);
    const double pad = std::max({(m.x1 - m.x0) * 0.08, (m.y1 - m.y0) * 0.08, 500.0});
    m.x0 -= pad, m.x1 += pad, m.y0 -= pad, m.y1 += pad;
    m.crs = s.manifest.value("parameters", nlohmann::json::object())
                .value("scenario", nlohmann::json::object())
                .value("region", nlohmann::json::object())
                .value("crs", std::string());
  }
  Figure f;
  f.name = "area_map";
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
  f.draw = [m, title = f.title](formats::Canvas& c) { draw_map(c, m, title); };
  return {f};
}

}  // namespace slipscreen::outputs::report
