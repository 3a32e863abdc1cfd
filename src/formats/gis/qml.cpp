#include "formats/gis/qml.hpp"

#include <charconv>
#include <cmath>
#include <utility>

#include "core/errors.hpp"

namespace slipscreen::formats {

namespace {

std::string escape(const std::string& s) {
  std::string out;
  out.reserve(s.size());
  for (char c : s) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&apos;"; break;
      default: out += c;
    }
  }
  return out;
}

// Shortest text that reads back as the same double, independent of the locale.
std::string number(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

std::string attr(const char* name, const std::string& value) { return std::string(" ") + name + "=\"" + escape(value) + "\""; }

std::string rgba(const Rgb& c) {
  return std::to_string(c.r) + "," + std::to_string(c.g) + "," + std::to_string(c.b) + "," + std::to_string(c.alpha);
}

std::string hex(const Rgb& c) {
  static constexpr char kDigits[] = "0123456789abcdef";
  std::string s = "#";
  for (std::uint8_t v : {c.r, c.g, c.b}) {
    s += kDigits[v >> 4];
    s += kDigits[v & 15];
  }
  return s;
}

const char* shape_name(MarkerShape s) {
  switch (s) {
    case MarkerShape::circle: return "circle";
    case MarkerShape::square: return "square";
    case MarkerShape::triangle: return "triangle";
    case MarkerShape::star: return "star";
    case MarkerShape::cross: return "cross2";
    case MarkerShape::diamond: return "diamond";
  }
  return "circle";
}

using Properties = std::vector<std::pair<std::string, std::string>>;

// One symbol layer's properties, as the <Option> map and as <prop> elements.
std::string properties(const Properties& props, const std::string& indent) {
  std::string x = indent + "<Option type=\"Map\">\n";
  for (const auto& [k, v] : props)
    x += indent + "  <Option type=\"QString\"" + attr("name", k) + attr("value", v) + "/>\n";
  x += indent + "</Option>\n";
  for (const auto& [k, v] : props) x += indent + "<prop" + attr("k", k) + attr("v", v) + "/>\n";
  return x;
}

std::string symbol(SymbolKind kind, const SymbolLook& look, const std::string& name) {
  const char* type = kind == SymbolKind::line ? "line" : kind == SymbolKind::marker ? "marker" : "fill";
  const char* cls = kind == SymbolKind::line ? "SimpleLine" : kind == SymbolKind::marker ? "SimpleMarker" : "SimpleFill";
  Properties p;
  switch (kind) {
    case SymbolKind::line:
      p = {{"line_color", rgba(look.colour)}, {"line_width", number(look.size_mm)}, {"line_width_unit", "MM"},
           {"line_style", "solid"},           {"capstyle", "round"},               {"joinstyle", "round"}};
      break;
    case SymbolKind::marker:
      p = {{"name", shape_name(look.shape)},   {"color", rgba(look.colour)},    {"outline_color", rgba(look.outline)},
           {"outline_style", "solid"},         {"outline_width", number(look.outline_mm)},
           {"outline_width_unit", "MM"},       {"size", number(look.size_mm)}, {"size_unit", "MM"},
           {"scale_method", "diameter"},       {"joinstyle", "miter"}};
      break;
    case SymbolKind::fill:
      p = {{"color", rgba(look.colour)},        {"style", look.colour.alpha == 0 ? "no" : "solid"},
           {"outline_color", rgba(look.outline)}, {"outline_style", "solid"},
           {"outline_width", number(look.size_mm)}, {"outline_width_unit", "MM"}, {"joinstyle", "round"}};
      break;
  }
  std::string layers;
  if (kind == SymbolKind::line && look.casing_mm > 0) {  // a darker, wider line drawn first
    const Properties casing = {{"line_color", rgba(look.outline)}, {"line_width", number(look.size_mm + look.casing_mm)},
                               {"line_width_unit", "MM"}, {"line_style", "solid"}, {"capstyle", "round"},
                               {"joinstyle", "round"}};
    layers += "        <layer class=\"SimpleLine\" enabled=\"1\" locked=\"0\" pass=\"0\">\n" +
              properties(casing, "          ") + "        </layer>\n";
  }
  layers += "        <layer" + attr("class", cls) + " enabled=\"1\" locked=\"0\" pass=\"0\">\n" +
            properties(p, "          ") + "        </layer>\n";
  return "      <symbol" + attr("type", type) + attr("name", name) +
         " alpha=\"1\" clip_to_extent=\"1\" force_rhr=\"0\">\n" + layers + "      </symbol>\n";
}

const char* kHeader = "<!DOCTYPE qgis PUBLIC 'http://mrcc.com/qgis.dtd' 'SYSTEM'>\n";

}  // namespace

