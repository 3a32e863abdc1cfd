#pragma once
// Magnitude of completeness Mc by the maximum-curvature method.
//
// Source: Wiemer, S. & Wyss, M. (2000), "Minimum magnitude of completeness in earthquake
// catalogs: examples from Alaska, the western United States, and Japan", BSSA 90(4), 859-869.
//
// Symbol table (code -> paper):
//   magnitudes      M_i        event magnitudes
//   bin_width       ΔM         magnitude bin width of the frequency-magnitude distribution (FMD)
//   mc_curvature    Mc(MAXC)   magnitude bin with the highest non-cumulative count, i.e. the
//                              point of maximum curvature (largest first derivative) of the
//                              cumulative FMD
//   correction      +0.2       optional empirical increment applied to Mc(MAXC) because the
//                              method tends to underestimate Mc for gradually curved FMDs
//                              (Woessner & Wiemer 2005, BSSA 95(2); common practice)
#include <cstddef>
#include <span>
#include <vector>

namespace slipscreen::seismo {

// One bin of the non-cumulative frequency-magnitude distribution.
struct MagnitudeBin {
  double centre = 0.0;   // bin centre, a multiple of ΔM
  std::size_t count = 0; // events whose magnitude rounds to this centre
};

// Non-cumulative FMD: magnitudes rounded to the nearest multiple of bin_width (half-way cases
// round away from zero after a relative tolerance of 1e-9 ΔM, so 1.05 with ΔM = 0.1 reported as
// 1.0499999 still lands in 1.1), every bin from the lowest to the highest occupied one listed,
// empty bins included. Throws InputError if bin_width <= 0 or a magnitude is not finite.
std::vector<MagnitudeBin> frequency_magnitude_distribution(std::span<const double> magnitudes,
                                                           double bin_width);

// Snap a magnitude to its bin centre, the same rounding as above.
double bin_centre(double magnitude, double bin_width);

struct Completeness {
  double mc = 0.0;              // reported Mc = mc_curvature + correction
  double mc_curvature = 0.0;    // Mc(MAXC) before the correction
  double correction = 0.0;      // the increment applied (0 unless asked for)
  std::size_t modal_count = 0;  // events in the modal bin
  std::size_t events = 0;       // events in the sample
};

// Mc by maximum curvature (Wiemer & Wyss 2000): the centre of the FMD bin with the largest
// count; when several bins share the largest count the lowest magnitude is taken (deterministic).
// Valid domain: a catalog large enough for its FMD to show a mode (practice: >= ~50 events;
// with fewer the estimate is very uncertain). Accuracy: exact to the bin width by construction;
// as an estimate of the true Mc it is biased low by ~0.1-0.2 for curved FMDs (hence the
// optional correction). Throws InputError for an empty sample or bin_width <= 0.
Completeness maximum_curvature(std::span<const double> magnitudes, double bin_width,
                               double correction = 0.0);

}  // namespace slipscreen::seismo
