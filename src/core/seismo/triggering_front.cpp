#include "core/seismo/triggering_front.hpp"

#include <cmath>
#include <cstdio>
#include <numbers>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
// Shapiro et al. (1997): r = sqrt(4π D t).
double front_radius(double diffusivity, double t) {
  if (!(diffusivity > 0.0) || !std::isfinite(diffusivity))
    throw InputError("diffusivity", util::number_text(diffusivity, 6), "a positive hydraulic diffusivity such as '0.1 m2/s'");
  if (!(t >= 0.0) || !std::isfinite(t)) throw InputError("time since injection start", util::number_text(t, 6), "a time >= 0 s");
  return std::sqrt(4.0 * std::numbers::pi * diffusivity * t);
}

// Shapiro et al. (1997), solved for D: D = r² / (4π t).
double front_diffusivity(double radius, double t) {
  if (!(radius >= 0.0)) throw InputError("distance", util::number_text(radius, 6), "a distance >= 0 m");
  if (!(t > 0.0)) throw InputError("time since injection start", util::number_text(t, 6), "a time > 0 s");
  return radius * radius / (4.0 * std::numbers::pi * t);
}

std::vector<RtPoint> rt_points(std::span<const double> event_times, std::span<const double> distances,
                               double start) {
  if (event_times.size() != distances.size())
    throw InputError("events", std::to_string(event_times.size()) + " times, " + std::to_string(distances.size()) + " distances",
                     "one distance per event");
  std::vector<RtPoint> out;
  for (std::size_t i = 0; i < event_times.size(); ++i) {
    const double t = event_times[i] - start;
    if (!(t >= 0.0)) continue;
    RtPoint p{i, t, distances[i], t > 0.0 ? front_diffusivity(distances[i], t) : 0.0};
    out.push_back(p);
  }
  return out;
}

double fraction_inside_front(std::span<const RtPoint> points, double diffusivity) {
  if (points.empty()) return 0.0;
  std::size_t inside = 0;
  for (const auto& p : points)
    if (p.r <= front_radius(diffusivity, p.t)) ++inside;
  return static_cast<double>(inside) / static_cast<double>(points.size());
}

}  // namespace slipscreen::seismo
