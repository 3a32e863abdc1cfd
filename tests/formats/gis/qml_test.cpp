// QGIS style documents (formats/gis/qml.cpp) parsed back with pugixml: well-formed XML with the
// elements and attributes QGIS 3 reads (the headless QGIS check, tests/outputs/
// open_outputs_in_qgis.py, loads the run's styles in QGIS itself).
#include "formats/gis/qml.hpp"

#include <doctest/doctest.h>

#include <pugixml.hpp>
#include <string>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::formats;

namespace {

pugi::xml_document parse(const std::string& text) {
  pugi::xml_document doc;
  const auto r = doc.load_string(text.c_str());
  REQUIRE_MESSAGE(r, r.description());
  return doc;
}

SymbolLook look(const char* hex, double size) {
  SymbolLook l;
  l.colour = rgb_from_hex(hex);
  l.size_mm = size;
  return l;
}

}  // namespace

TEST_CASE("a graduated line style: ranges, symbols with both property forms, aliases, time, escaping") {
  VectorStyle s;
  s.symbol = SymbolKind::line;
  s.renderer = VectorRenderer::graduated_colour;
  s.attribute = "p_slip";
  SymbolLook cased = look("#440154", 0.9);
  cased.casing_mm = 0.4;
  s.ranges = {{0.0, 0.01, "≤ 1 % & <low>", cased}, {0.01, 1.0, "> 1 %", look("#fde725", 0.9)}};
  s.aliases = {{"dp_MPa", "Δp (MPa)"}};
  s.temporal = TemporalFields{"date", "valid_until"};
  const auto doc = parse(vector_style_qml(s));
  const auto qgis = doc.child("qgis");
  REQUIRE(qgis);
  CHECK(std::string(qgis.attribute("styleCategories").value()) == "AllStyleCategories");
  const auto t = qgis.child("temporal");
  CHECK(t.attribute("enabled").as_int() == 1);
  CHECK(t.attribute("mode").as_int() == 2);  // start and end from fields
  CHECK(std::string(t.attribute("startField").value()) == "date");
  CHECK(std::string(t.attribute("endField").value()) == "valid_until");
  const auto r = qgis.child("renderer-v2");
  CHECK(std::string(r.attribute("type").value()) == "graduatedSymbol");
  CHECK(std::string(r.attribute("attr").value()) == "p_slip");
  CHECK(std::string(r.attribute("graduatedMethod").value()) == "GraduatedColor");
  auto range = r.child("ranges").child("range");
  CHECK(range.attribute("lower").as_double() == 0.0);
  CHECK(range.attribute("upper").as_double() == 0.01);
  CHECK(std::string(range.attribute("label").value()) == "≤ 1 % & <low>");  // escaped and read back
  CHECK(std::string(range.attribute("symbol").value()) == "0");
  CHECK(std::string(range.next_sibling("range").attribute("symbol").value()) == "1");
  const auto symbol = r.child("symbols").find_child_by_attribute("symbol", "name", "0");
  REQUIRE(symbol);
  CHECK(std::string(symbol.attribute("type").value()) == "line");
  // The casing first (dark, wider), then the coloured line.
  const auto casing = symbol.child("layer");
  const auto top = casing.next_sibling("layer");
  REQUIRE(top);
  const auto option = [](pugi::xml_node layer, const char* name) {
    return std::string(layer.child("Option").find_child_by_attribute("Option", "name", name).attribute("value").value());
  };
  const auto prop = [](pugi::xml_node layer, const char* name) {
    return std::string(layer.find_child_by_attribute("prop", "k", name).attribute("v").value());
  };
  CHECK(option(top, "line_color") == "68,1,84,255");  // #440154
  CHECK(prop(top, "line_color") == "68,1,84,255");
  CHECK(option(top, "line_width") == "0.9");
  CHECK(option(casing, "line_width") == "1.3");
  CHECK(option(casing, "line_color") == "35,35,35,255");
  const auto alias = qgis.child("aliases").child("alias");
  CHECK(std::string(alias.attribute("field").value()) == "dp_MPa");
  CHECK(std::string(alias.attribute("name").value()) == "Δp (MPa)");
}