Rgb rgb_from_hex(const std::string& h) {
  auto digit = [&](char c) -> int {
    if (c >= '0' && c <= '9') return c - '0';
    if (c >= 'a' && c <= 'f') return c - 'a' + 10;
    if (c >= 'A' && c <= 'F') return c - 'A' + 10;
    throw InputError("colour", h, "a colour as #rrggbb");
  };
  if (h.size() != 7 || h[0] != '#') throw InputError("colour", h, "a colour as #rrggbb");
  auto byte = [&](std::size_t i) { return static_cast<std::uint8_t>(digit(h[i]) * 16 + digit(h[i + 1])); };
  return {byte(1), byte(3), byte(5), 255};
}

std::string vector_style_qml(const VectorStyle& s) {
  const bool graduated = s.renderer == VectorRenderer::graduated_colour || s.renderer == VectorRenderer::graduated_size;
  if (graduated && s.ranges.empty()) throw InputError("style", "no ranges", "at least one class for a graduated style");
  if (s.renderer == VectorRenderer::categorized && s.categories.empty())
    throw InputError("style", "no categories", "at least one category for a categorized style");
  if (s.renderer != VectorRenderer::single && s.attribute.empty())
    throw InputError("style", "no attribute", "the field a classified style is drawn by");

  std::string x = kHeader;
  x += "<qgis version=\"3.22.0\" styleCategories=\"AllStyleCategories\" hasScaleBasedVisibilityFlag=\"0\">\n";
  if (s.temporal) {
    // mode 2: start and end from fields (QgsVectorLayerTemporalProperties::ModeFeatureDateTimeStartAndEndFromFields);
    // limitMode 0: the start is included, the end excluded.
    x += "  <temporal enabled=\"1\" mode=\"2\"" + attr("startField", s.temporal->start_field) +
         attr("endField", s.temporal->end_field) +
         " durationField=\"\" durationUnit=\"min\" fixedDuration=\"0\" accumulate=\"0\" startExpression=\"\""
         " endExpression=\"\" limitMode=\"0\">\n    <fixedRange>\n      <start></start>\n      <end></end>\n"
         "    </fixedRange>\n  </temporal>\n";
  }
  const std::string common = " symbollevels=\"0\" forceraster=\"0\" enableorderby=\"0\" referencescale=\"-1\"";
  std::string symbols;
  switch (s.renderer) {
    case VectorRenderer::single:
      x += "  <renderer-v2 type=\"singleSymbol\"" + common + ">\n";
      symbols = symbol(s.symbol, s.single, "0");
      break;
    case VectorRenderer::graduated_colour:
    case VectorRenderer::graduated_size: {
      x += "  <renderer-v2 type=\"graduatedSymbol\"" + attr("attr", s.attribute) +
           attr("graduatedMethod", s.renderer == VectorRenderer::graduated_size ? "GraduatedSize" : "GraduatedColor") +
           common + ">\n    <ranges>\n";
      for (std::size_t i = 0; i < s.ranges.size(); ++i) {
        const auto& r = s.ranges[i];
        x += "      <range" + attr("lower", number(r.lower)) + attr("upper", number(r.upper)) +
             attr("symbol", std::to_string(i)) + attr("label", r.label) + " render=\"true\"/>\n";
        symbols += symbol(s.symbol, r.look, std::to_string(i));
      }
      x += "    </ranges>\n";
      break;
    }
    case VectorRenderer::categorized: {
      x += "  <renderer-v2 type=\"categorizedSymbol\"" + attr("attr", s.attribute) + common + ">\n    <categories>\n";
      for (std::size_t i = 0; i < s.categories.size(); ++i) {
        const auto& c = s.categories[i];
        x += "      <category" + attr("value", c.value) + attr("symbol", std::to_string(i)) + attr("label", c.label) +
             " render=\"true\"/>\n";
        symbols += symbol(s.symbol, c.look, std::to_string(i));
      }
      x += "    </categories>\n";
      break;
    }
  }
  x += "    <symbols>\n" + symbols + "    </symbols>\n";
  if (graduated) x += "    <mode name=\"manual\"/>\n";
  x += "    <rotation/>\n    <sizescale/>\n  </renderer-v2>\n";
  if (!s.aliases.empty()) {
    x += "  <aliases>\n";
    for (std::size_t i = 0; i < s.aliases.size(); ++i)
      x += "    <alias" + attr("field", s.aliases[i].field) + attr("name", s.aliases[i].alias) + "/>\n";
    x += "  </aliases>\n";
  }
  x += "  <blendMode>0</blendMode>\n  <featureBlendMode>0</featureBlendMode>\n  <layerOpacity>1</layerOpacity>\n";
  x += "</qgis>\n";
  return x;
}

