// The figures of faults in depth and docs/physics.md's comparison figure against the tables they
// are drawn from.
//
// With SLIPSCREEN_COMPARISON_FIGURE=<folder> the comparison figure is written there as
// model_comparison.svg and .png (docs/physics/ holds the committed ones):
//   SLIPSCREEN_COMPARISON_FIGURE=docs/physics build/test_outputs -tc='model comparison figure*'
#include "outputs/report/depth_figures.hpp"

#include <doctest/doctest.h>

#include <cairo.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>

#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "outputs/report/colour_ramp.hpp"
#include "outputs/report/figure_checks.hpp"
#include "outputs/report/run_table.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::outputs::report;
using slipscreen::test::FigureRows;

namespace {

// Writes the figure's SVG and PNG into `dir` (not its data CSV: the comparison's data is the
// table it is drawn from).
void write_drawings(const Figure& f, const fs::path& dir) {
  formats::write_text_file(dir / (f.name + ".svg"), figure_svg(f));
  formats::Canvas png(formats::DrawingFormat::png, f.width, f.height, 150.0);
  f.draw(png);
  png.save(dir / (f.name + ".png"));
}

// Pixels of a PNG (read back by Cairo) within `tol` of `colour` in every channel, and those that
// are not paper white.
struct PixelCounts {
  int width = 0, height = 0;
  long not_white = 0;
  std::vector<long> of_colour;
};

PixelCounts count_pixels(const fs::path& png, const std::vector<formats::Colour>& colours, double tol) {
  cairo_surface_t* s = cairo_image_surface_create_from_png(png.string().c_str());
  REQUIRE(cairo_surface_status(s) == CAIRO_STATUS_SUCCESS);
  PixelCounts out;
  out.width = cairo_image_surface_get_width(s);
  out.height = cairo_image_surface_get_height(s);
  out.of_colour.assign(colours.size(), 0);
  const int stride = cairo_image_surface_get_stride(s);
  const unsigned char* data = cairo_image_surface_get_data(s);
  REQUIRE(cairo_image_surface_get_format(s) != CAIRO_FORMAT_INVALID);
  for (int y = 0; y < out.height; ++y)
    for (int x = 0; x < out.width; ++x) {
      // CAIRO_FORMAT_RGB24 / ARGB32: native-endian 32-bit words 0xAARRGGBB (opaque here)
      const auto word = *reinterpret_cast<const std::uint32_t*>(data + y * stride + 4 * x);
      const double r = ((word >> 16) & 0xff) / 255.0, g = ((word >> 8) & 0xff) / 255.0, b = (word & 0xff) / 255.0;
      if (r < 0.98 || g < 0.98 || b < 0.98) ++out.not_white;
      for (std::size_t i = 0; i < colours.size(); ++i)
        if (std::fabs(r - colours[i].r) <= tol && std::fabs(g - colours[i].g) <= tol && std::fabs(b - colours[i].b) <= tol)
          ++out.of_colour[i];
    }
  cairo_surface_destroy(s);
  return out;
}

}  // namespace

TEST_CASE("model comparison figure: drawn from docs/physics/model_comparison.csv, its numbers the table's") {
  const fs::path docs = fs::path(SLIPSCREEN_SOURCE_DIR) / "docs" / "physics";
  const RunTable t = RunTable::read(docs, "model_comparison.csv");
  const Figure f = model_comparison_figure(t);
  // the figure's numbers are the table's text, row for row (read here by the plain CSV reader)
  const formats::CsvTable csv = formats::read_csv(docs / "model_comparison.csv", "model_comparison.csv");
  REQUIRE(f.data.rows.size() == csv.rows.size());
  REQUIRE(csv.rows.size() >= 20);
  const FigureRows d{f.data};
  for (const char* column : {"time_days", "dp_theis", "dp_leaky", "dp_3d", "dcff_theis", "dcff_leaky", "dcff_3d"}) {
    const auto c = csv.column(column);
    REQUIRE(c.has_value());
    for (std::size_t r = 0; r < csv.rows.size(); ++r) CHECK(d.at(r, column) == csv.rows[r].fields[*c]);
  }
  // drawn and not blank: the PNG, read back by Cairo, has its size (points × 150/72), a share of
  // ink, and pixels of each model's line colour (Theis, leaky, 3-D: category colours 0, 1, 2)
  const fs::path dir = fs::temp_directory_path() / "slipscreen-model-comparison-test";
  fs::create_directories(dir);
  write_drawings(f, dir);
  const PixelCounts px = count_pixels(dir / "model_comparison.png", {category_colour(0), category_colour(1), category_colour(2)}, 0.02);
  CHECK(std::abs(px.width - static_cast<int>(std::lround(f.width * 150.0 / 72.0))) <= 1);  // Canvas rounds up
  CHECK(std::abs(px.height - static_cast<int>(std::lround(f.height * 150.0 / 72.0))) <= 1);
  CHECK(px.not_white > px.width * px.height / 50);  // more than 2 % ink (axes, text, lines)
  for (std::size_t i = 0; i < 3; ++i) {
    CAPTURE(i);
    CHECK(px.of_colour[i] > 200);  // each model's lines, in both panels
  }
  pugi::xml_document svg;
  test::parse_svg(f, svg);
  fs::remove_all(dir);
  if (const char* out = std::getenv("SLIPSCREEN_COMPARISON_FIGURE")) write_drawings(f, out);
}
