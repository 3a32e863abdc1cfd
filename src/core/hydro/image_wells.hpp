#pragma once
// Straight boundaries by the method of images (Ferris et al. 1962, USGS Water-Supply Paper
// 1536-E; Earlougher 1977, ch. 10.2): a real well near a straight boundary is replaced by the
// well plus its mirror image across the line in an infinite formation.
//   no-flow boundary (sealing fault, pinch-out):        image of the same sign (image injector)
//   constant-pressure boundary (outcrop, recharge):     image of opposite sign (image producer)
// Several boundaries are allowed when every pair is parallel or perpendicular (a wedge of 90°,
// a strip, a rectangle, or combinations). Images of images are generated breadth first by
// reflecting across every boundary, with the sign multiplied by −1 for each constant-pressure
// reflection. Perpendicular-only sets close after two generations (exact). A parallel pair gives
// an infinite row of images: the row is truncated after `max_generations` reflections (default
// 40). Images of generation g lie at least (g − 1)·W from every point of a strip of width W, so
// the omitted ones are ≥ 40 W away and their sum is < 2e-8 · |q| μ/(4π k h) while
// √(4 D t) ≤ 10 W (E1(16) = 6.4e-9 for the nearest pair); image_truncation_bound() gives the
// bound for any case.
//
// Symbols: boundary point (x0, y0) [m] and direction (dx, dy) of the line, well (x, y) [m],
// image sign ±1 (multiplies the real well's rate).
#include <span>
#include <vector>

namespace slipscreen::hydro {

enum class BoundaryKind { no_flow, constant_pressure };

// A straight boundary: the line through (x0, y0) with direction (dx, dy) (need not be unit).
struct Boundary {
  BoundaryKind kind = BoundaryKind::no_flow;
  double x0 = 0, y0 = 0;
  double dx = 1, dy = 0;
};

// A source in the infinite formation: the real well (sign +1, generation 0) or an image.
struct ImageSource {
  double x, y;
  double sign;     // +1: same rate as the real well, −1: opposite rate
  int generation;  // number of reflections (0 = the real well)
};

inline constexpr int kDefaultImageGenerations = 40;

// Throws InputError for a zero or non-finite direction, a non-finite point, a pair of
// boundaries that is neither parallel nor perpendicular (within 1e-9 rad), coincident
// boundaries, or more than two boundaries in one direction.
void validate_boundaries(std::span<const Boundary> boundaries);

// Signed distance of (x, y) from the boundary line (positive on the left of the direction).
double signed_distance(const Boundary& b, double x, double y);

// True when (x, y) is on the same side of every boundary as (wx, wy) (or on the boundary):
// points and wells must lie in the one region the boundaries enclose.
bool same_region(std::span<const Boundary> boundaries, double wx, double wy, double x, double y);

// The real well and its images (the real well first). The well must not lie on a boundary.
std::vector<ImageSource> image_wells(double x, double y, std::span<const Boundary> boundaries,
                                     int max_generations = kDefaultImageGenerations);

// Upper bound on |Δp error| / (|q| μ/(4π k h)) from truncating images farther than the nearest
// omitted one, at distance d_min from the evaluation point, for diffusivity D and time t: an
// image row with spacing 2W beyond d_min sums to ≤ 2 Σ_n E1((d_min + 2nW)²/(4 D t)).
double image_truncation_bound(double d_min, double spacing, double diffusivity, double t);

}  // namespace slipscreen::hydro
