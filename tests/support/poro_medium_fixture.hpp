#pragma once
// The poroelastic solid shared by the tests of core/poro: a sandstone-like medium (values of the
// order of Rice & Cleary 1976, Table 1, from memory; any valid medium serves those checks).
#include "core/poro/rudnicki.hpp"

namespace slipscreen::test {

inline poro::PoroelasticMedium sandstone_medium() {
  poro::PoroelasticMedium m;
  m.shear_modulus = 6e9;
  m.poisson_drained = 0.2;
  m.poisson_undrained = 0.33;
  m.biot = 0.8;
  m.permeability = 1e-14;
  m.viscosity = 5e-4;
  return m;
}

}  // namespace slipscreen::test
