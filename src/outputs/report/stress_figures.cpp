#include "outputs/report/stress_figures.hpp"

#include <algorithm>
#include <cctype>
#include <iterator>
#include <cmath>
#include <map>
#include <numbers>
#include <set>

#include "formats/drawing/canvas.hpp"
#include "outputs/report/figure_support.hpp"
#include "outputs/report/plot.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
using formats::Canvas;
using formats::Colour;
using formats::Stroke;

namespace {

// This file's palette (Okabe & Ito 2008 hues, colour_ramp.hpp) and marks.
const Colour kCircle = formats::rgb(0x57606a);
const Colour kCoulomb = formats::rgb(0xd55e00);    // vermillion: the failure line
const Colour kBefore = formats::rgb(0x0072b2);     // blue: before injection
const Colour kAtPeak = formats::rgb(0xe69f00);     // orange: at the peak Δp
const Colour kCritical = formats::rgb(0x009e73);   // bluish green: the Δp_crit distance

// One row of segments.csv, in SI.
struct SegmentRow {
  std::string id, fault, status;
  double s1, s2, s3, p0, mu, c, sn_eff, tau, dp_crit, peak_dp, depth;
};

std::vector<SegmentRow> read_segments(const RunTable& t) {
  std::vector<SegmentRow> out;
  for (std::size_t i = 0; i < t.rows(); ++i)
    out.push_back({t.text(i, "segment_id"), t.text(i, "fault_id"), t.text(i, "status"), t.si(i, "s1"), t.si(i, "s2"),
                   t.si(i, "s3"), t.si(i, "pore_pressure"), t.number(i, "friction"), t.si(i, "cohesion"),
                   t.si(i, "sigma_n_eff"), t.si(i, "tau"), si_or_infinite(t, i, "dp_crit"), t.si(i, "peak_dp"),
                   t.si(i, "depth")});
  return out;
}

// Faults ordered by how close their segments come to failure: smallest margin Δp_crit − peak
// Δp, then smallest Δp_crit, then file order.
std::vector<std::string> critical_faults(const std::vector<SegmentRow>& rows, std::size_t n) {
  std::vector<std::string> order;
  std::map<std::string, std::pair<double, double>> key;
  for (const auto& r : rows) {
    const double margin = r.dp_crit - r.peak_dp;
    auto [it, fresh] = key.try_emplace(r.fault, margin, r.dp_crit);
    if (fresh) order.push_back(r.fault);
    it->second = std::min(it->second, std::pair{margin, r.dp_crit});
  }
  std::stable_sort(order.begin(), order.end(), [&](const auto& a, const auto& b) { return key[a] < key[b]; });
  if (order.size() > n) order.resize(n);
  return order;
}

std::string file_stem(const std::string& id) {
  std::string s;
  for (char ch : id) s += std::isalnum(static_cast<unsigned char>(ch)) ? static_cast<char>(std::tolower(ch)) : '_';
  return s;
}

std::string pressure_text(double si, const DisplayUnit& u) {
  return data_number(std::round(u.shown(si) * 100.0) / 100.0) + " " + u.suffix;
}

// The upper half of a circle as a polyline in data coordinates.
void half_circle(Plot& plot, double centre, double radius, const Stroke& s) {
  std::vector<double> x, y;
  for (int i = 0; i <= 180; ++i) {
    const double a = std::numbers::pi * i / 180.0;
    x.push_back(centre + radius * std::cos(a));
    y.push_back(radius * std::sin(a));
  }
  plot.line(x, y, s);
}

Figure mohr_figure(const std::string& fault, const std::vector<SegmentRow>& segs, const DisplayUnit& u) {
  const SegmentRow& first = segs.front();
  const double s1 = first.s1, s2 = first.s2, s3 = first.s3, p0 = first.p0;
  struct Circle {
    std::string name;
    double centre, radius;
  };
  const std::vector<Circle> circles = {{"circle_s1_s3", (s1 + s3) / 2 - p0, (s1 - s3) / 2},
                                       {"circle_s1_s2", (s1 + s2) / 2 - p0, (s1 - s2) / 2},
                                       {"circle_s2_s3", (s2 + s3) / 2 - p0, (s2 - s3) / 2}};
  double peak = 0;
  const SegmentRow* closest = &first;
  for (const auto& s : segs) {
    peak = std::max(peak, s.peak_dp);
    if (s.dp_crit < closest->dp_crit) closest = &s;
  }
  std::set<std::pair<double, double>> lines;  // (μ, c) used on this fault
  for (const auto& s : segs) lines.insert({s.mu, s.c});

  Figure f;
  f.name = "mohr_" + file_stem(fault);
  f.title = "Mohr diagram of fault " + fault;
  f.reading =
      "The half circles are the stress state at the reference depth in effective stress (the largest joins S1 and S3); "
      "each filled dot is a segment of fault " + fault + " before injection, each open dot the same segment shifted "
      "left by its peak pressure change (dCFF = mu dp, no poroelastic stress change). A segment slips when its dot "
      "reaches the Coulomb line; the green dashes measure dp_crit, the pressure increase that takes it there.";
  const std::string su = "_" + u.suffix;
  f.data.header = {"element", "segment_id", "sigma_n_eff" + su, "tau" + su, "radius" + su, "friction", "dp" + su};
  auto& rows = f.data.rows;
  for (const auto& c : circles)
    rows.push_back({c.name, "", data_number(u.shown(c.centre)), "0", data_number(u.shown(c.radius)), "", ""});
  if (peak > 0)
    rows.push_back({"circle_s1_s3_at_peak_dp", "", data_number(u.shown(circles[0].centre - peak)), "0",
                    data_number(u.shown(circles[0].radius)), "", data_number(u.shown(peak))});
  for (const auto& [mu, c] : lines)
    rows.push_back({"coulomb_line", "", "0", data_number(u.shown(c)), "", data_number(mu), ""});
  for (const auto& s : segs) {
    rows.push_back({"before_injection", s.id, data_number(u.shown(s.sn_eff)), data_number(u.shown(s.tau)), "", "", ""});
    rows.push_back({"at_peak_dp", s.id, data_number(u.shown(s.sn_eff - s.peak_dp)), data_number(u.shown(s.tau)), "",
                    "", data_number(u.shown(s.peak_dp))});
    if (std::isfinite(s.dp_crit))
      rows.push_back({"dp_crit", s.id, data_number(u.shown(s.sn_eff - s.dp_crit)), data_number(u.shown(s.tau)), "",
                      data_number(s.mu), data_number(u.shown(s.dp_crit))});
  }

  std::string subtitle = "At " + data_number(std::round(first.depth)) + " m: " + std::to_string(segs.size()) +
                         (segs.size() == 1 ? " segment" : " segments") + "; smallest Δp_crit " +
                         (std::isfinite(closest->dp_crit) ? pressure_text(closest->dp_crit, u) : "none") + " (" +
                         formats::markup_escape(closest->id) + "), largest peak Δp " + pressure_text(peak, u);
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Mohr diagram, fault " + formats::markup_escape(fault), subtitle);
    std::vector<LegendEntry> legend = {{"principal circles", kCircle},
                                       {"Coulomb line τ = c + μσn′", kCoulomb},
                                       {"segment before injection", kBefore, LegendEntry::Mark::dot},
                                       {"at peak Δp", kAtPeak, LegendEntry::Mark::dot},
                                       {"Δp_crit (to the line)", kCritical}};
    if (peak > 0) legend.insert(legend.begin() + 1, {"S1–S3 circle at peak Δp", kCircle.with_alpha(0.5)});
    page.legend_right(legend);
    // Equal scales on both axes, so that the circles are round: fit the x range, then give the
    // y axis the same units per point.
    double x_lo = std::min(0.0, circles[0].centre - circles[0].radius - peak);
    for (const auto& s : segs) {
      x_lo = std::min(x_lo, s.sn_eff - s.peak_dp);
      if (std::isfinite(s.dp_crit)) x_lo = std::min(x_lo, s.sn_eff - s.dp_crit);
    }
    const double x_hi = s1 - p0;
    const Axis xa = nice_axis(u.shown(x_lo), u.shown(x_hi) * 1.04,
                              "effective normal stress σn′ [" + u.suffix + "]");
    const Plot probe(c, page.body(), xa, {0, 1, ""});
    const double per_pt = (xa.hi - xa.lo) / probe.frame().w;
    const Axis ya{0, per_pt * probe.frame().h, "shear stress τ [" + u.suffix + "]"};
    Plot plot(c, page.body(), xa, ya);
    plot.axes();
    for (const auto& ci : circles)
      half_circle(plot, u.shown(ci.centre), u.shown(ci.radius), {.colour = kCircle, .width = 1.1});
    if (peak > 0)
      half_circle(plot, u.shown(circles[0].centre - peak), u.shown(circles[0].radius),
                  {.colour = kCircle.with_alpha(0.5), .width = 1.0, .dash = {4, 3}});
    for (const auto& [mu, coh] : lines)
      plot.line({xa.lo, xa.hi}, {u.shown(coh) + mu * xa.lo, u.shown(coh) + mu * xa.hi}, {.colour = kCoulomb, .width = 1.4});
    for (const auto& s : segs) {
      const double x0 = u.shown(s.sn_eff), y = u.shown(s.tau);
      if (std::isfinite(s.dp_crit))
        plot.line({x0, x0 - u.shown(s.dp_crit)}, {y, y}, {.colour = kCritical, .width = 1.0, .dash = {2, 2}});
      if (s.peak_dp > 0) plot.line({x0, x0 - u.shown(s.peak_dp)}, {y, y}, {.colour = kAtPeak, .width = 1.2});
    }
    for (const auto& s : segs) {
      const double x0 = u.shown(s.sn_eff), y = u.shown(s.tau);
      if (std::isfinite(s.dp_crit)) {
        const formats::Point m = plot.to_page(x0 - u.shown(s.dp_crit), y);
        c.line({{m.x, m.y - 4}, {m.x, m.y + 4}}, {.colour = kCritical, .width = 1.4});
      }
      plot.dots({x0 - u.shown(s.peak_dp)}, {y}, 3.0, formats::kPaper, Stroke{.colour = kAtPeak, .width = 1.2});
      plot.dots({x0}, {y}, 3.0, kBefore, Stroke{.colour = formats::kPaper, .width = 0.5});
    }
    page.footer();
  };
  return f;
}

