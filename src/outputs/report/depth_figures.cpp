#include "outputs/report/depth_figures.hpp"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <map>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"
#include "outputs/report/screen_figures.hpp"

namespace slipscreen::outputs::report {
namespace {

std::string beside_segment_times(const ReportSource& s, const char* name) {
  return (std::filesystem::path(segment_times_file(s)).parent_path() / name).generic_string();
}

// The P(slip) thresholds of the screen in depth (manifest: parameters.depth_probability).
std::vector<double> depth_thresholds(const ReportSource& s) {
  std::vector<double> out;
  const auto& t = s.manifest.value("parameters", nlohmann::json::object())
                      .value("depth_probability", nlohmann::json::object())
                      .value("uncertainty", nlohmann::json::object())
                      .value("thresholds", nlohmann::json::array());
  for (const auto& v : t)
    if (v.is_number()) out.push_back(v.get<double>());
  return out;
}

// One line per top segment: x (days since 1970) and y, from the rows of `t` with its id.
struct Series {
  std::vector<double> x, y, lo, hi;
};

}  // namespace

std::string depth_table_file(const ReportSource& s) { return beside_segment_times(s, "fault_depth.csv"); }
std::string depth_probability_file(const ReportSource& s) {
  return beside_segment_times(s, "fault_depth_probability.csv");
}

DepthTop depth_top_segments(const ReportSource& s, std::size_t n) {
  DepthTop top;
  if (!RunTable::exists(s.folder, depth_table_file(s))) return top;
  const RunTable& t = s.table(depth_table_file(s));
  const std::size_t id_col = t.column("segment_id"), fault_col = t.column("fault_id");
  const std::size_t margin_col = t.quantity_column("coulomb_margin").first;
  // every segment in the table's order, with its row of the smallest margin
  std::vector<DepthTopSegment> all;
  std::map<std::string, std::size_t> index;
  std::vector<double> closest;
  for (std::size_t r = 0; r < t.rows(); ++r) {
    const auto [it, added] = index.emplace(t.text(r, id_col), all.size());
    const double m = t.number(r, margin_col);
    if (added) {
      all.push_back({t.text(r, id_col), t.text(r, fault_col), r, 0});
      closest.push_back(m);
    } else if (m < closest[it->second]) {
      closest[it->second] = m;
      all[it->second].closest_row = r;
    }
  }
  std::vector<std::size_t> order(all.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  const std::string pfile = depth_probability_file(s);
  if (RunTable::exists(s.folder, pfile)) {
    top.probabilistic = true;
    const RunTable& p = s.table(pfile);
    const std::size_t pid = p.column("segment_id"), date = p.column("date"), pcol = p.column("p_slip");
    std::string last;
    for (std::size_t r = 0; r < p.rows(); ++r) last = std::max(last, p.text(r, date));  // ISO dates sort as text
    std::vector<double> final_p(all.size(), -1.0);
    for (std::size_t r = 0; r < p.rows(); ++r) {
      if (p.text(r, date) != last) continue;
      const auto it = index.find(p.text(r, pid));
      if (it == index.end())
        throw InputError("segment_id", p.text(r, pid), "a segment of " + t.file(), p.file() + ":" + std::to_string(r + 2));
      final_p[it->second] = p.number(r, pcol);
      all[it->second].probability_row = r;
    }
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return final_p[a] > final_p[b]; });
  } else {
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return closest[a] < closest[b]; });
  }
  for (std::size_t i = 0; i < order.size() && i < n; ++i) top.segments.push_back(all[order[i]]);
  return top;
}

DepthTable depth_table(const ReportSource& s, std::size_t n) {
  DepthTable out;
  const DepthTop top = depth_top_segments(s, n);
  if (top.segments.empty()) return out;
  const RunTable& t = s.table(depth_table_file(s));
  out.probabilistic = top.probabilistic;
  const RunTable* p = top.probabilistic ? &s.table(depth_probability_file(s)) : nullptr;
  if (p) {
    out.last_date = p->text(top.segments.front().probability_row, "date");
    out.realizations = p->text(top.segments.front().probability_row, "realizations");
  }
  // the crossing's depth and ΔCFF (tables written before they were added lack the two columns)
  const bool crossing_values = t.has_quantity("first_crossing_depth") && t.has_quantity("first_crossing_dcff");
  const std::string pu = t.quantity_unit("coulomb_margin"), lu = t.quantity_unit("depth");
  out.header = {"segment", "fault"};
  if (p) out.header.push_back("P(slip) (interval)");
  out.header.insert(out.header.end(), {"first crossing", "depth [" + lu + "]", "ΔCFF [" + pu + "]",
                                       "closest margin [" + pu + "]"});
  const auto cell = [](const std::string& v) { return v.empty() ? std::string("-") : v; };
  for (const auto& g : top.segments) {
    const std::size_t r = g.closest_row;
    std::vector<std::string> row{g.segment_id, g.fault_id};
    if (p) {
      const std::size_t q = g.probability_row;
      row.push_back(p->text(q, "p_slip") + " (" + p->text(q, "p_slip_ci_low") + " – " + p->text(q, "p_slip_ci_high") + ")");
    }
    row.push_back(cell(t.text(r, "first_crossing_date")));
    row.push_back(crossing_values ? cell(t.text(r, "first_crossing_depth_" + t.quantity_unit("first_crossing_depth"))) : "-");
    row.push_back(crossing_values ? cell(t.text(r, "first_crossing_dcff_" + t.quantity_unit("first_crossing_dcff"))) : "-");
    row.push_back(t.text(r, "coulomb_margin_" + pu));
    out.rows.push_back(std::move(row));
  }
  return out;
}

