#pragma once
// The report's chart frame (docs/report.md): a figure page with a title, a plotting area with
// axes in units, tick labels at "nice" values (Heckbert 1990, Graphics Gems: steps of 1, 2 or 5
// times a power of ten), an optional legend and the screening caution in the footer.
//
//   formats::Canvas c(formats::DrawingFormat::svg, kFigureWidth, kFigureHeight);
//   FigurePage page(c, "P(slip by t), top segments");
//   Plot plot(c, page.body(), {.lo = t0, .hi = t1, .label = "date", .kind = AxisKind::date},
//             {.lo = 0, .hi = 1, .label = "P(slip by t)"});
//   plot.axes();
//   plot.band(ts, lo, hi, colour.with_alpha(0.25));
//   plot.line(ts, p, {.colour = colour, .width = 1.4});
//   page.legend({{"F07:3", colour}});
//   page.footer();
//
// Data coordinates: x and y in the axis' unit; dates as days since 1970-01-01 (civil_date.hpp).
// Points outside the axis range are clipped to the plotting area.
#include <optional>
#include <string>
#include <vector>

#include "formats/drawing/canvas.hpp"
#include "outputs/report/colour_ramp.hpp"

namespace slipscreen::outputs::report {

// Default figure size in points: fits an A4 or Letter page's text width at 100 %.
inline constexpr double kFigureWidth = 480.0;
inline constexpr double kFigureHeight = 320.0;

enum class AxisKind { linear, log10, date };

struct Axis {
  double lo = 0, hi = 1;  // data range shown (log10: both > 0)
  std::string label;       // Pango markup, with the unit: "Δp [MPa]"
  AxisKind kind = AxisKind::linear;
};

struct Tick {
  double value;
  std::string label;
};

// Ticks between lo and hi at nice steps, about `target` of them (at least two where lo < hi).
std::vector<Tick> linear_ticks(double lo, double hi, int target = 6);
// Decades (and 2, 5 in between when the range is short) for a log axis.
std::vector<Tick> log_ticks(double lo, double hi);
// Years, or months when the range is under three years; values in days since 1970-01-01.
std::vector<Tick> date_ticks(double lo_days, double hi_days, int target = 7);

// Rounds a range outwards to nice values (for an axis that should start and end on ticks).
Axis nice_axis(double lo, double hi, std::string label, AxisKind kind = AxisKind::linear);

struct LegendEntry {
  std::string label;  // Pango markup
  formats::Colour colour;
  enum class Mark { line, band, dot, square, triangle } mark = Mark::line;
};

// Appends one line entry per name (plain text, escaped) in the category colours 0, 1, 2, ...: the
// legend of figures with one coloured line per fault segment.
void append_line_legend(std::vector<LegendEntry>& legend, const std::vector<std::string>& names);

// A well's map symbol (and its legend mark): an upward triangle of circumradius `r` points
// centred at `p`.
void well_triangle(formats::Canvas& c, formats::Point p, double r, const formats::Colour& fill,
                   const formats::Stroke& outline);

// A map label that stays readable over any colour beneath it (the dark centre of a Δp raster):
// the text on a box of paper white at 85 % opacity, `pad` points wider on every side. The
// anchor and the style are Canvas::text's; a baseline anchor or an angle is not supported
// (std::logic_error). Returns the box drawn.
formats::Box label_box(formats::Canvas& c, formats::Point at, const std::string& markup, const formats::TextStyle& style,
                       double pad = 1.5);

// A figure's page: title on top, the body for the plot, the legend at the right or below,
// the caution in the footer.
class FigurePage {
 public:
  FigurePage(formats::Canvas& c, const std::string& title_markup, const std::string& subtitle_markup = "");
  // The area left for the plot (and its axis labels), above the footer.
  formats::Box body() const { return body_; }
  // Draws a legend in a column at the right of the body and shrinks the body to make room.
  void legend_right(const std::vector<LegendEntry>& entries, const std::string& heading = "");
  // Draws a colour bar for `ramp` from lo to hi at the right of the body and shrinks the body.
  void colour_bar_right(Ramp ramp, const Axis& scale);
  // The screening caution in one line at the bottom.
  void footer();

 private:
  formats::Canvas& c_;
  formats::Box body_;
};

class Plot {
 public:
  // `area` holds the plot frame and its tick and axis labels.
  Plot(formats::Canvas& c, const formats::Box& area, Axis x, Axis y);

  formats::Box frame() const { return frame_; }
  formats::Point to_page(double x, double y) const;
  double page_x(double x) const;
  double page_y(double y) const;

  // Frame, grid lines, ticks and axis labels.
  void axes();
  // Data series, clipped to the frame. NaN values break the line.
  void line(const std::vector<double>& x, const std::vector<double>& y, const formats::Stroke& s);
  void band(const std::vector<double>& x, const std::vector<double>& lo, const std::vector<double>& hi,
            const formats::Colour& fill);
  void dots(const std::vector<double>& x, const std::vector<double>& y, double radius_pt,
            const formats::Colour& fill, std::optional<formats::Stroke> outline = std::nullopt);
  void hline(double y, const formats::Stroke& s, const std::string& label_markup = "");
  void vline(double x, const formats::Stroke& s, const std::string& label_markup = "");
  // Vertical bars from `base` to each y (histograms, stacked areas use band()).
  void bars(const std::vector<double>& left, const std::vector<double>& right, const std::vector<double>& base,
            const std::vector<double>& top, const formats::Colour& fill);

 private:
  formats::Canvas& c_;
  formats::Box area_, frame_;
  Axis x_, y_;
  double map(const Axis& a, double v, double from, double to) const;
};

}  // namespace slipscreen::outputs::report
