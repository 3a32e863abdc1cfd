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
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::outputs::report;
using slipscreen::test::FigureRows;
using slipscreen::test::Rows;

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

// The text of report.pdf by poppler's pdftotext (a general-purpose reader of the PDF), words
// separated by single spaces.
std::string pdf_words(const fs::path& pdf) {
  const std::string cmd = "pdftotext -layout '" + pdf.string() + "' -";
  FILE* p = ::popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  std::string text;
  char buf[4096];
  while (std::size_t n = std::fread(buf, 1, sizeof buf, p)) text.append(buf, n);
  REQUIRE(::pclose(p) == 0);
  std::string flat;
  for (char c : text) {
    const bool space = c == ' ' || c == '\n' || c == '\t' || c == '\f' || c == '\r';
    if (space && (flat.empty() || flat.back() == ' ')) continue;
    flat += space ? ' ' : c;
  }
  return flat;
}

// A figure's rows against the run table they come from: for each (segment_id, date) of the
// figure, the table's row with the same cells gives the same text in every `columns` pair
// (figure column, table column).
void check_rows(const Figure& f, const Rows& table, const std::vector<std::pair<std::string, std::string>>& columns) {
  const FigureRows d{f.data};
  REQUIRE(!f.data.rows.empty());
  for (std::size_t i = 0; i < f.data.rows.size(); ++i) {
    std::optional<std::size_t> row;
    for (std::size_t r = 0; r < table.size() && !row; ++r)
      if (table.at(r, "segment_id") == d.at(i, "segment_id") && table.at(r, "date") == d.at(i, "date")) row = r;
    REQUIRE(row.has_value());
    for (const auto& [fc, tc] : columns) CHECK(d.at(i, fc) == table.at(*row, tc));
  }
}

}  // namespace

TEST_CASE("faults in depth in the report: figures from fault_depth*.csv, the section found by pdftotext") {
  const test::TempDir dir("depth-report");
  const fs::path data = fs::path(SLIPSCREEN_TEST_DATA) / "scenario" / "poro3d";
  for (const bool uncertain : {true, false}) {
    CAPTURE(uncertain);
    const fs::path out = dir.path() / (uncertain ? "mc" : "det");
    const scenario::ResolvedScenario s =
        scenario::load_scenario(data / (uncertain ? "physics16_depth.toml" : "physics16_depth_deterministic.toml"));
    run::run_scenario(s, test::options_into(out));
    const ReportSource src = test::source_of(out);
    const std::vector<Figure> figures = depth_figures(src);
    REQUIRE(figures.size() == (uncertain ? 2u : 1u));
    const Rows depth = test::read_rows(out, "fault_depth.csv");
    // the margin figure: the table's margins and depths, the segments ranked as the report says
    CHECK(figures[0].name == "depth_coulomb_margin");
    check_rows(figures[0], depth, {{"coulomb_margin_MPa", "coulomb_margin_MPa"}, {"depth_m", "depth_m"}});
    const DepthTop top = depth_top_segments(src, 5);
    REQUIRE(top.segments.size() == 5);  // the fixture's 5 segments
    CHECK(top.probabilistic == uncertain);
    std::string last;
    if (uncertain) {
      CHECK(figures[1].name == "depth_slip_probability");
      const Rows prob = test::read_rows(out, "fault_depth_probability.csv");
      check_rows(figures[1], prob, {{"p_slip", "p_slip"}, {"p_slip_ci_low", "p_slip_ci_low"}, {"p_slip_ci_high", "p_slip_ci_high"}});
      // ranked by P(slip) at the last date, highest first
      for (std::size_t i = 0; i < prob.size(); ++i) last = std::max(last, prob.at(i, "date"));
      for (std::size_t i = 1; i < top.segments.size(); ++i)
        CHECK(prob.number(top.segments[i - 1].probability_row, "p_slip") >= prob.number(top.segments[i].probability_row, "p_slip"));
    } else {
      for (std::size_t i = 1; i < top.segments.size(); ++i)
        CHECK(depth.number(top.segments[i - 1].closest_row, "coulomb_margin_MPa") <=
              depth.number(top.segments[i].closest_row, "coulomb_margin_MPa"));
    }
    // the fixture's top segment crosses (not vacuous): the crossing's depth is one of the depth
    // levels of regions/corran (2.1, 3.1 and 4.1 km) and its ΔCFF positive
    const std::size_t r0 = top.segments.front().closest_row;
    REQUIRE(!depth.at(r0, "first_crossing_date").empty());
    const double z = depth.number(r0, "first_crossing_depth_m");
    CHECK((z == 2100.0 || z == 3100.0 || z == 4100.0));
    CHECK(depth.number(r0, "first_crossing_dcff_MPa") > 0.0);
    // what a reader of report.pdf sees (pdftotext): the section and the top segment's row with
    // the tables' own text
    const std::string words = pdf_words(out / "report.pdf");
    const auto at = words.find("Faults in depth The 3-D poroelastic model");
    REQUIRE(at != std::string::npos);
    const std::string section = words.substr(at, words.find("Figures", at) - at);
    std::string row = top.segments.front().segment_id + " " + top.segments.front().fault_id + " ";
    if (uncertain) {
      const Rows prob = test::read_rows(out, "fault_depth_probability.csv");
      const std::size_t q = top.segments.front().probability_row;
      CHECK(section.find("P(slip by " + last + ")") != std::string::npos);
      row += prob.at(q, "p_slip") + " (" + prob.at(q, "p_slip_ci_low") + " – " + prob.at(q, "p_slip_ci_high") + ") ";
    }
    row += depth.at(r0, "first_crossing_date") + " " + depth.at(r0, "first_crossing_depth_m") + " " +
           depth.at(r0, "first_crossing_dcff_MPa") + " " + depth.at(r0, "coulomb_margin_MPa");
    CAPTURE(section);
    CHECK(section.find(row) != std::string::npos);
    // the caution is the report's (once at the top), not repeated by the section
    CHECK(section.find("Screening estimate from simplified physics") == std::string::npos);
    CHECK(words.find("Screening estimate from simplified physics") < words.find("Faults in depth"));
  }
}

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
