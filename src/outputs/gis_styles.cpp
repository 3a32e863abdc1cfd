#include "outputs/gis_styles.hpp"

#include <array>

#include "core/util/number_text.hpp"
#include "outputs/output_text.hpp"

namespace slipscreen::outputs {

using formats::CategoryClass;
using formats::LayerStyle;
using formats::MarkerShape;
using formats::RangeClass;
using formats::Rgb;
using formats::SymbolKind;
using formats::SymbolLook;
using formats::TemporalFields;
using formats::VectorLayer;
using formats::VectorRenderer;
using formats::VectorStyle;

namespace {

Rgb hex(const char* h) { return formats::rgb_from_hex(h); }

// matplotlib 3.6 colormaps sampled with numpy.linspace (see the header for the ramps' sources).
constexpr std::array<const char*, 6> kViridis = {"#440154", "#414487", "#2a788e", "#22a884", "#7ad151", "#fde725"};
constexpr std::array<const char*, 7> kInferno = {"#420a68", "#781c6d", "#ae305c", "#dd513a",
                                                 "#f8850f", "#fac62d", "#fcffa4"};  // 0.2 .. 1
constexpr std::array<const char*, 6> kCividisReversed = {"#fee838", "#c8b866", "#948e77",
                                                         "#666970", "#35456c", "#00224e"};
// Okabe & Ito (2008).
constexpr const char* kBlue = "#0072b2";
constexpr const char* kSkyBlue = "#56b4e9";
constexpr const char* kVermillion = "#d55e00";
constexpr const char* kOrange = "#e69f00";
constexpr const char* kReddishPurple = "#cc79a7";
constexpr const char* kGrey = "#999999";

// Class limits: probabilities, and Δp and margin in MPa (the raster's colour stops are the same
// values). In oilfield units the pressure limits are these converted, so that a class selects the
// same features in either system; their legend labels are written from the converted limits.
constexpr std::array<double, 7> kProbabilityLimits = {0.0, 0.01, 0.05, 0.1, 0.2, 0.5, 1.0};
constexpr std::array<const char*, 6> kProbabilityLabels = {"≤ 1 %", "1–5 %", "5–10 %", "10–20 %", "20–50 %", "> 50 %"};
constexpr std::array<double, 8> kDpLimitsMPa = {0.0, 0.01, 0.05, 0.1, 0.25, 0.5, 1.0, 1e9};
constexpr std::array<double, 7> kMarginLimitsMPa = {-1e9, 0.0, 0.5, 1.0, 2.0, 5.0, 1e9};

// Pressure classes in the unit system `u`: the limits converted from MPa (a factor of exactly 1
// in SI, so the SI limits keep their bytes) and labels "≤ a", "a–b", ..., "> z" with the unit,
// the first one "reached (≤ a unit)" for the margin.
struct PressureClasses {
  std::vector<double> limits;
  std::vector<std::string> labels;
};

template <std::size_t N>
PressureClasses pressure_classes(const std::array<double, N>& limits_mpa, const OutputUnits& u, bool first_reached) {
  const double factor = kMPa / u.size_in_si(Quantity::pressure);
  const std::string unit(u.symbol(Quantity::pressure));
  const auto t = [](double v) { return util::number_text(v, 3); };
  PressureClasses c;
  for (double l : limits_mpa) c.limits.push_back(l * factor);
  const auto& l = c.limits;
  for (std::size_t i = 0; i + 1 < N; ++i) {
    if (i == 0)
      c.labels.push_back(first_reached ? "reached (≤ " + t(l[1]) + " " + unit + ")" : "≤ " + t(l[1]) + " " + unit);
    else if (i + 2 == N)
      c.labels.push_back("> " + t(l[i]) + " " + unit);
    else
      c.labels.push_back(t(l[i]) + "–" + t(l[i + 1]) + " " + unit);
  }
  return c;
}

std::vector<formats::FieldAlias> aliases(const VectorLayer& layer) {
  std::vector<formats::FieldAlias> a;
  for (const auto& f : layer.fields)
    if (!f.alias.empty()) a.push_back({f.name, f.alias});
  return a;
}

SymbolLook line(const char* colour, double width = 0.9) {
  SymbolLook l;
  l.colour = hex(colour);
  l.size_mm = width;
  l.casing_mm = 0.4;
  return l;
}

template <std::size_t M>
std::vector<RangeClass> ranges(const std::vector<double>& limits, const std::vector<std::string>& labels,
                               const std::array<const char*, M>& colours) {
  std::vector<RangeClass> r;
  for (std::size_t i = 0; i < M; ++i) r.push_back({limits.at(i), limits.at(i + 1), labels.at(i), line(colours[i])});
  return r;
}

template <std::size_t N, std::size_t M>
std::vector<RangeClass> ranges(const std::array<double, N>& limits, const std::array<const char*, M>& labels,
                               const std::array<const char*, M>& colours) {
  static_assert(N == M + 1);
  return ranges(std::vector<double>(limits.begin(), limits.end()),
                std::vector<std::string>(labels.begin(), labels.end()), colours);
}

LayerStyle lines(const VectorLayer& layer, const std::string& field, std::vector<RangeClass> classes,
                 const std::string& name, const std::string& what, const std::optional<TemporalFields>& time) {
  VectorStyle s;
  s.symbol = SymbolKind::line;
  s.renderer = VectorRenderer::graduated_colour;
  s.attribute = field;
  s.ranges = std::move(classes);
  s.aliases = aliases(layer);
  s.temporal = time;
  return {name, formats::vector_style_qml(s), what};
}

}  // namespace

LayerStyle segments_by_probability(const VectorLayer& layer, const std::string& field, const std::string& what,
                                   const std::optional<TemporalFields>& time) {
  return lines(layer, field, ranges(kProbabilityLimits, kProbabilityLabels, kViridis), "P(slip)", what, time);
}

LayerStyle segments_by_margin(const VectorLayer& layer, const std::string& field, const std::string& what,
                              const OutputUnits& u) {
  const auto c = pressure_classes(kMarginLimitsMPa, u, true);
  return lines(layer, field, ranges(c.limits, c.labels, kCividisReversed), "margin", what, std::nullopt);
}

LayerStyle lines_by_dp(const VectorLayer& layer, const std::string& field, const std::string& what,
                       const OutputUnits& u, const std::optional<TemporalFields>& time) {
  const auto c = pressure_classes(kDpLimitsMPa, u, false);
  return lines(layer, field, ranges(c.limits, c.labels, kInferno), "dp", what, time);
}

LayerStyle wells_by_status(const VectorLayer& layer) {
  auto marker = [](const char* colour, MarkerShape shape, double size, const char* outline = "#232323",
                   double outline_mm = 0.2) {
    SymbolLook l;
    l.colour = hex(colour);
    l.shape = shape;
    l.size_mm = size;
    l.outline = hex(outline);
    l.outline_mm = outline_mm;
    return l;
  };
  VectorStyle s;
  s.symbol = SymbolKind::marker;
  s.renderer = VectorRenderer::categorized;
  s.attribute = "status";
  s.categories = {{"active", "active", marker(kBlue, MarkerShape::circle, 2.6)},
                  {"shut-in", "shut-in", marker(kSkyBlue, MarkerShape::square, 2.4)},
                  {"plugged", "plugged", marker(kGrey, MarkerShape::cross, 2.8, kGrey, 0.5)},
                  {"proposed", "proposed (planned)", marker(kVermillion, MarkerShape::star, 5.0, "#000000", 0.35)}};
  s.aliases = aliases(layer);
  return {"status", formats::vector_style_qml(s), "Wells by status; proposed wells as large stars"};
}

LayerStyle earthquakes_by_magnitude(const VectorLayer& layer) {
  constexpr std::array<double, 7> limits = {-10, 1, 2, 3, 4, 5, 10};
  constexpr std::array<const char*, 6> labels = {"M ≤ 1", "M 1–2", "M 2–3", "M 3–4", "M 4–5", "M > 5"};
  constexpr std::array<double, 6> sizes = {1.2, 1.8, 2.6, 3.6, 4.8, 6.4};
  VectorStyle s;
  s.symbol = SymbolKind::marker;
  s.renderer = VectorRenderer::graduated_size;
  s.attribute = "magnitude";
  for (std::size_t i = 0; i < sizes.size(); ++i) {
    SymbolLook l;
    l.colour = hex(kReddishPurple);
    l.colour.alpha = 200;
    l.size_mm = sizes[i];
    l.outline = hex("#232323");
    s.ranges.push_back({limits[i], limits[i + 1], labels[i], l});
  }
  s.aliases = aliases(layer);
  return {"magnitude", formats::vector_style_qml(s), "Earthquakes sized by magnitude"};
}

LayerStyle footprint_style(const VectorLayer& layer, const TemporalFields& time) {
  VectorStyle s;
  s.symbol = SymbolKind::fill;
  s.renderer = VectorRenderer::single;
  s.single.colour = hex(kOrange);
  s.single.colour.alpha = 70;
  s.single.outline = hex(kVermillion);
  s.single.size_mm = 0.5;
  s.aliases = aliases(layer);
  s.temporal = time;
  return {"footprint", formats::vector_style_qml(s), "The Δp footprint at each output time (time-aware)"};
}

// The rasters use the classes of the vector styles: DISCRETE colour ramps whose stops are the
// classes' upper limits, so a cell has the colour of the segment class its value falls in.
std::string classed_raster(int band, const std::vector<double>& limits, const std::vector<std::string>& labels,
                           const char* const* colours) {
  formats::RasterPseudocolour r;
  r.band = band;
  r.discrete = true;
  for (std::size_t i = 0; i < labels.size(); ++i) r.stops.push_back({limits.at(i + 1), hex(colours[i]), labels[i]});
  return formats::raster_style_qml(r);
}

std::string pressure_raster_qml(int band) {
  const auto c = pressure_classes(kDpLimitsMPa, OutputUnits(units::UnitSystem::si), false);  // the raster is in MPa
  return classed_raster(band, c.limits, c.labels, kInferno.data());
}

std::string probability_raster_qml(int band) {
  return classed_raster(band, std::vector<double>(kProbabilityLimits.begin(), kProbabilityLimits.end()),
                        std::vector<std::string>(kProbabilityLabels.begin(), kProbabilityLabels.end()),
                        kViridis.data());
}

}  // namespace slipscreen::outputs
