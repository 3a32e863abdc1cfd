#include "core/geomech/depth_profile.hpp"

#include <cmath>
#include <string>

#include "core/errors.hpp"
#include "core/units/units.hpp"

namespace slipscreen::geomech {

void check_depth(double depth) {
  if (!std::isfinite(depth) || depth < 0.0)
    throw InputError("depth", std::to_string(depth) + " m", "a depth >= 0 m (positive down)");
}

double from_gradient(double gradient, double depth, const char* field) {
  check_depth(depth);
  if (!std::isfinite(gradient) || gradient < 0.0)
    throw InputError(field, std::to_string(gradient) + " Pa/m", "a gradient >= 0 Pa/m");
  return gradient * depth;  // Zoback (2007) ch. 1 with constant ρ g
}

double vertical_stress_from_layers(std::span<const DensityLayer> layers, double depth) {
  check_depth(depth);
  if (layers.empty()) throw InputError("density layers", "(none)", "at least one layer starting at 0 m");
  if (layers.front().top != 0.0)
    throw InputError("density layer 1 top", std::to_string(layers.front().top) + " m", "0 m (the table starts at the surface)");
  double sv = 0.0;
  for (std::size_t i = 0; i < layers.size(); ++i) {
    const auto& l = layers[i];
    const std::string name = "density layer " + std::to_string(i + 1);
    if (!std::isfinite(l.density) || l.density <= 0.0)
      throw InputError(name + " density", std::to_string(l.density) + " kg/m3", "a density > 0 kg/m3");
    const double bottom = i + 1 < layers.size() ? layers[i + 1].top : INFINITY;
    if (!(bottom > l.top))
      throw InputError("density layer " + std::to_string(i + 2) + " top", std::to_string(bottom) + " m",
                       "a top deeper than the layer above (" + std::to_string(l.top) + " m)");
    if (depth > l.top)  // Zoback (2007) ch. 1, ∫ρ g dz over the part of the layer above depth
      sv += l.density * units::kStandardGravity * (std::fmin(depth, bottom) - l.top);
  }
  return sv;
}

}  // namespace slipscreen::geomech
