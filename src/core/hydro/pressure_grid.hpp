#pragma once
// Δp on a raster grid at many output times, from many wells with long piecewise-constant rate
// histories (Theis line sources superposed in time and space), with a stated error bound.
//
// Model: Theis (1935) with superposition in time and space (BRIEF 2.1):
//   Δp(x, y, t) = Σ_w C Σ_j (q_{w,j} − q_{w,j−1}) E1(r_w² / (4 D (t − τ_{w,j}))),  τ_{w,j} < t,
// with C = μ/(4π k h) (or ρ g/(4π T)), D = k/(μ φ c_t) (or T/S), r clamped to the well radius.
// Image wells (method of images) are simply more sources: an image injector for a no-flow
// boundary, an image producer (negated rates) for a constant-pressure boundary.
//
// Symbol table (code -> paper): prefactor C, diffusivity D, well_radius r_w, rates q, step
// starts τ, x/y/r map position and distance, E1 the well function W(u).
//
// Raster convention (the GDAL geotransform of a north-up raster, GT = (origin_x, cell_x, 0,
// origin_y, 0, cell_y)): pixel (i, j) — column i in [0, nx), row j in [0, ny) — is the cell
// whose corner nearest the origin is (origin_x + i·cell_x, origin_y + j·cell_y); Δp is evaluated
// at its centre (origin_x + (i + 0.5)·cell_x, origin_y + (j + 0.5)·cell_y). For a north-up raster
// origin_y is the top edge and cell_y < 0. Values are stored time-major then row-major:
// values[(k·ny + j)·nx + i].
//
// Fast path (pressure_grid): per source and output time, the radial profile
// f(s) = Δp_w(r = e^s, t) is tabulated exactly (by the superposition above) at nodes uniform in
// s = ln r from ln r_w with spacing h, together with its exact derivative
// df/ds = −2 C Σ_j Δq_j exp(−u_j); each pixel takes the cubic Hermite interpolant in s.
// Tabulation shares the E1 evaluations of all sources on the union of their step times
// (one matrix product per output time), so a long monthly history costs little.
//
// Error bound (absolute, Pa, everywhere on the grid and at every output time):
//   |fast − direct| ≤ ε = relative_tolerance × threshold (default 1e-4 × 1 kPa = 0.1 Pa),
// hence ≤ 1e-4 relative to the direct sum wherever |Δp| ≥ 1 kPa. ε is split as
//   interpolation ≤ ε/2: cubic Hermite error ≤ h⁴/384 · max|f⁗| (e.g. de Boor 2001, A Practical
//     Guide to Splines, ch. II) and, by Duhamel's form f = C ∫ q(τ) e^{−u}/θ dθ,
//     |f⁗(s)| ≤ 16 I C max|q| with I = ∫₀^∞ e^{−x} |x³ − 6x² + 7x − 1| dx = 1.7830162035
//     for any rate history; h is chosen so that Σ_w h⁴/384 · 16 I C max|q_w| ≤ ε/2;
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

// Formation seen by every source: Δp per unit E1 and rate, and the diffusivity.
struct GridFormation {
  double prefactor = 0.0;    // C = μ/(4π k h) = ρ g/(4π T), Pa per m³/s
  double diffusivity = 0.0;  // D = k/(μ φ c_t) = T/S, m²/s
  double well_radius = 0.1;  // r_w, m: distances below it are clamped to it
};

// One source (well or image well): rate[j] from start[j] until start[j+1] (the last one
// onwards); zero before start[0]. Injection positive, production (or an image producer) negative.
struct GridSource {
  double x = 0.0;  // m, working CRS
  double y = 0.0;  // m
  std::vector<double> start;  // s, strictly increasing
  std::vector<double> rate;   // m³/s, same length as start
};

struct PressureGridOptions {
  double threshold = 1e3;            // Pa: the relative accuracy holds where |Δp| ≥ threshold
  double relative_tolerance = 1e-4;  // relative error allowed there; ε = product (absolute)
  double max_table_bytes = 512e6;    // memory for profile tables; output times are processed
                                     // in blocks to stay below it
};

struct PressureGrid {
  GridGeometry geometry;
  std::vector<double> times;   // s, as requested
  std::vector<double> values;  // Pa, values[(k·ny + j)·nx + i]
  double error_bound = 0.0;    // Pa: |values − direct sum| ≤ error_bound everywhere (fast path)
  double node_spacing = 0.0;   // h, spacing of the profile nodes in ln r (fast path)
  std::size_t profile_nodes = 0;  // total nodes over all sources and time blocks (fast path)

  double at(std::size_t k, std::size_t i, std::size_t j) const {
    return values[(k * geometry.ny + j) * geometry.nx + i];
  }
};

// Fast path: Δp on the grid at `times`, within `error_bound` of the direct sum (see above).
// Times before every source's first step give 0. Throws InputError for an empty or invalid
// raster, non-positive or non-finite formation values, a source with unsorted or mismatched
// steps or non-finite values, non-finite times, or options out of range.
PressureGrid pressure_grid(const GridGeometry& geometry, const GridFormation& formation,
                           std::span<const GridSource> sources, std::span<const double> times,
                           const PressureGridOptions& options = {});

// Reference: the direct sum over sources and rate steps at every pixel (no cut-off, no
// interpolation). error_bound is the E1 rounding only (0 reported). Same validation.
PressureGrid pressure_grid_direct(const GridGeometry& geometry, const GridFormation& formation,
                                  std::span<const GridSource> sources, std::span<const double> times);

// Reference at one point: Δp(x, y, t_k) for every k, by the direct sum.
std::vector<double> pressure_direct_at(const GridFormation& formation,
                                       std::span<const GridSource> sources, double x, double y,
                                       std::span<const double> times);

}  // namespace slipscreen::hydro
