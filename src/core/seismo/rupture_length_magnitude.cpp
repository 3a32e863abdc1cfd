#include "core/seismo/rupture_length_magnitude.hpp"

#include <cmath>
#include <cstdio>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::seismo {
namespace {

struct Coefficients {
  double a, b, s, lmin_km, lmax_km;
};

Coefficients coefficients(LengthRegression r) {
  switch (r) {
    // Wells & Coppersmith (1994) Table 2A, M = a + b log(SRL), all slip types (from memory).
    case LengthRegression::surface_rupture_length_all: return {5.08, 1.16, 0.28, 1.3, 432.0};
    // Wells & Coppersmith (1994) Table 2A, M = a + b log(RLD), all slip types.
    case LengthRegression::subsurface_rupture_length_all: return {4.38, 1.49, 0.26, 1.1, 350.0};
  }
  return {0, 0, 0, 0, 0};
}

}  // namespace

// Wells & Coppersmith (1994): M = a + b log10(L / km).
LengthMagnitude magnitude_from_length(double length, LengthRegression regression) {
  if (!(length > 0.0) || !std::isfinite(length)) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", length);
    throw InputError("fault length", buf, "a positive length such as '4 km'");
  }
  const auto c = coefficients(regression);
  const double km = length / 1000.0;
  LengthMagnitude out;
  out.magnitude = c.a + c.b * std::log10(km);
  out.sd = c.s;
  out.length_min = c.lmin_km * 1000.0;
  out.length_max = c.lmax_km * 1000.0;
  out.extrapolated = km < c.lmin_km || km > c.lmax_km;
  return out;
}

const char* regression_name(LengthRegression regression) {
  switch (regression) {
    case LengthRegression::surface_rupture_length_all:
      return "Wells & Coppersmith (1994) surface rupture length, all slip types";
    case LengthRegression::subsurface_rupture_length_all:
      return "Wells & Coppersmith (1994) subsurface rupture length, all slip types";
  }
  return "";
}

}  // namespace slipscreen::seismo
