#pragma once
// Δp on a raster grid at many output times, from many wells with long piecewise-constant rate
// histories (Theis line sources superposed in time and space), with a stated error bound.
//
// Model: Theis (1935) with superposition in time and space (docs/pressure.md), exactly as
// PressureField (pressure_field.hpp) evaluates it, including image wells of straight boundaries:
//   Δp(x, y, t) = Σ_sources C f_w sign_s Σ_j Δq_{w,j} E1(r_s² / (4 D (t − τ_{w,j}))),  τ_{w,j} < t,
// with C = μ/(4π k h) = ρ g/(4π T) and D = k/(μ φ c_t) = T/S (TheisParameters), rate factors f_w,
// image signs ±1, r_s clamped to the well radius of well w.
//
// Symbol table (code -> paper): pressure_per_rate C, diffusivity D, well_radius r_w, rates q,
// step starts τ, x/y/r map position and distance, E1 the well function W(u), s = ln r.
//
// Raster convention (the GDAL geotransform of a north-up raster, GT = (origin_x, cell_x, 0,
// origin_y, 0, cell_y)): pixel (i, j) — column i in [0, nx), row j in [0, ny) — is the cell
// whose corner nearest the origin is (origin_x + i·cell_x, origin_y + j·cell_y); Δp is evaluated
// at its centre (origin_x + (i + 0.5)·cell_x, origin_y + (j + 0.5)·cell_y). For a north-up raster
// origin_y is the top edge and cell_y < 0. Values are stored time-major then row-major:
// values[(k·ny + j)·nx + i]. Pixels whose centre lies outside the region the boundaries enclose
// (beyond a boundary from the wells) are NaN (no data): the model does not describe them.
//
// Fast path (pressure_grid): per source and output time, the radial profile
// f(s) = Δp_w(r = e^s, t) is tabulated exactly (by the superposition above) at nodes uniform in
// s = ln r from ln r_w with spacing h, together with its exact derivative
// df/ds = −2 C Σ_j Δq_j exp(−u_j); each pixel takes the cubic Hermite interpolant in s.
// Tabulation shares the E1 evaluations of all sources (wells and images) on the union of their
// step times (one matrix product per output time), so a long monthly history costs little.
//
// Error bound (absolute, Pa, everywhere on the grid and at every output time):
//   |fast − direct| ≤ ε = relative_tolerance × threshold (default 1e-4 × 1 kPa = 0.1 Pa),
// hence ≤ 1e-4 relative to the direct sum wherever |Δp| ≥ 1 kPa. ε is split as
//   interpolation ≤ ε/2: cubic Hermite error ≤ h⁴/384 · max|f⁗| (e.g. de Boor 2001, A Practical
//     Guide to Splines, ch. II) and, by Duhamel's form f = C ∫ q(τ) e^{−u}/θ dθ,
//     |f⁗(s)| ≤ 16 I C max|q| with I = ∫₀^∞ e^{−x} |x³ − 6x² + 7x − 1| dx = 1.7830162035
//     for any rate history; h is chosen so that Σ_w h⁴/384 · 16 I C max|q_w| ≤ ε/2;
//   (sums over sources count each image separately, with max|q| including its rate factor);
//   distance cut-off ≤ ε/4: source w is skipped beyond R_w where
//     C max|q_w| E1(R_w² / (4 D (t − τ_{w,first}))) equals its share ε/4 · max|q_w| / Σ max|q|
//     (|Δp_w(r, t)| ≤ C max|q_w| E1(r²/(4 D (t − τ_first))) for every history: the weights of
//     the telescoped sum are non-negative and add up to that E1);
//   the remaining ε/4 covers rounding (double precision throughout; E1 to 1e-15 relative).
// Results are deterministic and independent of the number of OpenMP threads (each pixel sums
// its sources in input order); they may differ between instruction sets (AVX2/FMA dispatch)
// within the bound.
#include <cstddef>
#include <span>
#include <vector>

#include "core/hydro/pressure_field.hpp"
#include "core/hydro/theis.hpp"

