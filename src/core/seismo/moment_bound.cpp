#include "core/seismo/moment_bound.hpp"

#include <cmath>
#include <cstdio>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
// McGarr (2014): M0_max = G ΔV.
double mcgarr_max_moment(double shear_modulus, double net_volume) {
  if (!(shear_modulus > 0.0) || !std::isfinite(shear_modulus))
    throw InputError("shear modulus", util::number_text(shear_modulus, 6), "a positive modulus such as '30 GPa'");
  if (!(net_volume >= 0.0) || !std::isfinite(net_volume))
    throw InputError("net injected volume", util::number_text(net_volume, 6), "a volume >= 0 such as '1e6 m3'");
  return shear_modulus * net_volume;
}

// IASPEI (2013): Mw = (2/3)(log10 M0 - 9.1).
double moment_magnitude(double moment) {
  if (!(moment > 0.0) || !std::isfinite(moment))
    throw InputError("seismic moment", util::number_text(moment, 6), "a positive moment in N·m");
  return (2.0 / 3.0) * (std::log10(moment) - 9.1);
}

// IASPEI (2013), inverted: M0 = 10^(1.5 Mw + 9.1).
double seismic_moment(double mw) {
  if (!std::isfinite(mw)) throw InputError("moment magnitude", util::number_text(mw, 6), "a finite magnitude");
  return std::pow(10.0, 1.5 * mw + 9.1);
}

}  // namespace slipscreen::seismo