std::vector<Figure> depth_figures(const ReportSource& s) {
  const DepthTop top = depth_top_segments(s, s.top_segments);
  if (top.segments.empty()) return {};
  std::vector<Figure> figures;
  std::vector<std::string> ids;
  for (const auto& g : top.segments) ids.push_back(g.segment_id);

  {  // the Coulomb margin at each output date
    const RunTable& t = s.table(depth_table_file(s));
    const std::string unit = t.quantity_unit("coulomb_margin");
    const std::size_t id_col = t.column("segment_id"), date_col = t.column("date");
    const std::size_t m_col = t.column("coulomb_margin_" + unit), d_col = t.column("depth_" + t.quantity_unit("depth"));
    std::vector<Series> series(ids.size());
    FigureData data{{"segment_id", "date", t.header()[d_col], t.header()[m_col]}, {}};
    double x0 = INFINITY, x1 = -INFINITY, y0 = 0, y1 = 0;
    for (std::size_t i = 0; i < ids.size(); ++i)
      for (std::size_t r = 0; r < t.rows(); ++r) {
        if (t.text(r, id_col) != ids[i]) continue;
        series[i].x.push_back(table_days(t, r, "date"));
        series[i].y.push_back(t.number(r, m_col));
        x0 = std::min(x0, series[i].x.back()), x1 = std::max(x1, series[i].x.back());
        y0 = std::min(y0, series[i].y.back()), y1 = std::max(y1, series[i].y.back());
        data.rows.push_back({ids[i], t.text(r, date_col), t.text(r, d_col), t.text(r, m_col)});
      }
    Figure f;
    f.name = "depth_coulomb_margin";
    f.title = "Coulomb margin in depth of the " + std::to_string(ids.size()) + " segments closest to failure";
    f.reading = "Each line is a segment's margin μΔp_crit − ΔCFF at its check point in depth closest to failure on "
                "each output date (3-D poroelastic model); at or below the zero line the segment has reached Coulomb "
                "failure.";
    f.data = std::move(data);
    f.draw = [series, ids, x0, x1, y0, y1, unit, title = f.title](formats::Canvas& c) {
      FigurePage page(c, formats::markup_escape(title), "fault_depth.csv");
      std::vector<LegendEntry> legend;
      append_line_legend(legend, ids);
      page.legend_right(legend, "segment");
      Plot plot(c, page.body(), {x0, x1 > x0 ? x1 : x0 + 365, "date", AxisKind::date},
                nice_axis(y0, y1 > y0 ? y1 : y0 + 1, "μΔp<sub>crit</sub> − ΔCFF [" + formats::markup_escape(unit) + "]"));
      plot.axes();
      plot.hline(0.0, {.colour = formats::kInk, .width = 0.8, .dash = {4, 3}}, "failure");
      for (std::size_t i = 0; i < series.size(); ++i) {
        plot.line(series[i].x, series[i].y, {.colour = category_colour(i), .width = 1.5});
        plot.dots(series[i].x, series[i].y, 1.8, category_colour(i));
      }
      page.footer();
    };
    figures.push_back(std::move(f));
  }

  if (top.probabilistic) {  // P(slip by t) with its Wilson interval
    const RunTable& t = s.table(depth_probability_file(s));
    const std::size_t id_col = t.column("segment_id");
    const std::size_t p_col = t.column("p_slip"), lo_col = t.column("p_slip_ci_low"), hi_col = t.column("p_slip_ci_high");
    std::vector<ProbabilityCurve> series(ids.size());
    FigureData data{{"segment_id", "date", "p_slip", "p_slip_ci_low", "p_slip_ci_high"}, {}};
    double x0 = INFINITY, x1 = -INFINITY, ymax = 0;
    for (std::size_t i = 0; i < ids.size(); ++i)
      for (std::size_t r = 0; r < t.rows(); ++r) {
        if (t.text(r, id_col) != ids[i]) continue;
        auto& se = series[i];
        se.x.push_back(table_days(t, r, "date"));
        se.p.push_back(t.number(r, p_col));
        se.lo.push_back(t.number(r, lo_col));
        se.hi.push_back(t.number(r, hi_col));
        x0 = std::min(x0, se.x.back()), x1 = std::max(x1, se.x.back());
        ymax = std::max(ymax, se.hi.back());
        data.rows.push_back({ids[i], t.text(r, "date"), t.text(r, p_col), t.text(r, lo_col), t.text(r, hi_col)});
      }
    const std::vector<double> levels = depth_thresholds(s);
    for (double v : levels) ymax = std::max(ymax, v);
    ymax = std::min(1.0, std::max(0.05, ymax * 1.1));
    Figure f;
    f.name = "depth_slip_probability";
    f.title = "P(slip by t) in depth of the " + std::to_string(ids.size()) + " segments most likely to slip";
    f.reading = "Each line is the share of the realizations of the 3-D poroelastic model in which some check point "
                "of the segment in depth has reached Coulomb failure by that date, the shaded band its Wilson "
                "interval; dashed lines are the scenario's thresholds.";
    f.data = std::move(data);
    f.draw = [series, ids, levels, x0, x1, ymax, title = f.title](formats::Canvas& c) {
      draw_probability_curves(c, title, "fault_depth_probability.csv", ids, series, levels, x0, x1, ymax);
    };
    figures.push_back(std::move(f));
  }
  return figures;
}

