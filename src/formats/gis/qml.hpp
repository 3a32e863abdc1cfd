#pragma once
// QGIS style documents (QML, the XML QGIS saves as "<layer>.qml" and keeps in a GeoPackage's
// layer_styles table), written from plain descriptions of a renderer. The symbology itself (which
// field, classes, colours, sizes) is the caller's; this file only knows the document's layout as
// QGIS 3 reads it:
//
//   <qgis styleCategories="AllStyleCategories" version="3.22.0">
//     <temporal .../>                        vector layers, optional: time from DateTime fields
//     <renderer-v2 type="graduatedSymbol" attr=... graduatedMethod="GraduatedColor|GraduatedSize">
//       <ranges><range lower upper symbol label render/></ranges>  or  <categories><category .../>
//       <symbols><symbol type="line|marker|fill" name="0"><layer class="SimpleLine|SimpleMarker|SimpleFill">
//          <Option type="Map"><Option name=... value=.../></Option>  and the same as <prop k v/>
//     </renderer-v2>
//     <aliases><alias field index name/></aliases>
//     <pipe><rasterrenderer type="singlebandpseudocolor" band=...><rastershader><colorrampshader>
//        <item value color label alpha/> ...                  rasters
//   </qgis>
//
// Symbol properties are written both as the <Option> map (QGIS 3.18 and later) and as the older
// <prop k v/> list, as QGIS itself writes them, so every QGIS 3 reads them. Text is XML-escaped.
// Colours are sRGB. Sizes and widths are in millimetres on the map.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace slipscreen::formats {

struct Rgb {
  std::uint8_t r = 0, g = 0, b = 0;
  std::uint8_t alpha = 255;
};

// "#rrggbb" (throws InputError for anything else).
Rgb rgb_from_hex(const std::string& hex);

enum class SymbolKind { line, marker, fill };
enum class MarkerShape { circle, square, triangle, star, cross, diamond };

struct SymbolLook {
  Rgb colour;
  double size_mm = 0.6;      // line width, marker diameter, or fill outline width
  MarkerShape shape = MarkerShape::circle;
  Rgb outline{35, 35, 35};   // markers, fills, and a line's casing
  double outline_mm = 0.2;   // markers
  double casing_mm = 0;      // lines: a casing in the outline colour this much wider, drawn below
};

struct RangeClass {
  double lower = 0, upper = 0;  // QGIS ranges: lower < value <= upper (the first includes lower)
  std::string label;
  SymbolLook look;
};

struct CategoryClass {
  std::string value;  // the field's text value
  std::string label;
  SymbolLook look;
};

struct FieldAlias {
  std::string field;
  std::string alias;
};

// Features valid from the start field until the end field (DateTime fields); a NULL end is
// open (QGIS: the feature stays visible to the end of the animation).
struct TemporalFields {
  std::string start_field;
  std::string end_field;
};

enum class VectorRenderer { single, graduated_colour, graduated_size, categorized };

struct VectorStyle {
  SymbolKind symbol = SymbolKind::line;
  VectorRenderer renderer = VectorRenderer::single;
  std::string attribute;                  // classified field (graduated, categorized)
  std::vector<RangeClass> ranges;         // graduated
  std::vector<CategoryClass> categories;  // categorized
  SymbolLook single;                      // single-symbol look
  std::vector<FieldAlias> aliases;        // field aliases, in field order (index = position)
  std::optional<TemporalFields> temporal;
};

// Throws InputError for a graduated style without ranges, a categorized one without categories,
// or a classified style without an attribute.
std::string vector_style_qml(const VectorStyle& style);

struct ColourStop {
  double value = 0;
  Rgb colour;
  std::string label;
};

// A raster drawn as one band in pseudocolour: colours interpolated linearly between stops
// (sorted by value; values outside the first and last stop take their colours), or, when
// `discrete`, classes: a value takes the colour of the first stop whose value is >= it.
struct RasterPseudocolour {
  int band = 1;
  bool discrete = false;
  std::vector<ColourStop> stops;  // at least two, increasing values
};

// Throws InputError for fewer than two stops or values not increasing.
std::string raster_style_qml(const RasterPseudocolour& style);

}  // namespace slipscreen::formats
