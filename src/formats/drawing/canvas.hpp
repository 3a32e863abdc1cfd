#pragma once
// One drawing code path for every figure format: a Canvas draws with Cairo (vector paths, images)
// and Pango (text: Greek letters, subscripts, any Unicode) onto an SVG, PNG or multi-page PDF
// surface held in memory, and save() writes the finished bytes through the checked writer
// (text_file.hpp), so a figure is either complete on disk or an IoError.
//
//   formats::Canvas c(formats::DrawingFormat::svg, 480, 320);        // size in points (1/72 in)
//   c.line({{10, 10}, {200, 90}}, {.colour = formats::kInk, .width = 1.0});
//   c.text({20, 20}, "Δp<sub>crit</sub> [MPa]", {.size = 9});
//   c.save("figures/map.svg");
//
// Coordinates are points from the top-left corner, y down (Cairo's user space). Text is Pango
// markup (escape user text with markup_escape()). Fonts: the "DejaVu Sans" family from Debian's
// fonts-dejavu-core, so figures look the same on every machine that builds slipscreen.
// Reproducible: the same drawing gives the same bytes (the PDF's creation date is the one given,
// or none).
#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::formats {

enum class DrawingFormat { svg, png, pdf };

struct Colour {
  double r = 0, g = 0, b = 0, a = 1;  // 0..1, straight (not premultiplied) alpha
  Colour with_alpha(double alpha) const { return {r, g, b, alpha}; }
};
// 0xRRGGBB to a colour.
constexpr Colour rgb(std::uint32_t hex, double a = 1.0) {
  return {((hex >> 16) & 0xff) / 255.0, ((hex >> 8) & 0xff) / 255.0, (hex & 0xff) / 255.0, a};
}
inline constexpr Colour kInk = rgb(0x1f2328);     // text and axes
inline constexpr Colour kPaper = rgb(0xffffff);

struct Point {
  double x = 0, y = 0;
};
struct Box {
  double x = 0, y = 0, w = 0, h = 0;
  double right() const { return x + w; }
  double bottom() const { return y + h; }
};

struct Stroke {
  Colour colour = kInk;
  double width = 1.0;               // points
  std::vector<double> dash = {};    // on/off lengths in points; empty: solid
};

enum class HAlign { left, centre, right };
enum class VAlign { top, middle, baseline, bottom };

struct TextStyle {
  double size = 9.0;  // points
  bool bold = false;
  bool italic = false;
  Colour colour = kInk;
  HAlign h = HAlign::left;
  VAlign v = VAlign::baseline;
  double angle_deg = 0;  // counter-clockwise rotation about the anchor
  double wrap_width = 0;  // points; 0: one line per explicit line break
};

// An RGBA image (row-major, top row first, 8 bits per channel, straight alpha).
struct Image {
  int width = 0, height = 0;
  std::vector<std::uint8_t> rgba;  // 4 * width * height
};

// Escapes &, <, >, ' and " for Pango markup.
std::string markup_escape(std::string_view text);

class Canvas {
 public:
  // PNG: `png_dpi` sets the pixel size (points × dpi / 72); the background is paper white.
  // PDF: every page has this size; next_page() starts another. `pdf_creation_date` (ISO 8601)
  // goes into the PDF's metadata; nothing is written there when it is empty.
  Canvas(DrawingFormat format, double width_pt, double height_pt, double png_dpi = 150.0,
         const std::string& pdf_creation_date = "");
  ~Canvas();
  Canvas(const Canvas&) = delete;
  Canvas& operator=(const Canvas&) = delete;

  DrawingFormat format() const { return format_; }
  // The drawing's size in points: the canvas' own, or inside a sized group (begin_group with a
  // size) that group's, so a figure lays itself out the same alone and placed on a page.
  double width() const { return sizes_.empty() ? width_ : sizes_.back().first; }
  double height() const { return sizes_.empty() ? height_ : sizes_.back().second; }

  void line(const std::vector<Point>& points, const Stroke& s);
  // Several open polylines stroked as one path (one element in an SVG), e.g. a raster's outline.
  void lines(const std::vector<std::vector<Point>>& polylines, const Stroke& s);
  void polygon(const std::vector<Point>& points, std::optional<Colour> fill, std::optional<Stroke> outline);
  // Several rings filled together with the even-odd rule (polygons with holes).
  void rings(const std::vector<std::vector<Point>>& rings, std::optional<Colour> fill,
             std::optional<Stroke> outline);
  void rectangle(const Box& b, std::optional<Colour> fill, std::optional<Stroke> outline);
  void circle(Point centre, double radius, std::optional<Colour> fill, std::optional<Stroke> outline);
  // Draws `markup` with its anchor at `at`; returns the box it covers (before rotation).
  Box text(Point at, std::string_view markup, const TextStyle& style);
  // The size `markup` would take (w, h in points; x, y = 0).
  Box measure(std::string_view markup, const TextStyle& style);
  // Paints `image` scaled into `into`, each pixel a sharp square (nearest neighbour).
  void image(const Image& image, const Box& into);

  // Draws what follows moved to `origin` and scaled by `scale` (placing a figure on a PDF page)
  // until end_group(). Groups nest.
  void begin_group(Point origin, double scale);
  // The same, for a drawing of its own size (width × height points before scaling): width() and
  // height() give that size until end_group().
  void begin_group(Point origin, double scale, double width, double height);
  void end_group();

  // Clips every following drawing to `b` until unclip().
  void clip(const Box& b);
  void unclip();

  void next_page();  // PDF only
  int pages() const { return pages_; }

  // The finished file's bytes. Ends the drawing: nothing may be drawn afterwards.
  const std::string& finish();
  // finish() and write the bytes to `path` (checked; IoError naming the path).
  void save(const std::filesystem::path& path);

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
  DrawingFormat format_;
  double width_, height_;
  int pages_ = 1;
  std::vector<std::pair<double, double>> sizes_;  // sized groups open (innermost last)
  std::vector<bool> group_sized_;                 // every group open: whether it has a size
};

}  // namespace slipscreen::formats