Figure model_comparison_figure(const RunTable& t) {
  static const char* const kColumns[] = {"time_days", "dp_theis", "dp_leaky", "dp_3d",
                                         "dcff_theis", "dcff_leaky", "dcff_3d"};
  std::vector<std::size_t> cols;
  for (const char* c : kColumns) cols.push_back(t.column(c));
  // values[c][row]; a value ≤ 0 cannot be drawn on the log axes and breaks its line
  std::vector<std::vector<double>> v(cols.size());
  FigureData data{{std::begin(kColumns), std::end(kColumns)}, {}};
  for (std::size_t r = 0; r < t.rows(); ++r) {
    std::vector<std::string> row;
    for (std::size_t c = 0; c < cols.size(); ++c) {
      v[c].push_back(t.number(r, cols[c]));
      row.push_back(t.text(r, cols[c]));
    }
    data.rows.push_back(std::move(row));
  }
  if (t.rows() < 2) throw InputError("rows", std::to_string(t.rows()), "at least two times", t.file());
  Figure f;
  f.name = "model_comparison";
  f.title = "Theis, leaky and 3-D poroelastic models at a fault 5 km away and 1 km below the injected layer";
  f.reading = "Top: the pore-pressure change Δp; bottom: the Coulomb stress change ΔCFF, μΔp for the layer models "
              "(Theis, leaky) and Δτ − μ(Δσn − Δp) at the fault itself for the 3-D model. Fictional case of "
              "docs/physics.md; values below 1e-6 MPa run off the axes.";
  f.height = 560;
  f.data = std::move(data);
  f.draw = [v, title = f.title](formats::Canvas& c) {
    FigurePage page(c, formats::markup_escape(title), "docs/physics/model_comparison.csv");
    const char* const names[] = {"Theis", "leaky (Hantush &amp; Jacob)", "3-D (Rudnicki)"};
    std::vector<LegendEntry> legend;
    for (std::size_t i = 0; i < 3; ++i) legend.push_back({names[i], category_colour(i), LegendEntry::Mark::line});
    page.legend_right(legend, "model");
    const formats::Box body = page.body();
    const double gap = 10, half = (body.h - gap) / 2;
    const Axis x = nice_axis(v[0].front(), v[0].back(), "time since injection began [days]", AxisKind::log10);
    const char* const labels[] = {"Δp [MPa]", "ΔCFF [MPa]"};
    for (std::size_t panel = 0; panel < 2; ++panel) {
      const formats::Box area{body.x, body.y + panel * (half + gap), body.w, half};
      Plot plot(c, area, x, {1e-6, 1.0, labels[panel], AxisKind::log10});
      plot.axes();
      for (std::size_t m = 0; m < 3; ++m)
        plot.line(v[0], v[1 + 3 * panel + m], {.colour = category_colour(m), .width = m == 2 ? 1.8 : 1.3,
                                                .dash = m == 1 ? std::vector<double>{5, 3} : std::vector<double>{}});
    }
    page.footer();
  };
  return f;
}

}  // namespace slipscreen::outputs::report
