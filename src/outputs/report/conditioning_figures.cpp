// The figures of a conditioned run; see conditioning_figures.hpp.
#include "outputs/report/conditioning_figures.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <numeric>
#include <set>

#include "outputs/report/colour_ramp.hpp"
#include "outputs/report/figure_support.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
namespace {

using formats::Canvas;
using formats::Colour;

// Prior in grey, conditioned in the first category colour (the same pair in both figures).
constexpr Colour kPrior = formats::rgb(0x8a939c);
Colour conditioned_colour() { return category_colour(0); }

// The modelled and observed columns of observation_fit.csv, in the order drawn.
const char* const kFitColumns[] = {"observed_dp", "sigma",           "prior_p05",      "prior_p50",
                                   "prior_p95",   "conditioned_p05", "conditioned_p50", "conditioned_p95"};
constexpr std::size_t kFitValues = std::size(kFitColumns);

// One observation point's rows of observation_fit.csv in date order, values in the table's unit.
struct FitSeries {
  std::string id;
  std::vector<double> days;
  std::vector<std::array<double, kFitValues>> v;  // kFitColumns
  FigureData data;
};

Figure observation_fit_figure(FitSeries s, const std::string& name, const std::string& unit) {
  double y0 = 0, y1 = 0;
  for (const auto& row : s.v) {
    y0 = std::min({y0, row[0] - row[1], row[2], row[5]});
    y1 = std::max({y1, row[0] + row[1], row[4], row[7]});
  }
  const double x0 = s.days.front() - 90, x1 = s.days.back() + 90;
  Figure f;
  f.name = name;
  f.title = "Observed and modelled pressure change at " + s.id;
  f.reading = "Grey: the modelled Δp under the prior (P5–P95 band, dashed P50); coloured: the same weighted by the "
              "observations (conditioned). Dots: the observed Δp with ±σ (measurement and model error) bars. "
              "Conditioning works where the coloured band runs through the dots.";
  f.data = s.data;
  f.draw = [s = std::move(s), unit, x0, x1, y0, y1, title = f.title](Canvas& c) {
    FigurePage page(c, formats::markup_escape(title), "observation_fit.csv");
    page.legend_right({{"prior P5–P95", kPrior.with_alpha(0.3), LegendEntry::Mark::band},
                       {"prior P50", kPrior, LegendEntry::Mark::line},
                       {"conditioned P5–P95", conditioned_colour().with_alpha(0.3), LegendEntry::Mark::band},
                       {"conditioned P50", conditioned_colour(), LegendEntry::Mark::line},
                       {"observed ± σ", formats::kInk, LegendEntry::Mark::dot}},
                      "Δp");
    Plot plot(c, page.body(), {x0, x1, "date", AxisKind::date},
              nice_axis(y0, y1 > y0 ? y1 : y0 + 1, "Δp [" + formats::markup_escape(unit) + "]"));
    plot.axes();
    const auto column = [&](std::size_t k) {
      std::vector<double> out;
      for (const auto& row : s.v) out.push_back(row[k]);
      return out;
    };
    plot.band(s.days, column(2), column(4), kPrior.with_alpha(0.3));
    plot.line(s.days, column(3), {.colour = kPrior, .width = 1.2, .dash = {4, 3}});
    plot.band(s.days, column(5), column(7), conditioned_colour().with_alpha(0.3));
    plot.line(s.days, column(6), {.colour = conditioned_colour(), .width = 1.4});
    for (std::size_t i = 0; i < s.days.size(); ++i)
      plot.line({s.days[i], s.days[i]}, {s.v[i][0] - s.v[i][1], s.v[i][0] + s.v[i][1]}, {.width = 0.9});
    plot.dots(s.days, column(0), 2.2, formats::kInk);
    page.footer();
  };
  return f;
}

std::vector<Figure> observation_fit_figures(const ReportSource& src) {
  if (!RunTable::exists(src.folder, "observation_fit.csv")) return {};
  const RunTable& t = src.table("observation_fit.csv");
  if (t.rows() == 0) return {};
  const DisplayUnit u = unit_of(t, "observed_dp");
  std::vector<std::string> header{"observation_id", "date"};
  for (const char* name : kFitColumns) header.push_back(std::string(name) + "_" + u.suffix);
  std::vector<FitSeries> series;
  for (std::size_t r = 0; r < t.rows(); ++r) {
    const std::string& id = t.text(r, "observation_id");
    auto it = std::find_if(series.begin(), series.end(), [&](const FitSeries& s) { return s.id == id; });
    if (it == series.end()) it = series.insert(series.end(), FitSeries{id, {}, {}, {header, {}}});
    it->days.push_back(table_days(t, r, "date"));
    std::array<double, kFitValues> v{};
    std::vector<std::string> row{id, t.text(r, "date")};
    for (std::size_t k = 0; k < kFitValues; ++k) {
      v[k] = u.shown(t.si(r, kFitColumns[k]));
      row.push_back(t.text(r, header[k + 2]));
    }
    it->v.push_back(v);
    it->data.rows.push_back(std::move(row));
  }
  std::vector<Figure> out;
  std::set<std::string> names;
  for (auto& s : series) {
    std::vector<std::size_t> order(s.days.size());  // date order (the table's order within a point)
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return s.days[a] < s.days[b]; });
    FitSeries sorted{s.id, {}, {}, {s.data.header, {}}};
    for (std::size_t i : order) {
      sorted.days.push_back(s.days[i]);
      sorted.v.push_back(s.v[i]);
      sorted.data.rows.push_back(s.data.rows[i]);
    }
    std::string name = observation_figure_name(s.id);
    for (int k = 2; names.count(name); ++k) name = observation_figure_name(s.id) + "_" + std::to_string(k);
    names.insert(name);
    out.push_back(observation_fit_figure(std::move(sorted), name, u.suffix));
  }
  return out;
}

