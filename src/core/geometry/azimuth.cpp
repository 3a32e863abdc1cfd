#include "core/geometry/azimuth.hpp"

#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geometry {

namespace {
constexpr double kTwoPi = 2.0 * std::numbers::pi;
}

double normalize_azimuth(double radians) {
  double a = std::fmod(radians, kTwoPi);
  if (a < 0.0) a += kTwoPi;
  if (a >= kTwoPi) a -= kTwoPi;  // fmod of a tiny negative number plus 2π can round to 2π
  return a;
}

double azimuth(const Point2& a, const Point2& b) {
  const double dx = b.x - a.x, dy = b.y - a.y;
  if (dx == 0.0 && dy == 0.0)
    throw InputError("trace", "(" + std::to_string(a.x) + ", " + std::to_string(a.y) + ") twice",
                     "two distinct points to define a direction");
  return normalize_azimuth(std::atan2(dx, dy));
}

double azimuth_difference(double a, double b) {
  const double d = normalize_azimuth(a - b);
  return d > std::numbers::pi ? kTwoPi - d : d;
}

double strike_for_dip_direction(double trace_az, double dip_direction, const char* field) {
  const double right_of_trace = normalize_azimuth(trace_az + std::numbers::pi / 2.0);
  const double off = azimuth_difference(right_of_trace, dip_direction);
  if (std::abs(off - std::numbers::pi / 2.0) < 1e-12)
    throw InputError(field, std::to_string(dip_direction * 180.0 / std::numbers::pi) + " deg",
                     "a dip direction across the fault trace, not along it");
  return off < std::numbers::pi / 2.0 ? normalize_azimuth(trace_az)
                                      : normalize_azimuth(trace_az + std::numbers::pi);
}

}  // namespace slipscreen::geometry
