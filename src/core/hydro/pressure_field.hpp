#pragma once
// Pore-pressure change from many wells: Theis line sources (theis.hpp) superposed in time over
// each well's rate history (rate_history.hpp) and in space over all wells and their images
// across straight boundaries (image_wells.hpp). The diffusion equation is linear, so
//   Δp(x, t) = Σ_wells f_w Σ_sources sign_s Σ_{t_j < t} Δq_j · μ/(4π k h) · E1(r_s² / (4 D (t − t_j)))
//                                                     (Theis 1935; Earlougher 1977, ch. 2 and ch. 10)
// Symbols: f_w rate factor of well w [-], sign_s ±1 image sign, Δq_j rate change [m³/s] at t_j
// [s], r_s distance to source s clamped to the well radius r_w [m], D diffusivity [m²/s],
// μ/(4π k h) pressure_per_rate [Pa per m³/s].
//
// Prepared once, varied cheaply (docs/uncertainty.md): a PressureField holds the wells, their rate
// changes and their image sources; PreparedPoints holds the squared distances from a set of
// points to every source. Neither depends on the hydrogeology, which enters evaluate() only
// through TheisParameters (D and μ/(4π k h)) and optional per-well rate factors.
//
// Accuracy: each term is E1 to ≤ 2e-15 relative; the sum adds rounding of order (number of
// terms) · 1e-16 relative to the sum of term magnitudes. Image truncation: see image_wells.hpp.
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include "core/hydro/image_wells.hpp"
#include "core/hydro/rate_history.hpp"
#include "core/hydro/theis.hpp"

namespace slipscreen::hydro {

// A well as the pressure calculation sees it (SI units, projected coordinates).
struct WellSource {
  std::string name;
  double x = 0, y = 0;       // m
  double well_radius = 0.1;  // r_w, m
  RateHistory history;
};

struct FieldPoint {
  double x = 0, y = 0;  // m
};

// Distances from a set of points to every source of every well, prepared once.
struct PreparedPoints {
  std::size_t point_count = 0;
  std::size_t well_count = 0;
  // Sources of (point p, well w) are [offset[p*W + w], offset[p*W + w + 1]) in r2 and sign.
  std::vector<std::size_t> offset;
  std::vector<double> r2;     // squared distance, clamped to r_w², m²
  std::vector<double> sign;   // +1 real well or no-flow image, −1 constant-pressure image
  std::vector<std::uint8_t> clamped;  // [p*W + w]: 1 when the distance to the real well < r_w

  bool was_clamped(std::size_t p, std::size_t w) const { return clamped[p * well_count + w] != 0; }
  bool any_clamped() const;
};

// Δp at every (point, time), Pa; optionally each well's contribution (for well attribution).
struct PressureResult {
  std::size_t point_count = 0, time_count = 0, well_count = 0;
  std::vector<double> total;    // [p * T + t]
  std::vector<double> by_well;  // [(p * T + t) * W + w]; empty unless asked for

  double at(std::size_t p, std::size_t t) const { return total[p * time_count + t]; }
  double contribution(std::size_t p, std::size_t t, std::size_t w) const {
    return by_well[(p * time_count + t) * well_count + w];
  }
};

class PressureField {
 public:
  // Validates the wells (finite location, r_w > 0, each off every boundary and all in the same
  // region) and the boundaries (validate_boundaries), and prepares image sources.
  explicit PressureField(std::vector<WellSource> wells, std::vector<Boundary> boundaries = {},
                         int image_generations = kDefaultImageGenerations);

  const std::vector<WellSource>& wells() const noexcept { return wells_; }
  const std::vector<Boundary>& boundaries() const noexcept { return boundaries_; }
  // Real well first, then its images.
  const std::vector<ImageSource>& sources(std::size_t well) const { return sources_[well]; }

  // Squared distances from each point to every source (InputError for a non-finite point or a
  // point outside the region the boundaries enclose).
  PreparedPoints prepare(std::span<const FieldPoint> points) const;
  // prepare()'s checks without keeping the distances: InputError as there; returns whether some
  // point lies within a real well's radius (PreparedPoints::any_clamped of the same points).
  bool check_points(std::span<const FieldPoint> points) const;

  // Δp at each prepared point and each time [s, same epoch as the histories]. Times at or
  // before a well's first rate change get 0 from that well. `rate_factors` (one per well, or
  // empty for all 1) scale each well's whole history. Deterministic for any thread count.
  PressureResult evaluate(const PreparedPoints& points, std::span<const double> times,
                          const TheisParameters& params, std::span<const double> rate_factors = {},
                          bool per_well = false) const;

  // Δp at point i at times[i] (one time per point, e.g. earthquakes at their origin times);
  // the same sums as evaluate(). Throws InputError unless there is one time per point.
  std::vector<double> evaluate_each(const PreparedPoints& points, std::span<const double> times,
                                    const TheisParameters& params) const;

  // Δp at one point and time (convenience; prepares the point each call).
  double pressure_at(const TheisParameters& params, FieldPoint point, double t) const;

 private:
  std::vector<WellSource> wells_;
  std::vector<Boundary> boundaries_;
  std::vector<std::vector<ImageSource>> sources_;
  void check_point(std::size_t p, const FieldPoint& pt) const;
  std::vector<std::vector<RateChange>> changes_;
};

}  // namespace slipscreen::hydro
