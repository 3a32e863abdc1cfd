#pragma once
// Horizontal stress magnitudes at depth from gradients or from the uniaxial-strain model.
//
// Sources:
//   Shmin = ν/(1−ν) (Sv − α p0) + α p0            uniaxial strain: Eaton (1969), JPT 21(10), for
//                                                  α = 1; with Biot's α, Zoback (2007) ch. 9
//                                                  (chapter number from memory)
//   tectonic strain terms (poroelastic horizontal strain model):
//   Shmin += E/(1−ν²) εh + E ν/(1−ν²) εH,  SHmax = ν/(1−ν)(Sv − αp0) + αp0 + E/(1−ν²) εH + E ν/(1−ν²) εh
//                                                  Blanton & Olson (1999), SPE Res. Eval. & Eng. 2(1)
//   (the model's form is recalled from memory; with εh = εH = 0 it is the uniaxial-strain model)
//
// Symbol table (code -> literature):
//   poisson        ν      Poisson's ratio (drained), [0, 0.5)
//   biot           α      Biot coefficient, [0, 1]
//   young          E      Young's modulus (drained), Pa
//   strain_h/_H    εh, εH tectonic strains along Shmin and SHmax (extension negative)
//   tectonic_h/_H  σt     optional additional tectonic stresses, Pa
#include "core/geomech/stress_state.hpp"

namespace slipscreen::geomech {

struct UniaxialStrainModel {
  double poisson = 0.25;     // ν
  double biot = 1.0;         // α
  double young = 0.0;        // E, Pa (needed only with non-zero strains)
  double strain_h = 0.0;     // εh, along Shmin
  double strain_H = 0.0;     // εH, along SHmax
  double tectonic_h = 0.0;   // σt,h added to Shmin, Pa
  double tectonic_H = 0.0;   // σt,H added to SHmax, Pa
};

// Throws InputError naming the field: ν outside [0, 0.5), α outside [0, 1], E < 0 or missing
// with non-zero strain, non-finite terms.
void check(const UniaxialStrainModel& m);

// Horizontal stresses of the uniaxial-strain model plus tectonic terms (exact arithmetic;
// valid for a laterally confined, linear poroelastic, isotropic layer). The result is not
// ordered: a caller builds AndersonianStress and check() rejects Shmin > SHmax.
HorizontalStresses horizontal_stresses_uniaxial_strain(const UniaxialStrainModel& m, double sv, double p0);

// SHmax and Shmin from gradients times depth (common practice). Domain: depth ≥ 0,
// gradients ≥ 0.
HorizontalStresses horizontal_stresses_from_gradients(double shmax_gradient, double shmin_gradient, double depth);

}  // namespace slipscreen::geomech
