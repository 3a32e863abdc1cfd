#pragma once
// The report's colours (docs/report.md): sequential ramps that are perceptually uniform and readable
// with the common colour-vision deficiencies, and one categorical palette.
//
// - Probability: viridis (van der Walt & Smith 2015; the matplotlib colour map, CC0), 17 stops
//   sampled from matplotlib 3.6 (a general-purpose reference library) and interpolated linearly in
//   sRGB between them.
// - Pressure change: magma (same source), light to dark, without its darkest eighth so that
//   black text and fault lines stay readable on it.
// - Categories: the colour-blind-safe palette of Okabe & Ito (2008), values recalled from memory
//   and checked against their published hex codes' common reproductions.
#include <cstddef>

#include "formats/drawing/canvas.hpp"

namespace slipscreen::outputs::report {

enum class Ramp { probability, pressure };

// The ramp's colour at t (clamped to 0..1).
formats::Colour ramp_colour(Ramp ramp, double t);

// The i-th categorical colour (cycles after eight).
formats::Colour category_colour(std::size_t i);

}  // namespace slipscreen::outputs::report
