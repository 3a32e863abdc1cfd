#include "formats/drawing/canvas.hpp"

#include <cairo-pdf.h>
#include <cairo-svg.h>
#include <cairo.h>
#include <pango/pangocairo.h>
#include <png.h>

#include <cmath>
#include <csetjmp>
#include <cstdint>
#include <map>
#include <mutex>
#include <numbers>
#include <tuple>

#include "core/errors.hpp"
#include "formats/files/text_file.hpp"

namespace slipscreen::formats {

// What a text's layout depends on (its colour, vertical anchor and angle only place it).
using LayoutKey = std::tuple<std::string, double, bool, bool, int, double>;

// Text is laid out and drawn by one canvas at a time, in the whole process. Pango and cairo
// share font state between threads (cairo's font faces and glyph caches), and when the report's
// canvases drew text in parallel, a long word in report.pdf broke at a different character in
// about one run in three (measured: 6 of 14 runs of `report` with 3 threads differed; with this
// lock 24 of 24 were identical). The same lock covers what writes glyphs and fonts (a PDF page,
// the end of an SVG or PDF). Paths and images are drawn in parallel still.
static std::mutex& text_mutex() {
  static std::mutex m;
  return m;
}

struct Canvas::Impl {
  cairo_surface_t* surface = nullptr;  // the output surface (SVG, PDF) or the PNG's image
  cairo_t* cr = nullptr;
  std::string bytes;
  bool finished = false;
  // One Pango context per canvas, on the drawing thread's default font map (pango_cairo keeps one
  // per thread), and the layouts made on it: a text measured and then drawn, or drawn again, is
  // laid out once. Pango lays a layout out again by itself when the context changes (another
  // transformation), so a kept layout is never stale.
  PangoContext* context = nullptr;
  std::map<LayoutKey, PangoLayout*> layouts;

  ~Impl() {
    {
      const std::lock_guard lock(text_mutex());
      for (auto& [key, layout] : layouts) g_object_unref(layout);
      if (context) g_object_unref(context);
    }
    if (cr) cairo_destroy(cr);
    if (surface) cairo_surface_destroy(surface);
  }

  static cairo_status_t append(void* closure, const unsigned char* data, unsigned int length) {
    static_cast<Impl*>(closure)->bytes.append(reinterpret_cast<const char*>(data), length);
    return CAIRO_STATUS_SUCCESS;
  }

