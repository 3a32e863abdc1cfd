#include "core/geomech/orientation_search.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geomech {
namespace {
constexpr double kPi = std::numbers::pi;
constexpr double kDeg = kPi / 180.0;

void check_step(const char* field, double step) {
  if (!std::isfinite(step) || step <= 0.0 || step > kPi / 2)
    throw InputError(field, std::to_string(step / kDeg) + " deg", "a step in (0, 90] deg");
}

// Evaluates a strike × dip window (dip clamped to [0, 90°]) and returns the best node.
DangerousOrientation search_window(const StressBatch& state, double strike0, double dip0, double half_width,
                                   int half_count) {
  PlaneBatch planes;
  std::vector<std::pair<double, double>> nodes;
  const double step = half_width / half_count;
  for (int i = -half_count; i <= half_count; ++i) {
    for (int j = -half_count; j <= half_count; ++j) {
      const double dip = std::clamp(dip0 + j * step, 0.0, kPi / 2);
      const auto plane = FaultPlane::from_strike_dip(strike0 + i * step, dip);
      planes.push_back(plane);
      nodes.emplace_back(plane.strike(), plane.dip());
    }
  }
  std::vector<double> dp(planes.size());
  critical_pressure_grid(planes, state, dp);
  const auto best = static_cast<std::size_t>(std::min_element(dp.begin(), dp.end()) - dp.begin());
  return {FaultPlane::from_strike_dip(nodes[best].first, nodes[best].second), dp[best]};
}

}  // namespace

OrientationGrid make_orientation_grid(double strike_step, double dip_step) {
  check_step("strike step", strike_step);
  check_step("dip step", dip_step);
  OrientationGrid g;
  const auto ns = static_cast<std::size_t>(std::lround(2 * kPi / strike_step));
  const auto nd = static_cast<std::size_t>(std::lround(kPi / 2 / dip_step)) + 1;
  for (std::size_t i = 0; i < ns; ++i) g.strikes.push_back(2 * kPi * static_cast<double>(i) / static_cast<double>(ns));
  for (std::size_t j = 0; j < nd; ++j) g.dips.push_back(kPi / 2 * static_cast<double>(j) / static_cast<double>(nd - 1));
  g.planes.reserve(ns * nd);
  for (double s : g.strikes)
    for (double d : g.dips) g.planes.push_back(FaultPlane::from_strike_dip(s, d));
  return g;
}

std::vector<double> tabulate_critical_pressure(const OrientationGrid& grid, const StressBatch& states) {
  std::vector<double> out(grid.planes.size() * states.size());
  critical_pressure_grid(grid.planes, states, out);
  return out;
}

DangerousOrientation most_dangerous_orientation(const Eigen::Matrix3d& stress, double p0, const Friction& f,
                                                double kappa) {
  StressBatch state;
  state.push_back(stress, p0, f, kappa);
  static const OrientationGrid coarse = make_orientation_grid(2 * kDeg, 2 * kDeg);
  std::vector<double> dp = tabulate_critical_pressure(coarse, state);
  const auto best = static_cast<std::size_t>(std::min_element(dp.begin(), dp.end()) - dp.begin());
  const std::size_t nd = coarse.dips.size();
  DangerousOrientation d{FaultPlane::from_strike_dip(coarse.strikes[best / nd], coarse.dips[best % nd]), dp[best]};
  // Refine: windows of ±2 coarse steps, then ±2 of each finer step (steps 0.2°, 0.02°, 0.002°... ).
  double half = 4 * kDeg;
  for (int level = 0; level < 4; ++level) {
    d = search_window(state, d.plane.strike(), d.plane.dip(), half, 20);
    half /= 10.0;
  }
  return d;
}

}  // namespace slipscreen::geomech
