#include "outputs/report/decision_figures.hpp"

#include <algorithm>
#include <cmath>

#include "core/util/number_text.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {

std::vector<Figure> capacity_curve_figures(const ReportSource& s) {
  const nlohmann::json* cap = capacity_block(s);
  const std::string file = capacity_curve_file(s);
  if (cap == nullptr || !RunTable::exists(s.folder, file)) return {};
  const RunTable& t = s.table(file);
  const std::size_t f_col = t.column("f"), max_col = t.column("p_slip_max");
  // The segments with their own column (the binding ones first, docs/outputs.md).
  std::vector<std::string> ids;
  std::vector<std::size_t> cols;
  for (std::size_t i = 0; i < t.header().size(); ++i) {
    const std::string& h = t.header()[i];
    if (h.rfind("p_slip_", 0) == 0 && h != "p_slip_max" && h != "p_slip_max_segment_id") {
      ids.push_back(h.substr(7));
      cols.push_back(i);
    }
  }
  std::vector<double> f, pmax;
  std::vector<std::vector<double>> p(ids.size());
  FigureData data{t.header(), {}};
  double ymax = 0;
  for (std::size_t r = 0; r < t.rows(); ++r) {
    f.push_back(t.number(r, f_col));
    pmax.push_back(t.number(r, max_col));
    ymax = std::max(ymax, pmax.back());
    for (std::size_t i = 0; i < ids.size(); ++i) p[i].push_back(t.number(r, cols[i]));
    std::vector<std::string> row;
    for (std::size_t c = 0; c < t.header().size(); ++c) row.push_back(t.text(r, c));
    data.rows.push_back(std::move(row));
  }
  if (f.empty()) return {};
  // Each threshold's allowed factor (upper end of the Wilson interval, as reported).
  struct Mark {
    double f, p;
  };
  std::vector<double> levels;
  std::vector<Mark> allowed;
  for (const auto& th : cap->value("thresholds", nlohmann::json::array())) {
    const double level = th.value("threshold", NAN);
    if (!std::isfinite(level)) continue;
    levels.push_back(level);
    ymax = std::max(ymax, level);
    const auto& w = th.value("wilson_upper", nlohmann::json::object());
    if (w.value("exceeded_up_to_f_max", false) && w.contains("f_allowed") && w["f_allowed"].is_number())
      allowed.push_back({w["f_allowed"].get<double>(), level});
  }
  ymax = std::min(1.0, std::max(0.05, ymax * 1.1));
  std::string wells;
  for (const auto& w : cap->value("wells", nlohmann::json::array()))
    if (w.is_string()) wells += (wells.empty() ? "" : ", ") + w.get<std::string>();

  Figure fig;
  fig.name = "capacity_curve";
  fig.title = "P(slip by " + cap->value("horizon", std::string("the last date")) + " | f) against the factor f on the " +
              "planned rates of " + wells;
  fig.reading = "The thick line is the largest P(slip) over the fault segments, the thin lines the segments that "
                "bind an answer; dashed lines are the thresholds, each dot the allowed factor on its threshold "
                "(upper end of the Wilson interval), the dotted vertical line f = 1, the plan.";
  fig.data = std::move(data);
  fig.draw = [f, pmax, p, ids, levels, allowed, ymax, title = fig.title](formats::Canvas& c) {
    FigurePage page(c, formats::markup_escape(title), "capacity_curve.csv, manifest.json (capacity)");
    std::vector<LegendEntry> legend{{"largest", formats::kInk, LegendEntry::Mark::line}};
    append_line_legend(legend, ids);
    if (!levels.empty()) legend.push_back({"threshold", formats::kInk, LegendEntry::Mark::line});
    if (!allowed.empty()) legend.push_back({"allowed f", formats::kInk, LegendEntry::Mark::dot});
    page.legend_right(legend, "segment");
    Plot plot(c, page.body(), {f.front(), f.back() > f.front() ? f.back() : f.front() + 1, "factor f on the plan"},
              nice_axis(0, ymax, "P(slip by T | f)"));
    plot.axes();
    for (double v : levels)
      plot.hline(v, {.colour = formats::kInk, .width = 0.8, .dash = {4, 3}}, "P = " + util::number_text(v, 3));
    plot.vline(1.0, {.colour = formats::kInk, .width = 0.8, .dash = {1, 2}}, "plan");
    for (std::size_t i = 0; i < ids.size(); ++i) plot.line(f, p[i], {.colour = category_colour(i), .width = 1.1});
    plot.line(f, pmax, {.colour = formats::kInk, .width = 2.0});
    for (const auto& m : allowed)
      plot.dots({m.f}, {m.p}, 3.0, formats::kPaper, formats::Stroke{.colour = formats::kInk, .width = 1.4});
    page.footer();
  };
  return {fig};
}

}  // namespace slipscreen::outputs::report