  void check(const char* what) const {
    const cairo_status_t s = cr ? cairo_status(cr) : cairo_surface_status(surface);
    if (s != CAIRO_STATUS_SUCCESS)
      throw IoError(std::string("drawing failed while ") + what + ": " + cairo_status_to_string(s));
  }
  void alive() const {
    if (finished) throw std::logic_error("Canvas: drawing after finish()");
  }
  // The layout of `markup` in `style` (owned by the canvas).
  PangoLayout* layout(std::string_view markup, const TextStyle& style);
};

namespace {

void set_colour(cairo_t* cr, const Colour& c) { cairo_set_source_rgba(cr, c.r, c.g, c.b, c.a); }

void set_stroke(cairo_t* cr, const Stroke& s) {
  set_colour(cr, s.colour);
  cairo_set_line_width(cr, s.width);
  cairo_set_line_join(cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap(cr, CAIRO_LINE_CAP_BUTT);
  cairo_set_dash(cr, s.dash.empty() ? nullptr : s.dash.data(), static_cast<int>(s.dash.size()), 0);
}

void fill_and_outline(cairo_t* cr, const std::optional<Colour>& fill, const std::optional<Stroke>& outline) {
  if (fill) {
    set_colour(cr, *fill);
    if (outline) cairo_fill_preserve(cr); else cairo_fill(cr);
  }
  if (outline) {
    set_stroke(cr, *outline);
    cairo_stroke(cr);
  }
  cairo_new_path(cr);
}

void trace(cairo_t* cr, const std::vector<Point>& points) {
  for (std::size_t i = 0; i < points.size(); ++i)
    if (i == 0) cairo_move_to(cr, points[i].x, points[i].y); else cairo_line_to(cr, points[i].x, points[i].y);
}

// <sub> and <sup> as explicit spans: Pango 1.50's own subscript scaling enlarges the text on
// layouts whose size is given in points (seen with Debian 12's 1.50.12), so the size (70 %) and
// the baseline shift (a quarter and a third of the font size) are spelt out in Pango units.
std::string explicit_scripts(std::string_view markup, double size_pt) {
  const int small = static_cast<int>(0.7 * size_pt * PANGO_SCALE);
  const std::string sub = "<span size=\"" + std::to_string(small) + "\" rise=\"" +
                          std::to_string(-static_cast<int>(0.25 * size_pt * PANGO_SCALE)) + "\">";
  const std::string sup = "<span size=\"" + std::to_string(small) + "\" rise=\"" +
                          std::to_string(static_cast<int>(0.35 * size_pt * PANGO_SCALE)) + "\">";
  std::string out;
  out.reserve(markup.size() + 64);
  for (std::size_t i = 0; i < markup.size();) {
    auto at = [&](std::string_view tag) { return markup.substr(i, tag.size()) == tag; };
    if (at("<sub>")) { out += sub; i += 5; }
    else if (at("<sup>")) { out += sup; i += 5; }
    else if (at("</sub>") || at("</sup>")) { out += "</span>"; i += 6; }
    else out += markup[i++];
  }
  return out;
}

// The canvas's Pango context, made on first use: metrics independent of the surface's hinting,
// so SVG, PNG and PDF lay text out alike, and 72 dpi, so that a point of font size is one unit
// of the canvas (relative markup, <sub>, <small>, then scales from the given size).
PangoContext* canvas_context(cairo_t* cr, PangoContext*& context) {
  if (!context) {
    context = pango_cairo_create_context(cr);
    cairo_font_options_t* options = cairo_font_options_create();
    cairo_font_options_set_hint_metrics(options, CAIRO_HINT_METRICS_OFF);
    cairo_font_options_set_hint_style(options, CAIRO_HINT_STYLE_NONE);
    pango_cairo_context_set_font_options(context, options);
    cairo_font_options_destroy(options);
    pango_cairo_context_set_resolution(context, 72.0);
  }
  pango_cairo_update_context(cr, context);  // the current transformation and surface
  return context;
}

// A new Pango layout for `markup` on `context`; the caller unrefs it.
PangoLayout* make_layout(PangoContext* context, std::string_view markup, const TextStyle& st) {
  PangoLayout* layout = pango_layout_new(context);
  PangoFontDescription* font = pango_font_description_new();
  pango_font_description_set_family(font, "DejaVu Sans");
  pango_font_description_set_size(font, static_cast<int>(st.size * PANGO_SCALE));
  pango_font_description_set_weight(font, st.bold ? PANGO_WEIGHT_BOLD : PANGO_WEIGHT_NORMAL);
  pango_font_description_set_style(font, st.italic ? PANGO_STYLE_ITALIC : PANGO_STYLE_NORMAL);
  pango_layout_set_font_description(layout, font);
  pango_font_description_free(font);
  if (st.wrap_width > 0) {
    pango_layout_set_width(layout, static_cast<int>(st.wrap_width * PANGO_SCALE));
    pango_layout_set_wrap(layout, PANGO_WRAP_WORD_CHAR);
  }
  pango_layout_set_alignment(layout, st.h == HAlign::centre  ? PANGO_ALIGN_CENTER
                                     : st.h == HAlign::right ? PANGO_ALIGN_RIGHT
                                                             : PANGO_ALIGN_LEFT);
  GError* error = nullptr;
  const std::string text = explicit_scripts(markup, st.size);
  if (!pango_parse_markup(text.c_str(), -1, 0, nullptr, nullptr, nullptr, &error)) {
    const std::string why = error ? error->message : "unknown";
    if (error) g_error_free(error);
    g_object_unref(layout);
    // Markup is built by the program from escaped text: a parse failure is a bug, not bad input.
    throw std::logic_error("figure text is not valid Pango markup (" + why + "): " + text);
  }
  pango_layout_set_markup(layout, text.c_str(), -1);
  return layout;
}

}  // namespace

PangoLayout* Canvas::Impl::layout(std::string_view markup, const TextStyle& st) {
  PangoContext* ctx = canvas_context(cr, context);
  LayoutKey key{std::string(markup), st.size, st.bold, st.italic, static_cast<int>(st.h), st.wrap_width};
  if (const auto it = layouts.find(key); it != layouts.end()) return it->second;
  if (layouts.size() >= 256) {  // a bound on what a canvas keeps; texts rarely repeat past this
    for (auto& [k, l] : layouts) g_object_unref(l);
    layouts.clear();
  }
  PangoLayout* made = make_layout(ctx, markup, st);
  layouts.emplace(std::move(key), made);
  return made;
}

std::string markup_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '\'': out += "&apos;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

Canvas::Canvas(DrawingFormat format, double width_pt, double height_pt, double png_dpi,
               const std::string& pdf_creation_date)
    : impl_(std::make_unique<Impl>()), format_(format), width_(width_pt), height_(height_pt) {
  if (!(width_pt > 0 && height_pt > 0 && width_pt < 1e5 && height_pt < 1e5))
    throw std::logic_error("Canvas: size out of range");
  switch (format) {
    case DrawingFormat::svg:
      impl_->surface = cairo_svg_surface_create_for_stream(&Impl::append, impl_.get(), width_pt, height_pt);
      if (cairo_surface_status(impl_->surface) == CAIRO_STATUS_SUCCESS) {
        cairo_svg_surface_restrict_to_version(impl_->surface, CAIRO_SVG_VERSION_1_1);
        cairo_svg_surface_set_document_unit(impl_->surface, CAIRO_SVG_UNIT_PT);
      }
      break;
    case DrawingFormat::pdf:
      impl_->surface = cairo_pdf_surface_create_for_stream(&Impl::append, impl_.get(), width_pt, height_pt);
      if (cairo_surface_status(impl_->surface) == CAIRO_STATUS_SUCCESS) {
        // Cairo stamps the current time unless told otherwise; an empty date keeps files reproducible.
        cairo_pdf_surface_set_metadata(impl_->surface, CAIRO_PDF_METADATA_CREATE_DATE, pdf_creation_date.c_str());
        cairo_pdf_surface_set_metadata(impl_->surface, CAIRO_PDF_METADATA_CREATOR, "slipscreen");
      }
      break;
    case DrawingFormat::png: {
      const double scale = png_dpi / 72.0;
      const int w = static_cast<int>(std::ceil(width_pt * scale));
      const int h = static_cast<int>(std::ceil(height_pt * scale));
      impl_->surface = cairo_image_surface_create(CAIRO_FORMAT_ARGB32, w, h);
      impl_->cr = cairo_create(impl_->surface);
      impl_->check("creating the PNG image");
      cairo_set_source_rgb(impl_->cr, 1, 1, 1);
      cairo_paint(impl_->cr);
      cairo_scale(impl_->cr, scale, scale);
      break;
    }
  }
  if (!impl_->cr) {
    impl_->check("creating the drawing surface");
    impl_->cr = cairo_create(impl_->surface);
  }
  impl_->check("starting the drawing");
}

Canvas::~Canvas() = default;

void Canvas::line(const std::vector<Point>& points, const Stroke& s) {
  impl_->alive();
  if (points.size() < 2) return;
  trace(impl_->cr, points);
  fill_and_outline(impl_->cr, std::nullopt, s);
}

void Canvas::lines(const std::vector<std::vector<Point>>& polylines, const Stroke& s) {
  impl_->alive();
  bool any = false;
  for (const auto& p : polylines)
    if (p.size() >= 2) trace(impl_->cr, p), any = true;
  if (any) fill_and_outline(impl_->cr, std::nullopt, s);
}

void Canvas::polygon(const std::vector<Point>& points, std::optional<Colour> fill, std::optional<Stroke> outline) {
  rings({points}, fill, outline);
}

void Canvas::rings(const std::vector<std::vector<Point>>& rings, std::optional<Colour> fill,
                   std::optional<Stroke> outline) {
  impl_->alive();
  cairo_set_fill_rule(impl_->cr, CAIRO_FILL_RULE_EVEN_ODD);
  for (const auto& r : rings) {
    if (r.size() < 3) continue;
    trace(impl_->cr, r);
    cairo_close_path(impl_->cr);
  }
  fill_and_outline(impl_->cr, fill, outline);
}

void Canvas::rectangle(const Box& b, std::optional<Colour> fill, std::optional<Stroke> outline) {
  impl_->alive();
  cairo_rectangle(impl_->cr, b.x, b.y, b.w, b.h);
  fill_and_outline(impl_->cr, fill, outline);
}

void Canvas::circle(Point centre, double radius, std::optional<Colour> fill, std::optional<Stroke> outline) {
  impl_->alive();
  cairo_new_sub_path(impl_->cr);
  cairo_arc(impl_->cr, centre.x, centre.y, radius, 0, 2 * std::numbers::pi);
  fill_and_outline(impl_->cr, fill, outline);
}

Box Canvas::measure(std::string_view markup, const TextStyle& style) {
  impl_->alive();
  const std::lock_guard lock(text_mutex());
  PangoLayout* layout = impl_->layout(markup, style);
  PangoRectangle logical;
  pango_layout_get_extents(layout, nullptr, &logical);
  return {0, 0, static_cast<double>(logical.width) / PANGO_SCALE, static_cast<double>(logical.height) / PANGO_SCALE};
}

Box Canvas::text(Point at, std::string_view markup, const TextStyle& style) {
  impl_->alive();
  const std::lock_guard lock(text_mutex());
  cairo_t* cr = impl_->cr;
  PangoLayout* layout = impl_->layout(markup, style);
  PangoRectangle logical;
  pango_layout_get_extents(layout, nullptr, &logical);
  const double w = static_cast<double>(logical.width) / PANGO_SCALE;
  const double h = static_cast<double>(logical.height) / PANGO_SCALE;
  const double baseline = static_cast<double>(pango_layout_get_baseline(layout)) / PANGO_SCALE;
  const double box_w = style.wrap_width > 0 ? style.wrap_width : w;
  double dx = style.h == HAlign::left ? 0 : style.h == HAlign::centre ? -box_w / 2 : -box_w;
  double dy = 0;
  switch (style.v) {
    case VAlign::top: dy = 0; break;
    case VAlign::middle: dy = -h / 2; break;
    case VAlign::baseline: dy = -baseline; break;
    case VAlign::bottom: dy = -h; break;
  }
  cairo_save(cr);
  cairo_translate(cr, at.x, at.y);
  if (style.angle_deg != 0) cairo_rotate(cr, -style.angle_deg * std::numbers::pi / 180.0);
  cairo_move_to(cr, dx, dy);
  set_colour(cr, style.colour);
  pango_cairo_show_layout(cr, layout);
  cairo_restore(cr);
  impl_->check("drawing text");
  return {at.x + dx, at.y + dy, box_w, h};
}

void Canvas::image(const Image& img, const Box& into) {
  impl_->alive();
  if (img.width <= 0 || img.height <= 0 ||
      img.rgba.size() != 4u * static_cast<std::size_t>(img.width) * static_cast<std::size_t>(img.height))
    throw std::logic_error("Canvas::image: size does not match the pixels");
  cairo_surface_t* s = cairo_image_surface_create(CAIRO_FORMAT_ARGB32, img.width, img.height);
  if (cairo_surface_status(s) != CAIRO_STATUS_SUCCESS) {
    cairo_surface_destroy(s);
    throw IoError("drawing failed: could not hold an image of " + std::to_string(img.width) + " x " +
                  std::to_string(img.height) + " pixels");
  }
  cairo_surface_flush(s);
  unsigned char* data = cairo_image_surface_get_data(s);
  const int stride = cairo_image_surface_get_stride(s);
  for (int row = 0; row < img.height; ++row) {
    auto* out = reinterpret_cast<std::uint32_t*>(data + static_cast<std::ptrdiff_t>(row) * stride);
    for (int col = 0; col < img.width; ++col) {
      const std::size_t i = 4u * (static_cast<std::size_t>(row) * img.width + col);
      const unsigned a = img.rgba[i + 3];
      auto pre = [a](unsigned c) { return (c * a + 127u) / 255u; };  // Cairo stores premultiplied alpha
      out[col] = (a << 24) | (pre(img.rgba[i]) << 16) | (pre(img.rgba[i + 1]) << 8) | pre(img.rgba[i + 2]);
    }
  }
  cairo_surface_mark_dirty(s);
  cairo_t* cr = impl_->cr;
  cairo_save(cr);
  cairo_rectangle(cr, into.x, into.y, into.w, into.h);
  cairo_clip(cr);
  cairo_translate(cr, into.x, into.y);
  cairo_scale(cr, into.w / img.width, into.h / img.height);
  cairo_set_source_surface(cr, s, 0, 0);
  cairo_pattern_set_filter(cairo_get_source(cr), CAIRO_FILTER_NEAREST);
  cairo_paint(cr);
  cairo_restore(cr);
  cairo_surface_destroy(s);
  impl_->check("drawing an image");
}

void Canvas::begin_group(Point origin, double scale) {
  impl_->alive();
  cairo_save(impl_->cr);
  cairo_translate(impl_->cr, origin.x, origin.y);
  cairo_scale(impl_->cr, scale, scale);
  group_sized_.push_back(false);
}

void Canvas::begin_group(Point origin, double scale, double width, double height) {
  if (!(width > 0 && height > 0)) throw std::logic_error("Canvas::begin_group: size out of range");
  begin_group(origin, scale);
  group_sized_.back() = true;
  sizes_.emplace_back(width, height);
}

void Canvas::end_group() {
  impl_->alive();
  if (group_sized_.empty()) throw std::logic_error("Canvas::end_group without begin_group");
  if (group_sized_.back()) sizes_.pop_back();
  group_sized_.pop_back();
  cairo_restore(impl_->cr);
}

void Canvas::clip(const Box& b) {
  impl_->alive();
  cairo_save(impl_->cr);
  cairo_rectangle(impl_->cr, b.x, b.y, b.w, b.h);
  cairo_clip(impl_->cr);
}

void Canvas::unclip() {
  impl_->alive();
  cairo_restore(impl_->cr);
}

void Canvas::next_page() {
  impl_->alive();
  if (format_ != DrawingFormat::pdf) throw std::logic_error("Canvas::next_page: only a PDF has pages");
  {
    const std::lock_guard lock(text_mutex());  // the page's fonts
    cairo_show_page(impl_->cr);
  }
  ++pages_;
  impl_->check("starting a new page");
}

namespace {

void png_append(png_structp png, png_bytep data, png_size_t length) {
  static_cast<std::string*>(png_get_io_ptr(png))->append(reinterpret_cast<const char*>(data), length);
}
void png_flush(png_structp) {}

// Writes Cairo's ARGB32 image (premultiplied, native-endian words) as an 8-bit PNG: RGB when
// every pixel is opaque (a figure on paper white), else RGBA with straight alpha. libpng at
// compression level 1, unfiltered (on the demo's figures smaller and faster than the Sub filter:
// flat colour repeats as it is): the pixels are those Cairo's own writer stores, at a
// fraction of its time (the report's PNGs are many and mostly flat colour; docs/report.md, "Speed").
// Only plain data lives in this frame, so that libpng's longjmp on an error skips no destructor.
bool encode_png(png_structp png, png_infop info, const unsigned char* data, int w, int h, int stride, bool opaque,
                unsigned char* row) {
  if (setjmp(png_jmpbuf(png))) return false;
  png_set_IHDR(png, info, static_cast<png_uint_32>(w), static_cast<png_uint_32>(h), 8,
               opaque ? PNG_COLOR_TYPE_RGB : PNG_COLOR_TYPE_RGB_ALPHA, PNG_INTERLACE_NONE, PNG_COMPRESSION_TYPE_DEFAULT,
               PNG_FILTER_TYPE_DEFAULT);
  png_set_compression_level(png, 1);
  png_set_filter(png, PNG_FILTER_TYPE_BASE, PNG_FILTER_NONE);
  png_write_info(png, info);
  for (int y = 0; y < h; ++y) {
    const auto* px = reinterpret_cast<const std::uint32_t*>(data + static_cast<std::size_t>(y) * stride);
    unsigned char* out = row;
    for (int x = 0; x < w; ++x) {
      const std::uint32_t p = px[x];
      const unsigned a = p >> 24, r = (p >> 16) & 0xff, g = (p >> 8) & 0xff, b = p & 0xff;
      if (opaque) {
        *out++ = static_cast<unsigned char>(r), *out++ = static_cast<unsigned char>(g), *out++ = static_cast<unsigned char>(b);
      } else if (a == 0) {
        *out++ = 0, *out++ = 0, *out++ = 0, *out++ = 0;
      } else {  // un-premultiplied, rounded as Cairo's writer does
        *out++ = static_cast<unsigned char>((r * 255 + a / 2) / a);
        *out++ = static_cast<unsigned char>((g * 255 + a / 2) / a);
        *out++ = static_cast<unsigned char>((b * 255 + a / 2) / a);
        *out++ = static_cast<unsigned char>(a);
      }
    }
    png_write_row(png, row);
  }
  png_write_end(png, info);
  return true;
}

}  // namespace

const std::string& Canvas::finish() {
  if (impl_->finished) return impl_->bytes;
  impl_->check("finishing the drawing");
  cairo_destroy(impl_->cr);
  impl_->cr = nullptr;
  if (format_ == DrawingFormat::png) {
    cairo_surface_flush(impl_->surface);
    const unsigned char* data = cairo_image_surface_get_data(impl_->surface);
    const int w = cairo_image_surface_get_width(impl_->surface), h = cairo_image_surface_get_height(impl_->surface);
    const int stride = cairo_image_surface_get_stride(impl_->surface);
    bool opaque = true;
    for (int y = 0; y < h && opaque; ++y) {
      const auto* px = reinterpret_cast<const std::uint32_t*>(data + static_cast<std::size_t>(y) * stride);
      for (int x = 0; x < w && opaque; ++x) opaque = (px[x] >> 24) == 0xff;
    }
    png_structp png = png_create_write_struct(PNG_LIBPNG_VER_STRING, nullptr, nullptr, nullptr);
    png_infop info = png ? png_create_info_struct(png) : nullptr;
    std::vector<unsigned char> row(static_cast<std::size_t>(w) * 4);
    bool ok = false;
    if (png && info) {
      png_set_write_fn(png, &impl_->bytes, &png_append, &png_flush);
      ok = encode_png(png, info, data, w, h, stride, opaque, row.data());
    }
    png_destroy_write_struct(&png, &info);
    if (!ok) {
      impl_->bytes.clear();
      throw IoError("PNG encoding failed (libpng)");
    }
  } else {
    const std::lock_guard lock(text_mutex());  // SVG and PDF write their glyphs and font subsets here
    cairo_surface_finish(impl_->surface);
    impl_->check("writing the drawing");
  }
  impl_->finished = true;
  return impl_->bytes;
}

void Canvas::save(const std::filesystem::path& path) { write_text_file(path, finish()); }

}  // namespace slipscreen::formats