// One uncertain input: its row of posterior_inputs.csv and the drawn positions on the prior's
// P5–P95 scale, (v − prior P5) / (prior P95 − prior P5).
struct InputRow {
  std::string input;
  std::array<double, 6> scaled{};  // prior P5, P50, P95, posterior P5, P50, P95
};

std::vector<Figure> posterior_inputs_figures(const ReportSource& src) {
  if (!RunTable::exists(src.folder, "posterior_inputs.csv")) return {};
  const RunTable& t = src.table("posterior_inputs.csv");
  const char* const cols[] = {"prior_p05", "prior_p50", "prior_p95", "posterior_p05", "posterior_p50", "posterior_p95"};
  FigureData data{{"input", "unit", "prior_p05", "prior_p50", "prior_p95", "posterior_p05", "posterior_p50",
                   "posterior_p95", "prior_p05_scaled", "prior_p50_scaled", "prior_p95_scaled", "posterior_p05_scaled",
                   "posterior_p50_scaled", "posterior_p95_scaled"},
                  {}};
  std::vector<InputRow> rows;
  double lo = -0.1, hi = 1.1;
  for (std::size_t r = 0; r < t.rows(); ++r) {
    std::array<double, 6> v{};
    for (std::size_t k = 0; k < 6; ++k) v[k] = t.number(r, cols[k]);
    const double width = v[2] - v[0];
    if (!(width > 0.0) || !std::isfinite(width)) continue;  // no prior spread: nothing to compare
    InputRow row{t.text(r, "input"), {}};
    std::vector<std::string> d{row.input, t.text(r, "unit")};
    for (std::size_t k = 0; k < 6; ++k) d.push_back(t.text(r, cols[k]));
    for (std::size_t k = 0; k < 6; ++k) {
      row.scaled[k] = (v[k] - v[0]) / width;
      lo = std::min(lo, row.scaled[k]);
      hi = std::max(hi, row.scaled[k]);
      d.push_back(data_number(row.scaled[k]));
    }
    rows.push_back(row);
    data.rows.push_back(std::move(d));
  }
  if (rows.empty()) return {};
  Figure f;
  f.name = "posterior_inputs";
  f.title = "Prior and posterior of the uncertain inputs";
  f.reading = "For each uncertain input, the grey bar is the prior's P5–P95 interval and the coloured bar the "
              "posterior's (weighted by the observations), dots at the P50; on a scale where the prior's P5 is 0 and "
              "its P95 is 1. A shorter coloured bar: the data narrowed the input; a shifted one: they moved it. "
              "Values in their units: posterior_inputs.csv.";
  f.height = std::max(kFigureHeight, 110.0 + 26.0 * static_cast<double>(rows.size()));
  f.data = data;
  const Axis scale = nice_axis(lo, hi, "position in the prior's P5–P95 interval (0: prior P5, 1: prior P95)");
  f.draw = [rows, scale, title = f.title](Canvas& c) {
    FigurePage page(c, formats::markup_escape(title), "posterior_inputs.csv");
    page.legend_right({{"prior P5–P95", kPrior, LegendEntry::Mark::line},
                       {"posterior P5–P95", conditioned_colour(), LegendEntry::Mark::line},
                       {"P50", formats::kInk, LegendEntry::Mark::dot}},
                      "interval");
    // Input names at the left of the frame (as the sensitivity figure), the scale along x.
    const formats::TextStyle name_style{.size = 7.5, .h = formats::HAlign::right, .v = formats::VAlign::middle};
    double name_w = 0;
    for (const auto& r : rows) name_w = std::max(name_w, c.measure(formats::markup_escape(r.input), name_style).w);
    formats::Box area = page.body();
    const double shift = std::max(0.0, name_w + 8 - 48);  // Plot keeps about 48 pt for y tick labels
    area.x += shift;
    area.w -= shift;
    Plot plot(c, area, scale, {0, static_cast<double>(rows.size()), ""});
    const formats::Box fr = plot.frame();
    for (const auto& tk : linear_ticks(scale.lo, scale.hi, 8)) {
      const double x = plot.page_x(tk.value);
      c.line({{x, fr.y}, {x, fr.bottom()}}, {.colour = formats::rgb(0xd8dde3), .width = 0.5});
      c.text({x, fr.bottom() + 4}, tk.label, {.size = 7.5, .h = formats::HAlign::centre, .v = formats::VAlign::top});
    }
    c.text({fr.x + fr.w / 2, area.bottom()}, formats::markup_escape(scale.label),
           {.size = 8.5, .h = formats::HAlign::centre, .v = formats::VAlign::bottom});
    for (double edge : {0.0, 1.0})
      c.line({{plot.page_x(edge), fr.y}, {plot.page_x(edge), fr.bottom()}}, {.colour = kPrior, .width = 0.6, .dash = {3, 3}});
    const double band = fr.h / static_cast<double>(rows.size());
    for (std::size_t k = 0; k < rows.size(); ++k) {
      const double top = fr.y + band * static_cast<double>(k);
      c.text({fr.x - 5, top + band / 2}, formats::markup_escape(rows[k].input), name_style);
      if (k > 0) c.line({{fr.x, top}, {fr.right(), top}}, {.colour = formats::rgb(0xeef1f4), .width = 0.5});
      const auto& s = rows[k].scaled;
      const double y_prior = top + band * 0.35, y_post = top + band * 0.65;
      c.line({{plot.page_x(s[0]), y_prior}, {plot.page_x(s[2]), y_prior}}, {.colour = kPrior, .width = 4});
      c.line({{plot.page_x(s[3]), y_post}, {plot.page_x(s[5]), y_post}}, {.colour = conditioned_colour(), .width = 4});
      for (const auto& [x, y] : {std::pair{s[1], y_prior}, std::pair{s[4], y_post}})
        c.circle({plot.page_x(x), y}, 2.6, formats::kInk, std::nullopt);
    }
    c.rectangle(fr, std::nullopt, formats::Stroke{.colour = formats::kInk, .width = 0.8});
    page.footer();
  };
  return {f};
}

}  // namespace

std::string observation_figure_name(const std::string& id) {
  std::string name = "observation_fit_";
  for (char ch : id) {
    const char l = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    name += (l >= 'a' && l <= 'z') || (l >= '0' && l <= '9') || l == '-' ? l : '_';
  }
  return name;
}

std::vector<Figure> conditioning_figures(const ReportSource& source) {
  std::vector<Figure> out = observation_fit_figures(source);
  for (auto& f : posterior_inputs_figures(source)) out.push_back(std::move(f));
  return out;
}

}  // namespace slipscreen::outputs::report