namespace slipscreen::hydro {

// I = ∫₀^∞ e^{−x} |x³ − 6x² + 7x − 1| dx, exact from the antiderivative −e^{−x}(P + P′ + P″ + P‴)
// between the three roots of P (arithmetic; checked by quadrature in the tests). 16 I C max|q|
// bounds the fourth s-derivative of any single source's profile.
inline constexpr double kProfileFourthDerivativeIntegral = 1.7830162035426502;

// The raster: see the convention above.
struct GridGeometry {
  double origin_x = 0.0;  // m, working CRS (GDAL GT[0])
  double origin_y = 0.0;  // m (GT[3])
  double cell_x = 1.0;    // m, pixel width (GT[1]), > 0
  double cell_y = -1.0;   // m, pixel height (GT[5]), non-zero; negative for north-up
  std::size_t nx = 0;     // columns
  std::size_t ny = 0;     // rows

  double centre_x(std::size_t i) const { return origin_x + (double(i) + 0.5) * cell_x; }
  double centre_y(std::size_t j) const { return origin_y + (double(j) + 0.5) * cell_y; }
};

// Throws InputError unless the origin and cell sizes are finite, cell_x > 0, cell_y ≠ 0 and the
// raster has at least one pixel.
void validate(const GridGeometry& g);

struct PressureGridOptions {
  double threshold = 1e3;            // Pa: the relative accuracy holds where |Δp| ≥ threshold
  double relative_tolerance = 1e-4;  // relative error allowed there; ε = product (absolute)
  double max_table_bytes = 512e6;    // memory for profile tables; output times are processed
                                     // in blocks to stay below it (NumericalError when even
                                     // one output time's tables exceed it)
};

struct PressureGrid {
  GridGeometry geometry;
  std::vector<double> times;   // s, as requested
  std::vector<double> values;  // Pa, values[(k·ny + j)·nx + i]; NaN outside the region
  double error_bound = 0.0;    // Pa: |values − direct sum| ≤ error_bound everywhere (fast path)
  double node_spacing = 0.0;   // h, spacing of the profile nodes in ln r (fast path)
  std::size_t profile_nodes = 0;  // total nodes over all sources and time blocks (fast path)

  double at(std::size_t k, std::size_t i, std::size_t j) const {
    return values[(k * geometry.ny + j) * geometry.nx + i];
  }
};

// Fast path: Δp on the grid at `times` from every well of `field` and its images, within
// `error_bound` of the direct sum (see above). `rate_factors`: one per well, or empty for all 1.
// Times at or before a well's first step get 0 from it. Throws InputError for an invalid raster,
// TheisParameters, rate factors or times (non-finite), or options out of range. Memory is
// bounded before anything is allocated: the node spacing h shrinks as (ε / (C Σ max|q|))^¼, and
// NumericalError refuses a grid that would need more than 1e5 profile nodes per source or more
// than max_table_bytes of tables for one output time (absurd rates, such as 1e25 bbl/d).
PressureGrid pressure_grid(const GridGeometry& geometry, const PressureField& field,
                           const TheisParameters& params, std::span<const double> times,
                           std::span<const double> rate_factors = {},
                           const PressureGridOptions& options = {});

// Explicit sources (images already expanded by the caller, each with its signed rates) in one
// formation: C = prefactor, D = diffusivity, one clamp radius. Same method and bound as above;
// no region mask (every pixel is evaluated).
struct GridFormation {
  double prefactor = 0.0;    // C = μ/(4π k h) = ρ g/(4π T), Pa per m³/s
  double diffusivity = 0.0;  // D = k/(μ φ c_t) = T/S, m²/s
  double well_radius = 0.1;  // r_w, m: distances below it are clamped to it
};
struct GridSource {
  double x = 0.0, y = 0.0;    // m, working CRS
  std::vector<double> start;  // s, strictly increasing
  std::vector<double> rate;   // m³/s from start[j] until start[j+1]; signed (image producer < 0)
};
PressureGrid pressure_grid(const GridGeometry& geometry, const GridFormation& formation,
                           std::span<const GridSource> sources, std::span<const double> times,
                           const PressureGridOptions& options = {});

// Reference: the direct sum of PressureField::evaluate at every pixel centre (no cut-off, no
// interpolation); error_bound is 0. Same validation and the same NaN outside the region.
PressureGrid pressure_grid_direct(const GridGeometry& geometry, const PressureField& field,
                                  const TheisParameters& params, std::span<const double> times,
                                  std::span<const double> rate_factors = {});

}  // namespace slipscreen::hydro
