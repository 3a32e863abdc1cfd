#include "outputs/report/screen_figures.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "core/errors.hpp"
#include "core/util/civil_date.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
namespace {

using formats::Colour;
using formats::Stroke;

double days_of(const RunTable& t, std::size_t row, std::string_view column) {
  const std::string& text = t.text(row, column);
  const auto d = util::parse_iso_date(text);
  if (!d) throw InputError(std::string(column), text, "an ISO date (YYYY-MM-DD)", t.file());
  return static_cast<double>(util::days_from_civil(*d));
}

std::string number_text(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

}  // namespace

void draw_probability_curves(formats::Canvas& c, const std::string& title, const std::string& source,
                             const std::vector<std::string>& ids, const std::vector<ProbabilityCurve>& series,
                             const std::vector<double>& levels, double x0, double x1, double ymax) {
  FigurePage page(c, formats::markup_escape(title), source);
  std::vector<LegendEntry> legend;
  append_line_legend(legend, ids);
  if (!levels.empty()) legend.push_back({"threshold", formats::kInk, LegendEntry::Mark::line});
  page.legend_right(legend, "segment");
  Plot plot(c, page.body(), {x0, x1 > x0 ? x1 : x0 + 365, "date", AxisKind::date}, nice_axis(0, ymax, "P(slip by t)"));
  plot.axes();
  for (std::size_t i = 0; i < series.size(); ++i)
    plot.band(series[i].x, series[i].lo, series[i].hi, category_colour(i).with_alpha(0.18));
  for (double v : levels) plot.hline(v, {.colour = formats::kInk, .width = 0.8, .dash = {4, 3}}, "P = " + number_text(v));
  for (std::size_t i = 0; i < series.size(); ++i) {
    plot.line(series[i].x, series[i].p, {.colour = category_colour(i), .width = 1.5});
    plot.dots(series[i].x, series[i].p, 1.8, category_colour(i));
  }
  page.footer();
}

std::vector<Figure> slip_probability_figures(const ReportSource& s) {
  if (!has_probabilistic(s)) return {};
  const TopSegments top = top_segments(s, s.top_segments);
  if (top.ids.empty()) return {};
  const RunTable& t = s.table("segment_probability.csv");
  std::vector<ProbabilityCurve> series(top.ids.size());
  FigureData data{{"segment_id", "date", "p_slip", "p_slip_ci_low", "p_slip_ci_high"}, {}};
  double x0 = INFINITY, x1 = -INFINITY, ymax = 0;
  const std::size_t id_col = t.column("segment_id");
  for (std::size_t i = 0; i < top.ids.size(); ++i)
    for (std::size_t r = 0; r < t.rows(); ++r) {
      if (t.text(r, id_col) != top.ids[i]) continue;
      auto& se = series[i];
      se.x.push_back(days_of(t, r, "date"));
      se.p.push_back(t.number(r, t.column("p_slip")));
      se.lo.push_back(t.number(r, t.column("p_slip_ci_low")));
      se.hi.push_back(t.number(r, t.column("p_slip_ci_high")));
      x0 = std::min(x0, se.x.back());
      x1 = std::max(x1, se.x.back());
      ymax = std::max(ymax, se.hi.back());
      data.rows.push_back({top.ids[i], t.text(r, "date"), t.text(r, "p_slip"), t.text(r, "p_slip_ci_low"),
                           t.text(r, "p_slip_ci_high")});
    }
  if (data.rows.empty()) return {};
  const std::vector<double> levels = thresholds(s);
  for (double v : levels) ymax = std::max(ymax, v);
  ymax = std::min(1.0, std::max(0.05, ymax * 1.1));

  Figure f;
  f.name = "slip_probability";
  f.title = "P(slip by t) of the " + std::to_string(top.ids.size()) + " segments most likely to slip";
  f.reading = "Each line is a segment's probability of having slipped by that date, the shaded band its 95 % "
              "Wilson interval; dashed lines are the scenario's thresholds.";
  f.data = data;
  f.draw = [series, ids = top.ids, levels, x0, x1, ymax, title = f.title](formats::Canvas& c) {
    draw_probability_curves(c, title, "segment_probability.csv", ids, series, levels, x0, x1, ymax);
  };
  return {f};
}

std::vector<Figure> pressure_history_figures(const ReportSource& s) {
  const std::string file = pressure_history_file(s);
  if (!RunTable::exists(s.folder, file)) return {};
  const RunTable& t = s.table(file);
  const std::string u = t.quantity_unit("dp");
  const double to_si = suffix_factor(u).value_or(1.0);
  const std::size_t rank_col = t.column("rank"), id_col = t.column("segment_id"), well_col = t.column("well_id");
  const std::size_t dp_col = t.column("dp_" + u), date_col = t.column("date");
  const RunTable& seg = s.table(segments_file(s));
  const std::size_t shown = std::min<std::size_t>(3, s.top_segments);

  std::vector<Figure> figures;
  for (std::size_t rank = 1; rank <= shown; ++rank) {
    const std::string rank_text = std::to_string(rank);
    std::string id;
    std::vector<std::string> dates, wells;
    std::map<std::string, std::size_t> date_index, well_index;
    std::vector<std::size_t> rows;
    for (std::size_t r = 0; r < t.rows(); ++r) {
      if (t.text(r, rank_col) != rank_text) continue;
      rows.push_back(r);
      id = t.text(r, id_col);
      if (date_index.emplace(t.text(r, date_col), dates.size()).second) dates.push_back(t.text(r, date_col));
      if (well_index.emplace(t.text(r, well_col), wells.size()).second) wells.push_back(t.text(r, well_col));
    }
    if (rows.empty()) break;
    std::vector<double> x;
    for (std::size_t r : rows)
      if (x.size() < dates.size() && t.text(r, date_col) == dates[x.size()]) x.push_back(days_of(t, r, "date"));
    // values[w][k] in the table's unit
    std::vector<std::vector<double>> values(wells.size(), std::vector<double>(dates.size(), 0.0));
    FigureData data{{"rank", "segment_id", "date", "well_id", "dp_" + u}, {}};
    for (std::size_t r : rows) {
      values[well_index[t.text(r, well_col)]][date_index[t.text(r, date_col)]] = t.number(r, dp_col);
      data.rows.push_back({rank_text, id, t.text(r, date_col), t.text(r, well_col), t.text(r, dp_col)});
    }
    std::vector<double> total(dates.size(), 0.0);
    double peak = 0;
    for (std::size_t k = 0; k < dates.size(); ++k) {
      for (const auto& v : values) total[k] += v[k];
      peak = std::max(peak, total[k]);
    }
    // The (up to seven) wells with the largest part at the last time get their own band, in the
    // table's well order; the rest one band together.
    std::vector<std::size_t> by_part(wells.size());
    for (std::size_t w = 0; w < wells.size(); ++w) by_part[w] = w;
    std::stable_sort(by_part.begin(), by_part.end(),
                     [&](std::size_t a, std::size_t b) { return values[a].back() > values[b].back(); });
    std::vector<bool> own(wells.size(), false);
    for (std::size_t i = 0; i < by_part.size() && i < 7; ++i)
      own[by_part[i]] = values[by_part[i]].back() >= 0.02 * total.back() && values[by_part[i]].back() > 0;
    std::vector<std::pair<std::string, std::vector<double>>> bands;
    std::vector<double> rest(dates.size(), 0.0);
    bool any_rest = false;
    for (std::size_t w = 0; w < wells.size(); ++w) {
      if (own[w]) {
        bands.emplace_back(wells[w], values[w]);
      } else {
        for (std::size_t k = 0; k < dates.size(); ++k) rest[k] += values[w][k];
        any_rest = any_rest || *std::max_element(values[w].begin(), values[w].end()) > 0;
      }
    }
    if (any_rest) bands.emplace_back("other wells", rest);
    const auto sr = seg.find_row("segment_id", id);
    const double dp_crit = sr ? seg.si(*sr, "dp_crit") / to_si : NAN;
    const bool crit_shown = std::isfinite(dp_crit) && dp_crit > 0 && dp_crit <= 2.0 * std::max(peak, 1e-300);
    const double ytop = std::max({peak, crit_shown ? dp_crit : 0.0, 1e-6}) * 1.08;

    Figure f;
    f.name = "pressure_history_" + rank_text;
    f.title = "Δp by well at segment " + id + " (closest to failure: " + rank_text + ")";
    f.reading = "The stacked bands are each well's part of the modelled pore-pressure change at the segment, month "
                "by month; their top edge is the segment's Δp. The dashed line is the segment's Δp_crit.";
    f.data = std::move(data);
    std::string subtitle = "segment_pressure_history.csv, segments.csv";
    if (std::isfinite(dp_crit) && !crit_shown) {
      char buf[96];
      std::snprintf(buf, sizeof buf, "; Δp_crit = %.3g %s lies above the plotted range", dp_crit, u.c_str());
      subtitle += buf;
    }
    f.draw = [x, bands, dp_crit, crit_shown, ytop, u, subtitle, title = f.title](formats::Canvas& c) {
      FigurePage page(c, formats::markup_escape(title), formats::markup_escape(subtitle));
      std::vector<LegendEntry> legend;
      for (std::size_t i = 0; i < bands.size(); ++i)
        legend.push_back({formats::markup_escape(bands[i].first),
                          bands[i].first == "other wells" ? formats::rgb(0xb0b7bf) : category_colour(i),
                          LegendEntry::Mark::band});
      if (crit_shown) legend.push_back({"Δp_crit (dashed)", formats::kInk, LegendEntry::Mark::line});
      page.legend_right(legend, "well");
      const double x1 = x.size() > 1 ? x.back() : (x.empty() ? 1.0 : x.front() + 365);
      Plot plot(c, page.body(), {x.empty() ? 0.0 : x.front(), x1, "date", AxisKind::date},
                nice_axis(0, ytop, "Δp [" + formats::markup_escape(u) + "]"));
      plot.axes();
      std::vector<double> base(x.size(), 0.0);
      for (std::size_t i = 0; i < bands.size(); ++i) {
        std::vector<double> top(x.size());
        for (std::size_t k = 0; k < x.size(); ++k) top[k] = base[k] + bands[i].second[k];
        plot.band(x, base, top, bands[i].first == "other wells" ? formats::rgb(0xb0b7bf) : category_colour(i).with_alpha(0.85));
        base = std::move(top);
      }
      plot.line(x, base, {.colour = formats::kInk, .width = 0.8});
      if (crit_shown) plot.hline(dp_crit, {.colour = formats::kInk, .width = 1.0, .dash = {5, 3}});
      page.footer();
    };
    figures.push_back(std::move(f));
  }
  return figures;
}

}  // namespace slipscreen::outputs::report
