#include "outputs/report/plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <stdexcept>

#include "core/caution.hpp"
#include "core/util/civil_date.hpp"

namespace slipscreen::outputs::report {
using formats::Box;
using formats::Canvas;
using formats::Colour;
using formats::HAlign;
using formats::Point;
using formats::Stroke;
using formats::TextStyle;
using formats::VAlign;

namespace {

constexpr double kMargin = 14.0;        // page edge to content
constexpr double kTitleSize = 11.0;
constexpr double kLabelSize = 8.5;
constexpr double kTickSize = 7.5;
constexpr double kFooterSize = 6.0;
const Colour kGrid = formats::rgb(0xd8dde3);
const Colour kMuted = formats::rgb(0x57606a);

// The nice step (1, 2 or 5 × 10^k) nearest above span / target (Heckbert 1990).
double nice_step(double span, int target) {
  const double raw = span / std::max(1, target);
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  const double f = raw / mag;
  const double nice = f <= 1.0 ? 1.0 : f <= 2.0 ? 2.0 : f <= 5.0 ? 5.0 : 10.0;
  return nice * mag;
}

std::string number_label(double v, double step) {
  const int decimals = std::max(0, static_cast<int>(-std::floor(std::log10(step) + 1e-9)));
  char buf[64];
  if (std::abs(v) < step * 1e-9) v = 0.0;  // no "-0"
  if ((std::abs(v) >= 1e6 || (v != 0 && std::abs(v) < 1e-4)) && decimals > 6)
    std::snprintf(buf, sizeof buf, "%.2g", v);
  else
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  std::string s = buf;
  if (s.size() > 1 && s[0] == '-') s = "\u2212" + s.substr(1);  // typographic minus
  return s;
}

}  // namespace

void append_line_legend(std::vector<LegendEntry>& legend, const std::vector<std::string>& names) {
  for (std::size_t i = 0; i < names.size(); ++i)
    legend.push_back({formats::markup_escape(names[i]), category_colour(i), LegendEntry::Mark::line});
}

void well_triangle(Canvas& c, Point p, double r, const formats::Colour& fill, const Stroke& outline) {
  c.polygon({{p.x, p.y - r}, {p.x + r * 0.866, p.y + r * 0.5}, {p.x - r * 0.866, p.y + r * 0.5}}, fill, outline);
}

Box label_box(Canvas& c, Point at, const std::string& markup, const formats::TextStyle& style, double pad) {
  if (style.v == formats::VAlign::baseline || style.angle_deg != 0)
    throw std::logic_error("label_box: a top, middle or bottom anchor and no angle");
  const Box m = c.measure(markup, style);
  const double w = style.wrap_width > 0 ? style.wrap_width : m.w;
  const double x = style.h == formats::HAlign::left ? at.x : style.h == formats::HAlign::centre ? at.x - w / 2 : at.x - w;
  const double y = style.v == formats::VAlign::top ? at.y : style.v == formats::VAlign::middle ? at.y - m.h / 2 : at.y - m.h;
  const Box box{x - pad, y - pad, w + 2 * pad, m.h + 2 * pad};
  c.rectangle(box, formats::kPaper.with_alpha(0.85), std::nullopt);
  c.text(at, markup, style);
  return box;
}

std::vector<Tick> linear_ticks(double lo, double hi, int target) {
  std::vector<Tick> out;
  if (!(hi > lo) || !std::isfinite(lo) || !std::isfinite(hi)) return out;
  const double step = nice_step(hi - lo, target);
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step)
    out.push_back({v, number_label(v, step)});
  return out;
}

std::vector<Tick> log_ticks(double lo, double hi) {
  std::vector<Tick> out;
  if (!(hi > lo && lo > 0)) return out;
  const int e0 = static_cast<int>(std::floor(std::log10(lo) + 1e-9));
  const int e1 = static_cast<int>(std::ceil(std::log10(hi) - 1e-9));
  const bool minor = e1 - e0 <= 2;
  for (int e = e0; e <= e1; ++e)
    for (double m : minor ? std::vector<double>{1, 2, 5} : std::vector<double>{1}) {
      const double v = m * std::pow(10.0, e);
      if (v < lo * (1 - 1e-9) || v > hi * (1 + 1e-9)) continue;
      char buf[32];
      if (e >= -3 && e <= 4) std::snprintf(buf, sizeof buf, "%g", v);
      else std::snprintf(buf, sizeof buf, "%ge%d", m, e);
      out.push_back({v, buf});
    }
  return out;
}

