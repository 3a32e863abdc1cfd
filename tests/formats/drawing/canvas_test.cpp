#include "formats/drawing/canvas.hpp"

#include <doctest/doctest.h>
#include <pugixml.hpp>

#include <string>

#include "support/temp_dir.hpp"

using namespace slipscreen::formats;

namespace {
void draw_sample(Canvas& c) {
  c.rectangle({10, 10, 100, 50}, rgb(0x56b4e9), Stroke{.width = 0.5});
  c.line({{10, 80}, {200, 120}, {300, 90}}, {.colour = rgb(0xd55e00), .width = 1.5});
  c.circle({150, 150}, 8, rgb(0x009e73), std::nullopt);
  c.text({20, 200}, "Δp<sub>crit</sub> [MPa] σ′<sub>n</sub> τ", {.size = 10});
}
}  // namespace

TEST_CASE("an SVG drawing is XML of the requested size with one path per stroked line") {
  Canvas c(DrawingFormat::svg, 400, 300);
  c.line({{0, 0}, {10, 10}}, {.width = 2.25});
  c.line({{5, 0}, {15, 10}}, {.width = 2.25});
  const std::string svg = c.finish();
  pugi::xml_document doc;
  REQUIRE(doc.load_string(svg.c_str()));
  const auto root = doc.child("svg");
  REQUIRE(root);
  CHECK(std::string(root.attribute("width").value()) == "400pt");
  CHECK(std::string(root.attribute("height").value()) == "300pt");
  int lines = 0;
  for (auto p : doc.select_nodes("//path"))
    if (std::string(p.node().attribute("style").value()).find("stroke-width:2.25") != std::string::npos) ++lines;
  CHECK(lines == 2);
}

TEST_CASE("a PNG drawing has the PNG signature and the size for its resolution") {
  Canvas c(DrawingFormat::png, 144, 72, 100.0);
  draw_sample(c);
  const std::string png = c.finish();
  REQUIRE(png.size() > 24);
  CHECK(png.substr(1, 3) == "PNG");  // signature \x89PNG (PNG specification, section 5.2)
  // IHDR: width and height big-endian at bytes 16..23.
  auto be32 = [&](std::size_t at) {
    return (static_cast<unsigned>(static_cast<unsigned char>(png[at])) << 24) |
           (static_cast<unsigned>(static_cast<unsigned char>(png[at + 1])) << 16) |
           (static_cast<unsigned>(static_cast<unsigned char>(png[at + 2])) << 8) |
           static_cast<unsigned>(static_cast<unsigned char>(png[at + 3]));
  };
  CHECK(be32(16) == 200u);  // 144 pt at 100 dpi
  CHECK(be32(20) == 100u);
}

TEST_CASE("a PDF drawing has its pages and is the same bytes when drawn twice") {
  auto draw = [] {
    Canvas c(DrawingFormat::pdf, 595, 842);
    draw_sample(c);
    c.next_page();
    draw_sample(c);
    CHECK(c.pages() == 2);
    return std::string(c.finish());
  };
  const std::string a = draw();
  CHECK(a.rfind("%PDF-", 0) == 0);
  CHECK(a == draw());
  CHECK(a.find("/CreationDate") == std::string::npos);
}

TEST_CASE("text is measured and anchored") {
  Canvas c(DrawingFormat::svg, 400, 300);
  const Box m = c.measure("Coulomb", {.size = 10});
  CHECK(m.w > 20);
  CHECK(m.w < 80);
  CHECK(m.h > 8);
  const Box r = c.text({200, 100}, "Coulomb", {.size = 10, .h = HAlign::right, .v = VAlign::top});
  CHECK(r.x == doctest::Approx(200 - m.w).epsilon(1e-9));
  CHECK(r.y == doctest::Approx(100).epsilon(1e-12));
}

TEST_CASE("a layout the canvas keeps gives what a fresh one gives: measured, then drawn, in a scaled group") {
  // The canvas lays a text out once per markup and style; another style is another layout, and a
  // changed transformation lays it out again (Pango's context serial), so nothing drawn changes
  // (a PDF: the same drawing gives the same bytes, unlike an SVG's glyph ids).
  const auto drawing = [](bool measure_first) {
    Canvas c(DrawingFormat::pdf, 400, 300);
    if (measure_first) {
      c.measure("Coulomb Δp<sub>crit</sub>", {.size = 10});
      c.measure("Coulomb Δp<sub>crit</sub>", {.size = 10, .bold = true});
    }
    c.text({20, 40}, "Coulomb Δp<sub>crit</sub>", {.size = 10});
    c.begin_group({50, 100}, 0.5);
    c.text({20, 40}, "Coulomb Δp<sub>crit</sub>", {.size = 10, .angle_deg = 90});
    c.end_group();
    c.text({20, 200}, "Coulomb Δp<sub>crit</sub>", {.size = 10, .bold = true});
    return std::string(c.finish());
  };
  CHECK(drawing(true) == drawing(false));
  Canvas c(DrawingFormat::png, 400, 300);
  const double plain = c.measure("Coulomb", {.size = 10}).w, bold = c.measure("Coulomb", {.size = 10, .bold = true}).w;
  CHECK(bold > plain * 1.02);  // DejaVu Sans Bold is wider (the fonts' advance widths)
  c.begin_group({0, 0}, 0.25);
  CHECK(c.measure("Coulomb", {.size = 10}).w == doctest::Approx(plain).epsilon(1e-6));  // in the group's units
  c.end_group();
}

TEST_CASE("markup_escape makes user text safe for Pango markup") {
  CHECK(markup_escape("a<b & 'c' \"d\">") == "a&lt;b &amp; &apos;c&apos; &quot;d&quot;&gt;");
}

TEST_CASE("save writes the finished bytes") {
  slipscreen::test::TempDir dir("canvas");
  Canvas c(DrawingFormat::svg, 100, 100);
  draw_sample(c);
  c.save(dir.path() / "x.svg");
  CHECK(std::filesystem::file_size(dir.path() / "x.svg") == c.finish().size());
}

TEST_CASE("subscripts are smaller than the text they follow") {
  Canvas c(DrawingFormat::svg, 400, 300);
  const double plain = c.measure("Δpcrit", {.size = 10}).w;
  const double sub = c.measure("Δp<sub>crit</sub>", {.size = 10}).w;
  CHECK(sub < 0.9 * plain);
  CHECK(c.measure("10<sup>3</sup>", {.size = 10}).w < c.measure("103", {.size = 10}).w);
}

TEST_CASE("a sized group gives its own size to what is drawn in it, for a figure placed on a page") {
  Canvas c(DrawingFormat::pdf, 595.0, 842.0);
  CHECK(c.width() == 595.0);
  c.begin_group({50, 60}, 0.9, 480, 320);
  CHECK(c.width() == 480.0);
  CHECK(c.height() == 320.0);
  c.begin_group({0, 0}, 1.0);  // an unsized group inside keeps the figure's size
  CHECK(c.width() == 480.0);
  c.end_group();
  c.end_group();
  CHECK(c.width() == 595.0);
  CHECK(c.height() == 842.0);
  CHECK_THROWS_AS(c.end_group(), std::logic_error);
}
