#pragma once
// Magnitude from fault (rupture) length by an empirical regression, for a per-fault bound on
// the largest earthquake a mapped fault could host if it ruptured along its whole length.
//
// Source: Wells, D. L. & Coppersmith, K. J. (1994), "New empirical relationships among
//   magnitude, rupture length, rupture width, rupture area, and surface displacement",
//   BSSA 84(4), 974-1002, Table 2A, all slip types:
//     surface rupture length:     M = 5.08 + 1.16 log10(SRL/km),  s = 0.28, SRL 1.3-432 km,
//                                 M 5.2-8.1                        (coefficients from memory)
//     subsurface rupture length:  M = 4.38 + 1.49 log10(RLD/km),  s = 0.26, RLD 1.1-350 km,
//                                 M 4.8-8.1          (read from a scanned copy of Table 2A)
//
// Symbol table (code -> paper):
//   length      SRL or RLD   rupture length (code: m; the regression: km)
//   magnitude   M            moment magnitude
//   sd          s            standard deviation of the regression, magnitude units
namespace slipscreen::seismo {

enum class LengthRegression {
  surface_rupture_length_all,     // Wells & Coppersmith (1994) Table 2A, SRL, all slip types
  subsurface_rupture_length_all,  // Wells & Coppersmith (1994) Table 2A, RLD, all slip types
};

struct LengthMagnitude {
  double magnitude = 0.0;     // M from the regression
  double sd = 0.0;            // s of the regression
  bool extrapolated = false;  // length outside the regression's data range
  double length_min = 0.0;    // data range of the regression, m
  double length_max = 0.0;
};

// Magnitude for a rupture of `length` metres along the whole mapped fault.
// Valid domain: the regression's length range (flag `extrapolated` set outside it; most faults
// mapped around injection wells are shorter than 1 km, where the regressions are extrapolations).
// Accuracy: the regression's s (0.26-0.28 magnitude units, one standard deviation).
// Throws InputError for length <= 0.
LengthMagnitude magnitude_from_length(double length, LengthRegression regression);

// Name of the regression for reports, e.g. "Wells & Coppersmith (1994) SRL, all slip types".
const char* regression_name(LengthRegression regression);

}  // namespace slipscreen::seismo
