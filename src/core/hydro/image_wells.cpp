// Method of images for straight boundaries; see image_wells.hpp for the method and its sources.
#include "core/hydro/image_wells.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <utility>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/hydro/well_function.hpp"

namespace slipscreen::hydro {
namespace {

constexpr double kAngleTol = 1e-9;

struct Unit {
  double ux, uy;
};

Unit unit_direction(const Boundary& b) {
  const double n = std::hypot(b.dx, b.dy);
  return {b.dx / n, b.dy / n};
}

// Mirror of (x, y) across the line of b.
void reflect(const Boundary& b, double& x, double& y) {
  const Unit u = unit_direction(b);
  const double px = x - b.x0, py = y - b.y0;
  const double along = px * u.ux + py * u.uy;
  const double fx = b.x0 + along * u.ux, fy = b.y0 + along * u.uy;  // foot of the perpendicular
  x = 2.0 * fx - x;
  y = 2.0 * fy - y;
}

std::string boundary_field(std::size_t i) { return "boundary[" + std::to_string(i) + "]"; }

}  // namespace

double signed_distance(const Boundary& b, double x, double y) {
  const Unit u = unit_direction(b);
  return u.ux * (y - b.y0) - u.uy * (x - b.x0);
}

void validate_boundaries(std::span<const Boundary> boundaries) {
  for (std::size_t i = 0; i < boundaries.size(); ++i) {
    const Boundary& b = boundaries[i];
    if (!std::isfinite(b.x0) || !std::isfinite(b.y0))
      throw InputError(boundary_field(i) + ".point", util::number_text(b.x0) + ", " + util::number_text(b.y0),
                       "finite coordinates (m)");
    if (!std::isfinite(b.dx) || !std::isfinite(b.dy) || std::hypot(b.dx, b.dy) == 0.0)
      throw InputError(boundary_field(i) + ".direction", util::number_text(b.dx) + ", " + util::number_text(b.dy),
                       "a finite, non-zero direction");
  }
  for (std::size_t i = 0; i < boundaries.size(); ++i) {
    int parallel = 1;
    for (std::size_t j = 0; j < boundaries.size(); ++j) {
      if (j == i) continue;
      const Unit a = unit_direction(boundaries[i]), c = unit_direction(boundaries[j]);
      const double cross = a.ux * c.uy - a.uy * c.ux;
      const double dot = a.ux * c.ux + a.uy * c.uy;
      const bool is_parallel = std::abs(cross) <= kAngleTol;
      const bool is_perpendicular = std::abs(dot) <= kAngleTol;
      if (!is_parallel && !is_perpendicular)
        throw InputError(boundary_field(j) + ".direction", util::number_text(boundaries[j].dx) + ", " + util::number_text(boundaries[j].dy),
                         "a boundary parallel or perpendicular to " + boundary_field(i) +
                             " (oblique boundaries have no exact image solution here)");
      if (is_parallel) {
        ++parallel;
        if (std::abs(signed_distance(boundaries[i], boundaries[j].x0, boundaries[j].y0)) <= 1e-9)
          throw InputError(boundary_field(j), "same line as " + boundary_field(i),
                           "distinct boundaries");
      }
    }
    if (parallel > 2)
      throw InputError(boundary_field(i), std::to_string(parallel) + " parallel boundaries",
                       "at most two boundaries in one direction (a strip)");
  }
}

bool same_region(std::span<const Boundary> boundaries, double wx, double wy, double x, double y) {
  for (const Boundary& b : boundaries) {
    const double dw = signed_distance(b, wx, wy), dp = signed_distance(b, x, y);
    if (dw * dp < 0.0) return false;
  }
  return true;
}

std::vector<ImageSource> image_wells(double x, double y, std::span<const Boundary> boundaries,
                                     int max_generations) {
  validate_boundaries(boundaries);
  if (!std::isfinite(x) || !std::isfinite(y))
    throw InputError("well location", util::number_text(x) + ", " + util::number_text(y), "finite coordinates (m)");
  for (std::size_t i = 0; i < boundaries.size(); ++i)
    if (signed_distance(boundaries[i], x, y) == 0.0)
      throw InputError("well location", util::number_text(x) + ", " + util::number_text(y),
                       "a well off " + boundary_field(i) + " (a well on a boundary has no image)");

  std::vector<ImageSource> all{{x, y, 1.0, 0}};
  // Images in the last generation, each with the boundary it was last reflected across.
  struct Frontier {
    std::size_t index;
    std::size_t last_boundary;
  };
  std::vector<Frontier> frontier{{0, boundaries.size()}};
  // Two images coincide when they agree to round-off of repeated reflections; positions are
  // bucketed on a grid of `cell` and neighbouring buckets are checked too.
  double scale = std::hypot(x, y);
  for (const Boundary& b : boundaries) scale = std::max(scale, std::hypot(b.x0, b.y0));
  const double cell = 1e-6 * std::max(scale, 1.0);
  std::map<std::pair<long long, long long>, std::size_t> seen;
  const auto key = [cell](double v) { return std::llround(v / cell); };
  const auto known = [&](double sx, double sy) {
    const long long kx = key(sx), ky = key(sy);
    for (long long ix = kx - 1; ix <= kx + 1; ++ix)
      for (long long iy = ky - 1; iy <= ky + 1; ++iy)
        if (seen.count({ix, iy})) return true;
    return false;
  };
  seen[{key(x), key(y)}] = 0;

  for (int g = 1; g <= max_generations && !frontier.empty(); ++g) {
    std::vector<Frontier> next;
    for (const Frontier& f : frontier) {
      for (std::size_t bi = 0; bi < boundaries.size(); ++bi) {
        if (bi == f.last_boundary) continue;  // reflecting back gives the parent
        ImageSource s = all[f.index];
        reflect(boundaries[bi], s.x, s.y);
        s.sign *= boundaries[bi].kind == BoundaryKind::no_flow ? 1.0 : -1.0;
        s.generation = g;
        if (known(s.x, s.y)) continue;
        seen[{key(s.x), key(s.y)}] = all.size();
        all.push_back(s);
        next.push_back({all.size() - 1, bi});
      }
    }
    frontier = std::move(next);
  }
  return all;
}

double image_truncation_bound(double d_min, double spacing, double diffusivity, double t) {
  if (!(t > 0.0)) return 0.0;
  double sum = 0.0;
  for (int n = 0; n < 100000; ++n) {
    const double d = d_min + 2.0 * n * spacing;
    const double term = well_function(d * d / (4.0 * diffusivity * t));
    sum += term;
    if (term < 1e-18 * sum || term == 0.0) break;
  }
  return 2.0 * sum;
}

}  // namespace slipscreen::hydro
