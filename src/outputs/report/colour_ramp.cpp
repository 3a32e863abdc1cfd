#include "outputs/report/colour_ramp.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>

namespace slipscreen::outputs::report {
namespace {

// viridis at t = 0, 1/16, ..., 1 (matplotlib 3.6, rounded to 8 bits).
constexpr std::array<std::uint32_t, 17> kViridis = {
    0x440154, 0x48186a, 0x472d7b, 0x424086, 0x3b528b, 0x33638d, 0x2c728e, 0x26828e, 0x21918c,
    0x1fa088, 0x28ae80, 0x3fbc73, 0x5ec962, 0x84d44b, 0xaddc30, 0xd8e219, 0xfde725};
// magma at t = 0, 1/16, ..., 1 (matplotlib 3.6, rounded to 8 bits).
constexpr std::array<std::uint32_t, 17> kMagma = {
    0x000004, 0x0a0822, 0x1d1147, 0x36106b, 0x51127c, 0x6a1c81, 0x832681, 0x9c2e7f, 0xb73779,
    0xd0416f, 0xe75263, 0xf56b5c, 0xfc8961, 0xfea772, 0xfec488, 0xfde2a3, 0xfcfdbf};
// Okabe & Ito (2008): orange, sky blue, bluish green, blue, vermillion, reddish purple, yellow, black.
constexpr std::array<std::uint32_t, 8> kCategories = {0xe69f00, 0x56b4e9, 0x009e73, 0x0072b2,
                                                      0xd55e00, 0xcc79a7, 0xf0e442, 0x000000};

formats::Colour sample(const std::array<std::uint32_t, 17>& stops, double t) {
  t = std::clamp(std::isfinite(t) ? t : 0.0, 0.0, 1.0);
  const double x = t * 16.0;
  const std::size_t i = std::min<std::size_t>(static_cast<std::size_t>(x), 15);
  const double f = x - static_cast<double>(i);
  const formats::Colour a = formats::rgb(stops[i]), b = formats::rgb(stops[i + 1]);
  return {a.r + f * (b.r - a.r), a.g + f * (b.g - a.g), a.b + f * (b.b - a.b), 1.0};
}

}  // namespace

formats::Colour ramp_colour(Ramp ramp, double t) {
  switch (ramp) {
    case Ramp::probability: return sample(kViridis, t);
    case Ramp::pressure: return sample(kMagma, 1.0 - 0.875 * std::clamp(std::isfinite(t) ? t : 0.0, 0.0, 1.0));
  }
  return formats::kInk;
}

formats::Colour category_colour(std::size_t i) { return formats::rgb(kCategories[i % kCategories.size()]); }

}  // namespace slipscreen::outputs::report
