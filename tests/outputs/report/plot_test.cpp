#include "outputs/report/plot.hpp"

#include <doctest/doctest.h>

#include "core/util/civil_date.hpp"
#include "outputs/report/colour_ramp.hpp"

using namespace slipscreen::outputs::report;
namespace util = slipscreen::util;

TEST_CASE("linear ticks fall on 1, 2 or 5 times a power of ten inside the range") {
  const auto t = linear_ticks(0.0, 1.0, 5);
  REQUIRE(t.size() == 6);
  CHECK(t.front().value == doctest::Approx(0.0));
  CHECK(t[1].value == doctest::Approx(0.2));
  CHECK(t[1].label == "0.2");
  CHECK(t.back().label == "1.0");
  const auto n = linear_ticks(-3.0, 7.0, 5);
  CHECK(n.front().label == "\u22122");  // typographic minus
  CHECK(linear_ticks(1.0, 1.0).empty());
}

TEST_CASE("log ticks are decades, with 2 and 5 on short ranges") {
  const auto t = log_ticks(0.1, 10.0);
  REQUIRE(t.size() == 7);  // 0.1 0.2 0.5 1 2 5 10
  CHECK(t[3].value == doctest::Approx(1.0));
  CHECK(log_ticks(1e-3, 1e3).size() == 7);
}

TEST_CASE("date ticks are years on long ranges and months on short ones") {
  const double a = static_cast<double>(util::days_from_civil({2012, 3, 1}));
  const double b = static_cast<double>(util::days_from_civil({2031, 1, 1}));
  const auto y = date_ticks(a, b, 5);
  REQUIRE(!y.empty());
  CHECK(y.front().label == "2015");
  CHECK(y.back().label == "2030");
  const auto m = date_ticks(a, a + 200, 7);
  REQUIRE(!m.empty());
  CHECK(m.front().label == "2012-03");
}

TEST_CASE("nice_axis rounds outwards to ticks") {
  const Axis a = nice_axis(0.13, 0.87, "x");
  CHECK(a.lo == doctest::Approx(0.0));
  CHECK(a.hi == doctest::Approx(1.0));
  const Axis l = nice_axis(0.03, 40, "y", AxisKind::log10);
  CHECK(l.lo == doctest::Approx(0.01));
  CHECK(l.hi == doctest::Approx(100));
}

TEST_CASE("the probability ramp runs from viridis' dark blue to its yellow") {
  // End colours of viridis as tabulated by matplotlib 3.6 (reference library).
  const auto lo = ramp_colour(Ramp::probability, 0.0), hi = ramp_colour(Ramp::probability, 1.0);
  CHECK(lo.r * 255 == doctest::Approx(0x44).epsilon(1e-9));
  CHECK(hi.b * 255 == doctest::Approx(0x25).epsilon(1e-9));
  // Perceptually ordered: lightness (Rec. 709 luma as a proxy) increases along the ramp.
  double previous = -1;
  for (int i = 0; i <= 20; ++i) {
    const auto c = ramp_colour(Ramp::pressure, i / 20.0);
    const double luma = -(0.2126 * c.r + 0.7152 * c.g + 0.0722 * c.b);  // pressure ramp runs light to dark
    CHECK(luma >= previous - 1e-12);
    previous = luma;
  }
}

TEST_CASE("a label box lies under its text, padded, and is drawn before it") {
  slipscreen::formats::Canvas c(slipscreen::formats::DrawingFormat::svg, 300, 200);
  const slipscreen::formats::TextStyle st{.size = 7, .bold = true, .v = slipscreen::formats::VAlign::bottom};
  const auto m = c.measure("MW-P1", st);
  const auto box = label_box(c, {100, 80}, "MW-P1", st, 1.5);
  // Left-bottom anchor: the text spans x 100 … 100 + w and y 80 − h … 80 (Canvas::text).
  CHECK(box.x == doctest::Approx(98.5).epsilon(1e-12));
  CHECK(box.y == doctest::Approx(80 - m.h - 1.5).epsilon(1e-12));
  CHECK(box.w == doctest::Approx(m.w + 3).epsilon(1e-12));
  CHECK(box.h == doctest::Approx(m.h + 3).epsilon(1e-12));
  const std::string svg = c.finish();
  const auto fill = svg.find("fill:rgb(100%,100%,100%);fill-opacity:0.85");
  const auto glyph = svg.find("<use xlink:href=\"#glyph");
  REQUIRE(fill != std::string::npos);
  REQUIRE(glyph != std::string::npos);
  CHECK(fill < glyph);  // the box first, the text over it
  slipscreen::formats::Canvas d(slipscreen::formats::DrawingFormat::svg, 300, 200);
  CHECK_THROWS_AS(label_box(d, {0, 0}, "x", {.v = slipscreen::formats::VAlign::baseline}), std::logic_error);
}