TEST_CASE("categorized markers, single fills and a discrete raster ramp") {
  VectorStyle c;
  c.symbol = SymbolKind::marker;
  c.renderer = VectorRenderer::categorized;
  c.attribute = "status";
  SymbolLook star = look("#d55e00", 5.0);
  star.shape = MarkerShape::star;
  c.categories = {{"active", "active", look("#0072b2", 2.6)}, {"proposed", "proposed", star}};
  auto doc = parse(vector_style_qml(c));
  auto r = doc.child("qgis").child("renderer-v2");
  CHECK(std::string(r.attribute("type").value()) == "categorizedSymbol");
  CHECK(std::string(r.child("categories").last_child().attribute("value").value()) == "proposed");
  const auto layer = r.child("symbols").find_child_by_attribute("symbol", "name", "1").child("layer");
  CHECK(std::string(layer.attribute("class").value()) == "SimpleMarker");
  CHECK(std::string(layer.find_child_by_attribute("prop", "k", "name").attribute("v").value()) == "star");
  CHECK(std::string(layer.find_child_by_attribute("prop", "k", "size").attribute("v").value()) == "5");
  CHECK_FALSE(doc.child("qgis").child("temporal"));  // not time-aware unless asked

  VectorStyle f;
  f.symbol = SymbolKind::fill;
  f.single = look("#e69f00", 0.5);
  f.single.colour.alpha = 70;
  doc = parse(vector_style_qml(f));
  r = doc.child("qgis").child("renderer-v2");
  CHECK(std::string(r.attribute("type").value()) == "singleSymbol");
  CHECK(std::string(r.child("symbols").child("symbol").child("layer").find_child_by_attribute("prop", "k", "color")
                        .attribute("v").value()) == "230,159,0,70");

  RasterPseudocolour p;
  p.band = 3;
  p.discrete = true;
  p.stops = {{0.01, rgb_from_hex("#440154"), "≤ 1 %"}, {1.0, rgb_from_hex("#fde725"), "> 1 %"}};
  doc = parse(raster_style_qml(p));
  const auto rr = doc.child("qgis").child("pipe").child("rasterrenderer");
  CHECK(std::string(rr.attribute("type").value()) == "singlebandpseudocolor");
  CHECK(rr.attribute("band").as_int() == 3);
  const auto shader = rr.child("rastershader").child("colorrampshader");
  CHECK(std::string(shader.attribute("colorRampType").value()) == "DISCRETE");
  CHECK(std::string(shader.child("item").attribute("color").value()) == "#440154");
  CHECK(shader.child("item").next_sibling("item").attribute("value").as_double() == 1.0);
}

TEST_CASE("QML input errors") {
  VectorStyle g;
  g.renderer = VectorRenderer::graduated_colour;
  g.attribute = "x";
  CHECK_THROWS_AS(vector_style_qml(g), InputError);  // no ranges
  VectorStyle c;
  c.renderer = VectorRenderer::categorized;
  c.categories = {{"a", "a", SymbolLook{}}};
  CHECK_THROWS_AS(vector_style_qml(c), InputError);  // no attribute
  RasterPseudocolour p;
  p.stops = {{1.0, Rgb{}, ""}};
  CHECK_THROWS_AS(raster_style_qml(p), InputError);  // one stop
  p.stops = {{1.0, Rgb{}, ""}, {1.0, Rgb{}, ""}};
  CHECK_THROWS_AS(raster_style_qml(p), InputError);  // not increasing
  CHECK_THROWS_AS(rgb_from_hex("#12345"), InputError);
  CHECK_THROWS_AS(rgb_from_hex("#12345g"), InputError);
  const Rgb c2 = rgb_from_hex("#0A0b0C");
  CHECK(c2.r == 10);
  CHECK(c2.g == 11);
  CHECK(c2.b == 12);
}