// The top segments of dp_crit_quantiles.csv (rank 1..n) with their quantiles, and the median
// modelled Δp at the last output time (segment_probability.csv).
Figure dp_crit_figure(const RunTable& q, const RunTable& prob, std::size_t n) {
  struct Curve {
    std::string id;
    std::vector<double> level, value;  // SI
    double dp_median = std::nan("");
  };
  std::vector<Curve> curves;
  std::map<std::string, std::size_t> index;
  for (std::size_t i = 0; i < q.rows(); ++i) {
    if (q.number(i, "rank") > static_cast<double>(n)) continue;
    const std::string& id = q.text(i, "segment_id");
    auto [it, fresh] = index.try_emplace(id, curves.size());
    if (fresh) curves.push_back({id, {}, {}});
    curves[it->second].level.push_back(q.number(i, "quantile"));
    curves[it->second].value.push_back(q.si(i, "dp_crit"));
  }
  std::string last_date;
  for (std::size_t i = 0; i < prob.rows(); ++i) last_date = std::max(last_date, prob.text(i, "date"));
  for (std::size_t i = 0; i < prob.rows(); ++i)
    if (prob.text(i, "date") == last_date)
      if (const auto it = index.find(prob.text(i, "segment_id")); it != index.end())
        curves[it->second].dp_median = prob.si(i, "dp_p50");
  const DisplayUnit u = unit_of(q, "dp_crit");

  Figure f;
  f.name = "dp_crit_distribution";
  f.title = "Distribution of dp_crit over the realizations, top segments";
  f.reading = "Each curve is the share of realizations (with a finite dp_crit) whose dp_crit is at most the value on the "
              "x axis; the dashed line of the same colour is the median modelled dp at " + last_date +
              ". Where a curve crosses its dashed line reads roughly as that segment's P(slip) by then.";
  f.data.header = {"segment_id", "what", "quantile", "date", "dp_" + u.suffix};
  for (const auto& cv : curves) {
    for (std::size_t k = 0; k < cv.level.size(); ++k)
      f.data.rows.push_back({cv.id, "dp_crit", data_number(cv.level[k]), "", data_number(u.shown(cv.value[k]))});
    f.data.rows.push_back({cv.id, "dp_p50", "", last_date, data_number(u.shown(cv.dp_median))});
  }
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Δp_crit across realizations, top segments",
                    "Cumulative distribution; dashed: median modelled Δp at " + last_date);
    std::vector<LegendEntry> legend;
    double lo = 0, hi = 0;
    for (std::size_t i = 0; i < curves.size(); ++i) {
      legend.push_back({formats::markup_escape(curves[i].id), category_colour(i)});
      for (double v : curves[i].value) lo = std::min(lo, v), hi = std::max(hi, v);
      if (std::isfinite(curves[i].dp_median)) hi = std::max(hi, curves[i].dp_median);
    }
    page.legend_right(legend, "segment");
    Plot plot(c, page.body(), nice_axis(u.shown(lo), u.shown(hi), "Δp_crit [" + u.suffix + "]"),
              {0, 1, "share of realizations"});
    plot.axes();
    for (std::size_t i = 0; i < curves.size(); ++i) {
      std::vector<double> x;
      for (double v : curves[i].value) x.push_back(u.shown(v));
      plot.vline(u.shown(curves[i].dp_median), {.colour = category_colour(i), .width = 1.0, .dash = {4, 3}});
      // Segments of one fault often share their distribution: the higher-ranked curves are drawn
      // first and wider, so that an identical curve above leaves them visible at its edges.
      const double width = 1.4 + 0.7 * static_cast<double>(curves.size() - 1 - i);
      plot.line(x, curves[i].level, {.colour = category_colour(i), .width = width});
    }
    page.footer();
  };
  return f;
}