std::vector<Tick> date_ticks(double lo_days, double hi_days, int target) {
  std::vector<Tick> out;
  if (!(hi_days > lo_days)) return out;
  const auto a = util::civil_from_days(static_cast<std::int64_t>(std::floor(lo_days)));
  const auto b = util::civil_from_days(static_cast<std::int64_t>(std::ceil(hi_days)));
  const double years = (hi_days - lo_days) / 365.25;
  if (years >= 3.0) {
    const int step = static_cast<int>(nice_step(years, target));
    for (int y = (a.year + step - 1) / step * step; y <= b.year; y += std::max(1, step)) {
      const double d = static_cast<double>(util::days_from_civil({y, 1, 1}));
      if (d >= lo_days && d <= hi_days) out.push_back({d, std::to_string(y)});
    }
  } else {
    const int months = static_cast<int>(std::ceil(years * 12.0));
    const int step = months <= 8 ? 1 : months <= 18 ? 3 : 6;
    util::CivilDate d{a.year, a.month, 1};
    for (int i = 0; i < 60; ++i, d = util::add_months(d, 1)) {
      const double v = static_cast<double>(util::days_from_civil(d));
      if (v > hi_days) break;
      if (v < lo_days || (d.month - 1) % step != 0) continue;
      out.push_back({v, util::format_iso_month(d)});
    }
  }
  return out;
}