std::string raster_style_qml(const RasterPseudocolour& s) {
  if (s.stops.size() < 2)
    throw InputError("colour stops", std::to_string(s.stops.size()), "at least two stops for a colour ramp");
  for (std::size_t i = 1; i < s.stops.size(); ++i)
    if (!(s.stops[i].value > s.stops[i - 1].value) || !std::isfinite(s.stops[i].value))
      throw InputError("colour stops", number(s.stops[i].value), "finite values increasing from stop to stop");
  const std::string lo = number(s.stops.front().value), hi = number(s.stops.back().value);
  std::string x = kHeader;
  x += "<qgis version=\"3.22.0\" styleCategories=\"AllStyleCategories\" hasScaleBasedVisibilityFlag=\"0\">\n";
  x += "  <pipe>\n    <rasterrenderer type=\"singlebandpseudocolor\"" + attr("band", std::to_string(s.band)) +
       " opacity=\"1\" alphaBand=\"-1\"" + attr("classificationMin", lo) + attr("classificationMax", hi) +
       " nodataColor=\"\">\n      <rasterTransparency/>\n      <minMaxOrigin>\n        <limits>None</limits>\n"
       "        <extent>WholeRaster</extent>\n        <statAccuracy>Exact</statAccuracy>\n"
       "        <cumulativeCutLower>0.02</cumulativeCutLower>\n        <cumulativeCutUpper>0.98</cumulativeCutUpper>\n"
       "        <stdDevFactor>2</stdDevFactor>\n      </minMaxOrigin>\n      <rastershader>\n"
       "        <colorrampshader" + attr("colorRampType", s.discrete ? "DISCRETE" : "INTERPOLATED") +
       " classificationMode=\"1\" clip=\"0\"" +
       attr("minimumValue", lo) + attr("maximumValue", hi) + " labelPrecision=\"2\">\n";
  for (const auto& stop : s.stops)
    x += "          <item" + attr("value", number(stop.value)) + attr("color", hex(stop.colour)) +
         attr("label", stop.label) + attr("alpha", std::to_string(stop.colour.alpha)) + "/>\n";
  x += "        </colorrampshader>\n      </rastershader>\n    </rasterrenderer>\n"
       "    <brightnesscontrast brightness=\"0\" contrast=\"0\" gamma=\"1\"/>\n"
       "    <huesaturation saturation=\"0\" grayscaleMode=\"0\" colorizeOn=\"0\" colorizeRed=\"255\""
       " colorizeGreen=\"128\" colorizeBlue=\"128\" colorizeStrength=\"100\"/>\n"
       "    <rasterresampler maxOversampling=\"2\"/>\n  </pipe>\n  <blendMode>0</blendMode>\n</qgis>\n";
  return x;
}

}  // namespace slipscreen::formats