// Spearman's ρ of the sampled inputs at the faults with the highest final P(slip), as grouped
// horizontal bars (inputs ordered by their largest |ρ|).
Figure sensitivity_figure(const RunTable& t, std::size_t n) {
  struct Row {
    std::string fault, segment;
    double p;
  };
  std::vector<Row> faults;
  std::map<std::pair<std::string, std::string>, double> rho;  // (segment, input) -> ρ
  std::vector<std::string> inputs;
  for (std::size_t i = 0; i < t.rows(); ++i) {
    const std::string& seg = t.text(i, "segment_id");
    if (std::none_of(faults.begin(), faults.end(), [&](const Row& r) { return r.segment == seg; }))
      faults.push_back({t.text(i, "fault_id"), seg, t.number(i, "p_slip_final")});
    const std::string& in = t.text(i, "input");
    if (std::find(inputs.begin(), inputs.end(), in) == inputs.end()) inputs.push_back(in);
    rho[{seg, in}] = t.number(i, "spearman_rho");
  }
  std::stable_sort(faults.begin(), faults.end(), [](const Row& a, const Row& b) { return a.p > b.p; });
  if (faults.size() > n) faults.resize(n);
  auto largest = [&](const std::string& in) {
    double m = -1;
    for (const auto& f : faults)
      if (const auto it = rho.find({f.segment, in}); it != rho.end()) m = std::max(m, std::abs(it->second));
    return m;
  };
  std::erase_if(inputs, [&](const std::string& in) { return largest(in) < 0; });
  std::stable_sort(inputs.begin(), inputs.end(), [&](const auto& a, const auto& b) { return largest(a) > largest(b); });
  constexpr std::size_t kInputs = 10;
  if (inputs.size() > kInputs) inputs.resize(kInputs);

  Figure f;
  f.name = "sensitivity";
  f.title = "Sensitivity of the slip margin to the sampled inputs";
  f.reading = "Spearman's rank correlation of each sampled input with the slip margin (dp_crit - dp) at the last output "
              "time, at each fault's segment with the highest final P(slip). Bars to the right: a larger value of the "
              "input keeps the fault further from failure; to the left: it brings failure closer.";
  f.height = std::max(kFigureHeight, 110.0 + 5.5 * static_cast<double>(inputs.size() * std::max<std::size_t>(1, faults.size())));
  f.data.header = {"fault_id", "segment_id", "p_slip_final", "input", "spearman_rho"};
  for (const auto& in : inputs)
    for (const auto& fr : faults)
      if (const auto it = rho.find({fr.segment, in}); it != rho.end())
        f.data.rows.push_back({fr.fault, fr.segment, data_number(fr.p), in, data_number(it->second)});
  f.draw = [=](Canvas& c) {
    FigurePage page(c, "Sensitivity: Spearman's ρ against the slip margin",
                    "Each fault's segment with the highest final P(slip); inputs ordered by their largest |ρ|");
    std::vector<LegendEntry> legend;
    for (std::size_t i = 0; i < faults.size(); ++i)
      legend.push_back({formats::markup_escape(faults[i].segment) + " (P " + data_number(faults[i].p) + ")",
                        category_colour(i), LegendEntry::Mark::square});
    page.legend_right(legend, "segment");
    // Input names at the left of the frame, ρ from −1 to 1 along x.
    const formats::TextStyle name_style{.size = 7.5, .h = formats::HAlign::right, .v = formats::VAlign::middle};
    double name_w = 0;
    for (const auto& in : inputs) name_w = std::max(name_w, c.measure(formats::markup_escape(in), name_style).w);
    formats::Box area = page.body();
    const double shift = std::max(0.0, name_w + 8 - 48);  // Plot keeps about 48 pt for y tick labels
    area.x += shift;
    area.w -= shift;
    Plot plot(c, area, {-1, 1, "Spearman's ρ with the slip margin"}, {0, static_cast<double>(inputs.size()), ""});
    const formats::Box fr = plot.frame();
    for (const auto& tk : linear_ticks(-1, 1, 8)) {
      const double x = plot.page_x(tk.value);
      c.line({{x, fr.y}, {x, fr.bottom()}}, {.colour = formats::rgb(0xd8dde3), .width = 0.5});
      c.text({x, fr.bottom() + 4}, tk.label, {.size = 7.5, .h = formats::HAlign::centre, .v = formats::VAlign::top});
    }
    c.text({fr.x + fr.w / 2, area.bottom()}, "Spearman's ρ with the slip margin",
           {.size = 8.5, .h = formats::HAlign::centre, .v = formats::VAlign::bottom});
    const double zero = plot.page_x(0);
    const double band = fr.h / std::max<double>(1, static_cast<double>(inputs.size()));
    const double bar = std::min(10.0, band * 0.8 / std::max<double>(1, static_cast<double>(faults.size())));
    for (std::size_t k = 0; k < inputs.size(); ++k) {
      const double top = fr.y + band * static_cast<double>(k);
      c.text({fr.x - 5, top + band / 2}, formats::markup_escape(inputs[k]), name_style);
      if (k > 0) c.line({{fr.x, top}, {fr.right(), top}}, {.colour = formats::rgb(0xeef1f4), .width = 0.5});
      const double y0 = top + (band - bar * static_cast<double>(faults.size())) / 2;
      for (std::size_t i = 0; i < faults.size(); ++i) {
        const auto it = rho.find({faults[i].segment, inputs[k]});
        if (it == rho.end()) continue;
        const double x = plot.page_x(it->second);
        c.rectangle({std::min(x, zero), y0 + bar * static_cast<double>(i), std::abs(x - zero), bar * 0.9},
                    category_colour(i), std::nullopt);
      }
    }
    c.line({{zero, fr.y}, {zero, fr.bottom()}}, {.width = 0.8});
    c.rectangle(fr, std::nullopt, Stroke{.width = 0.7});
    page.footer();
  };
  return f;
}

}  // namespace

std::vector<Figure> stress_figures(const ReportSource& src) {
  std::vector<Figure> out;
  if (RunTable::exists(src.folder, "segments.csv")) {
    const RunTable& t = src.table("segments.csv");
    const auto rows = read_segments(t);
    const DisplayUnit u = unit_of(t, "sigma_n_eff");
    for (const auto& fault : critical_faults(rows, src.top_segments)) {
      std::vector<SegmentRow> segs;
      std::copy_if(rows.begin(), rows.end(), std::back_inserter(segs), [&](const auto& r) { return r.fault == fault; });
      out.push_back(mohr_figure(fault, segs, u));
    }
  }
  if (RunTable::exists(src.folder, "dp_crit_quantiles.csv") && RunTable::exists(src.folder, "segment_probability.csv"))
    out.push_back(dp_crit_figure(src.table("dp_crit_quantiles.csv"),
                                 src.table("segment_probability.csv"), src.top_segments));
  if (RunTable::exists(src.folder, "sensitivity.csv")) {
    const RunTable& t = src.table("sensitivity.csv");
    if (t.rows() > 0) out.push_back(sensitivity_figure(t, src.top_segments));
  }
  return out;
}

}  // namespace slipscreen::outputs::report
