// The run's symbology (outputs/gis_styles.cpp): the rasters use the classes and colours of the
// line styles, every class has its own colour, and the wells' proposed class stands out.
#include "outputs/gis_styles.hpp"

#include "core/units/units.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <pugixml.hpp>
#include <set>
#include <string>
#include <vector>

using namespace slipscreen;

namespace {

struct Class {
  double upper;
  std::string colour;  // "r,g,b" of the top symbol layer, or the raster item's #rrggbb as r,g,b
};

std::string rgb_text(const std::string& hex) {
  const auto byte = [&](std::size_t i) { return std::to_string(std::stoi(hex.substr(i, 2), nullptr, 16)); };
  return byte(1) + "," + byte(3) + "," + byte(5);
}

std::vector<Class> line_classes(const std::string& qml) {
  pugi::xml_document doc;
  REQUIRE(doc.load_string(qml.c_str()));
  const auto r = doc.child("qgis").child("renderer-v2");
  std::vector<Class> out;
  for (auto range : r.child("ranges").children("range")) {
    const auto symbol = r.child("symbols").find_child_by_attribute("symbol", "name", range.attribute("symbol").value());
    const auto top = symbol.last_child();  // the coloured line (the casing is drawn first)
    std::string c = top.find_child_by_attribute("prop", "k", "line_color").attribute("v").value();
    out.push_back({range.attribute("upper").as_double(), c.substr(0, c.rfind(','))});
  }
  return out;
}

std::vector<Class> raster_classes(const std::string& qml) {
  pugi::xml_document doc;
  REQUIRE(doc.load_string(qml.c_str()));
  std::vector<Class> out;
  for (auto item : doc.child("qgis").child("pipe").child("rasterrenderer").child("rastershader").child("colorrampshader")
                       .children("item"))
    out.push_back({item.attribute("value").as_double(), rgb_text(item.attribute("color").value())});
  return out;
}

void check_same(const std::vector<Class>& lines, const std::vector<Class>& raster) {
  REQUIRE(lines.size() == raster.size());
  std::set<std::string> colours;
  for (std::size_t i = 0; i < lines.size(); ++i) {
    CAPTURE(i);
    CHECK(lines[i].upper == raster[i].upper);
    CHECK(lines[i].colour == raster[i].colour);
    colours.insert(lines[i].colour);
  }
  CHECK(colours.size() == lines.size());  // every class its own colour
}

}  // namespace

TEST_CASE("the rasters' classes and colours are the line styles'") {
  formats::VectorLayer layer("x", formats::GeometryType::line_string, {{"p_slip", formats::FieldType::real}});
  check_same(line_classes(outputs::segments_by_probability(layer, "p_slip", "").qml),
             raster_classes(outputs::probability_raster_qml(1)));
  check_same(line_classes(outputs::lines_by_dp(layer, "dp_MPa", "", outputs::OutputUnits()).qml),
             raster_classes(outputs::pressure_raster_qml(1)));
}

TEST_CASE("in oilfield units the Δp and margin classes are the MPa classes converted to psi, labelled in psi") {
  formats::VectorLayer layer("x", formats::GeometryType::line_string, {{"dp_psi", formats::FieldType::real}});
  const outputs::OutputUnits si, oilfield(units::UnitSystem::oilfield);
  // psi = 6894.757293168361 Pa exactly (NIST SP 811, 2008, App. B): an oilfield limit times that is
  // the SI limit in Pa, to the rounding of one division (1e-15 relative).
  const auto check_converted = [](const std::string& si_qml, const std::string& oil_qml) {
    pugi::xml_document a, b;
    REQUIRE(a.load_string(si_qml.c_str()));
    REQUIRE(b.load_string(oil_qml.c_str()));
    const auto ra = a.child("qgis").child("renderer-v2").child("ranges");
    const auto rb = b.child("qgis").child("renderer-v2").child("ranges");
    auto x = ra.children("range").begin();
    std::size_t n = 0;
    for (auto y : rb.children("range")) {
      REQUIRE(x != ra.children("range").end());
      for (const char* bound : {"lower", "upper"}) {
        const double mpa = x->attribute(bound).as_double(), psi = y.attribute(bound).as_double();
        CHECK(std::abs(psi * 6894.757293168361 - mpa * 1e6) <= 1e-15 * std::abs(mpa * 1e6));
      }
      const std::string label = y.attribute("label").value();
      CHECK(label.find(" psi") != std::string::npos);
      CHECK(label.find("MPa") == std::string::npos);
      ++x, ++n;
    }
    CHECK(x == ra.children("range").end());
    CHECK(n >= 6);
  };
  check_converted(outputs::lines_by_dp(layer, "dp_MPa", "", si).qml,
                  outputs::lines_by_dp(layer, "dp_psi", "", oilfield).qml);
  check_converted(outputs::segments_by_margin(layer, "margin_MPa", "", si).qml,
                  outputs::segments_by_margin(layer, "margin_psi", "", oilfield).qml);
  // The labels, written from the converted limits to 3 significant digits: 0.01 MPa = 1.4504 psi
  // and 1 MPa = 145.04 psi (the same factor).
  const std::string dp = outputs::lines_by_dp(layer, "dp_psi", "", oilfield).qml;
  CHECK(dp.find("label=\"≤ 1.45 psi\"") != std::string::npos);
  CHECK(dp.find("label=\"&gt; 145 psi\"") != std::string::npos);
  CHECK(dp.find("attr=\"dp_psi\"") != std::string::npos);
  const std::string margin = outputs::segments_by_margin(layer, "margin_psi", "", oilfield).qml;
  CHECK(margin.find("label=\"reached (≤ 0 psi)\"") != std::string::npos);
}

TEST_CASE("the wells' style marks the proposed wells larger than every other status") {
  formats::VectorLayer layer("wells", formats::GeometryType::point, {{"status", formats::FieldType::string}});
  pugi::xml_document doc;
  REQUIRE(doc.load_string(outputs::wells_by_status(layer).qml.c_str()));
  const auto r = doc.child("qgis").child("renderer-v2");
  double proposed = 0, largest_other = 0;
  std::set<std::string> values;
  for (auto c : r.child("categories").children("category")) {
    values.insert(c.attribute("value").value());
    const auto layer_node =
        r.child("symbols").find_child_by_attribute("symbol", "name", c.attribute("symbol").value()).child("layer");
    const double size = layer_node.find_child_by_attribute("prop", "k", "size").attribute("v").as_double();
    (std::string(c.attribute("value").value()) == "proposed" ? proposed : largest_other) =
        std::max(std::string(c.attribute("value").value()) == "proposed" ? proposed : largest_other, size);
  }
  // The statuses the wells layer holds (scenario/wells.cpp status_name).
  CHECK(values == std::set<std::string>{"active", "shut-in", "plugged", "proposed"});
  CHECK(proposed >= 1.5 * largest_other);
}