Axis nice_axis(double lo, double hi, std::string label, AxisKind kind) {
  if (!(hi > lo)) {  // a single value: show a small range around it
    const double pad = lo == 0 ? 1.0 : std::abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  if (kind == AxisKind::log10) {
    return {std::pow(10.0, std::floor(std::log10(lo))), std::pow(10.0, std::ceil(std::log10(hi))), std::move(label),
            kind};
  }
  if (kind == AxisKind::date) return {lo, hi, std::move(label), kind};
  const double step = nice_step(hi - lo, 6);
  return {std::floor(lo / step + 1e-9) * step, std::ceil(hi / step - 1e-9) * step, std::move(label), kind};
}

// ---- FigurePage ----

FigurePage::FigurePage(Canvas& c, const std::string& title, const std::string& subtitle) : c_(c) {
  double y = kMargin;
  const Box t = c.text({kMargin, y}, title, {.size = kTitleSize, .bold = true, .v = VAlign::top,
                                             .wrap_width = c.width() - 2 * kMargin});
  y += t.h + 2;
  if (!subtitle.empty()) {
    const Box s = c.text({kMargin, y}, subtitle, {.size = kLabelSize, .colour = kMuted, .v = VAlign::top,
                                                  .wrap_width = c.width() - 2 * kMargin});
    y += s.h + 2;
  }
  const double footer_h = kFooterSize * 2.6 + 6;
  body_ = {kMargin, y + 4, c.width() - 2 * kMargin, c.height() - footer_h - (y + 4) - 4};
}

void FigurePage::legend_right(const std::vector<LegendEntry>& entries, const std::string& heading) {
  if (entries.empty()) return;
  const TextStyle st{.size = kTickSize, .v = VAlign::middle};
  double w = heading.empty() ? 0 : c_.measure(heading, {.size = kTickSize, .bold = true}).w;
  for (const auto& e : entries) w = std::max(w, c_.measure(e.label, st).w + 18);
  w = std::min(w, body_.w * 0.4);
  const double x = body_.right() - w;
  double y = body_.y + 4;
  if (!heading.empty()) {
    c_.text({x, y}, heading, {.size = kTickSize, .bold = true, .v = VAlign::top});
    y += kTickSize * 1.6;
  }
  for (const auto& e : entries) {
    const double cy = y + kTickSize * 0.6;
    switch (e.mark) {
      case LegendEntry::Mark::line: c_.line({{x, cy}, {x + 12, cy}}, {.colour = e.colour, .width = 1.6}); break;
      case LegendEntry::Mark::band: c_.rectangle({x, cy - 4, 12, 8}, e.colour, std::nullopt); break;
      case LegendEntry::Mark::dot: c_.circle({x + 6, cy}, 3.2, e.colour, Stroke{.colour = formats::kInk, .width = 0.4}); break;
      case LegendEntry::Mark::square: c_.rectangle({x + 2, cy - 4, 8, 8}, e.colour, Stroke{.width = 0.4}); break;
      case LegendEntry::Mark::triangle: well_triangle(c_, {x + 6, cy}, 4.6, e.colour, Stroke{.width = 0.4}); break;
    }
    const Box b = c_.text({x + 16, cy}, e.label, {.size = kTickSize, .v = VAlign::middle, .wrap_width = w - 16});
    y += std::max(kTickSize * 1.5, b.h + 2);
  }
  body_.w -= w + 8;
}

void FigurePage::colour_bar_right(Ramp ramp, const Axis& scale) {
  // The label sits above the bar, starting at its left edge, and the bar takes the room of the
  // wider of its tick labels and its label, so that neither runs into the plot beside it.
  const double bar_w = 10;
  const double label_w = std::max(44.0, c_.measure(scale.label, {.size = kTickSize}).w + 4 - bar_w);
  const double x = body_.right() - bar_w - label_w;
  const double top = body_.y + 16, bottom = body_.bottom() - 24;
  const int steps = 64;
  for (int i = 0; i < steps; ++i) {
    const double t0 = static_cast<double>(i) / steps;
    const double y1 = bottom - (bottom - top) * t0;
    const double y0 = bottom - (bottom - top) * (t0 + 1.0 / steps);
    c_.rectangle({x, y0, bar_w, y1 - y0 + 0.3}, ramp_colour(ramp, t0 + 0.5 / steps), std::nullopt);
  }
  c_.rectangle({x, top, bar_w, bottom - top}, std::nullopt, Stroke{.width = 0.5});
  for (const auto& t : linear_ticks(scale.lo, scale.hi, 5)) {
    const double y = bottom - (bottom - top) * (t.value - scale.lo) / (scale.hi - scale.lo);
    c_.line({{x + bar_w, y}, {x + bar_w + 3, y}}, {.width = 0.5});
    c_.text({x + bar_w + 5, y}, t.label, {.size = kTickSize, .v = VAlign::middle});
  }
  c_.text({x, top - 4}, scale.label, {.size = kTickSize, .h = HAlign::left, .v = VAlign::bottom});
  body_.w -= bar_w + label_w + 8;
}

void FigurePage::footer() {
  const double y = c_.height() - kMargin / 2;
  c_.line({{kMargin, y - kFooterSize * 2.6 - 2}, {c_.width() - kMargin, y - kFooterSize * 2.6 - 2}},
          {.colour = kGrid, .width = 0.5});
  c_.text({kMargin, y}, formats::markup_escape(kScreeningCaution),
          {.size = kFooterSize, .colour = kMuted, .v = VAlign::bottom, .wrap_width = c_.width() - 2 * kMargin});
}

// ---- Plot ----

Plot::Plot(Canvas& c, const Box& area, Axis x, Axis y) : c_(c), area_(area), x_(std::move(x)), y_(std::move(y)) {
  const double left = kLabelSize * 1.6 + 34;  // y axis label and tick labels
  const double bottom = kLabelSize * 1.6 + kTickSize * 1.6 + 6;
  frame_ = {area.x + left, area.y + 4, std::max(10.0, area.w - left - 6), std::max(10.0, area.h - bottom - 4)};
}

double Plot::map(const Axis& a, double v, double from, double to) const {
  double t;
  if (a.kind == AxisKind::log10) t = (std::log10(v) - std::log10(a.lo)) / (std::log10(a.hi) - std::log10(a.lo));
  else t = (v - a.lo) / (a.hi - a.lo);
  return from + t * (to - from);
}

double Plot::page_x(double x) const { return map(x_, x, frame_.x, frame_.right()); }
double Plot::page_y(double y) const { return map(y_, y, frame_.bottom(), frame_.y); }
Point Plot::to_page(double x, double y) const { return {page_x(x), page_y(y)}; }

void Plot::axes() {
  auto ticks = [](const Axis& a, int target) {
    return a.kind == AxisKind::log10 ? log_ticks(a.lo, a.hi)
           : a.kind == AxisKind::date ? date_ticks(a.lo, a.hi, target)
                                      : linear_ticks(a.lo, a.hi, target);
  };
  const auto xt = ticks(x_, std::max(3, static_cast<int>(frame_.w / 70)));
  const auto yt = ticks(y_, std::max(3, static_cast<int>(frame_.h / 40)));
  for (const auto& t : xt) {
    const double px = page_x(t.value);
    c_.line({{px, frame_.y}, {px, frame_.bottom()}}, {.colour = kGrid, .width = 0.5});
    c_.line({{px, frame_.bottom()}, {px, frame_.bottom() + 3}}, {.width = 0.6});
    c_.text({px, frame_.bottom() + 4}, t.label, {.size = kTickSize, .h = HAlign::centre, .v = VAlign::top});
  }
  for (const auto& t : yt) {
    const double py = page_y(t.value);
    c_.line({{frame_.x, py}, {frame_.right(), py}}, {.colour = kGrid, .width = 0.5});
    c_.line({{frame_.x - 3, py}, {frame_.x, py}}, {.width = 0.6});
    c_.text({frame_.x - 5, py}, t.label, {.size = kTickSize, .h = HAlign::right, .v = VAlign::middle});
  }
  c_.rectangle(frame_, std::nullopt, Stroke{.width = 0.7});
  c_.text({frame_.x + frame_.w / 2, area_.bottom()}, x_.label,
          {.size = kLabelSize, .h = HAlign::centre, .v = VAlign::bottom});
  c_.text({area_.x, frame_.y + frame_.h / 2}, y_.label,
          {.size = kLabelSize, .h = HAlign::centre, .v = VAlign::top, .angle_deg = 90});
}

void Plot::line(const std::vector<double>& x, const std::vector<double>& y, const Stroke& s) {
  c_.clip(frame_);
  std::vector<Point> run;
  for (std::size_t i = 0; i < x.size() && i < y.size(); ++i) {
    if (!std::isfinite(x[i]) || !std::isfinite(y[i]) || (y_.kind == AxisKind::log10 && y[i] <= 0)) {
      c_.line(run, s);
      run.clear();
      continue;
    }
    run.push_back(to_page(x[i], y[i]));
  }
  c_.line(run, s);
  c_.unclip();
}

void Plot::band(const std::vector<double>& x, const std::vector<double>& lo, const std::vector<double>& hi,
                const Colour& fill) {
  std::vector<Point> ring;
  const std::size_t n = std::min({x.size(), lo.size(), hi.size()});
  for (std::size_t i = 0; i < n; ++i)
    if (std::isfinite(x[i]) && std::isfinite(hi[i])) ring.push_back(to_page(x[i], hi[i]));
  for (std::size_t i = n; i-- > 0;)
    if (std::isfinite(x[i]) && std::isfinite(lo[i])) ring.push_back(to_page(x[i], lo[i]));
  c_.clip(frame_);
  c_.polygon(ring, fill, std::nullopt);
  c_.unclip();
}

void Plot::dots(const std::vector<double>& x, const std::vector<double>& y, double r, const Colour& fill,
                std::optional<Stroke> outline) {
  c_.clip(frame_);
  for (std::size_t i = 0; i < x.size() && i < y.size(); ++i)
    if (std::isfinite(x[i]) && std::isfinite(y[i])) c_.circle(to_page(x[i], y[i]), r, fill, outline);
  c_.unclip();
}

void Plot::hline(double y, const Stroke& s, const std::string& label) {
  if (!std::isfinite(y)) return;
  const double py = page_y(y);
  if (py < frame_.y - 0.01 || py > frame_.bottom() + 0.01) return;
  c_.line({{frame_.x, py}, {frame_.right(), py}}, s);
  if (!label.empty())
    c_.text({frame_.right() - 3, py - 2}, label, {.size = kTickSize, .colour = s.colour, .h = HAlign::right,
                                                  .v = VAlign::bottom});
}

void Plot::vline(double x, const Stroke& s, const std::string& label) {
  if (!std::isfinite(x)) return;
  const double px = page_x(x);
  if (px < frame_.x - 0.01 || px > frame_.right() + 0.01) return;
  c_.line({{px, frame_.y}, {px, frame_.bottom()}}, s);
  if (!label.empty())
    c_.text({px + 3, frame_.y + 3}, label, {.size = kTickSize, .colour = s.colour, .v = VAlign::top});
}

void Plot::bars(const std::vector<double>& left, const std::vector<double>& right, const std::vector<double>& base,
                const std::vector<double>& top, const Colour& fill) {
  c_.clip(frame_);
  for (std::size_t i = 0; i < left.size() && i < right.size() && i < base.size() && i < top.size(); ++i) {
    const Point a = to_page(left[i], top[i]), b = to_page(right[i], base[i]);
    c_.rectangle({std::min(a.x, b.x), std::min(a.y, b.y), std::abs(b.x - a.x), std::abs(b.y - a.y)}, fill,
                 std::nullopt);
  }
  c_.unclip();
}

}  // namespace slipscreen::outputs::report
