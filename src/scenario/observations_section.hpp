#pragma once
// Reading the scenario's [observations] table (docs/conditioning.md). Used inside this layer
// only: it takes the TOML layer's Section, which stays out of the layer's public headers.
#include <string>

#include "formats/toml/toml_section.hpp"
#include "scenario/observations.hpp"

namespace slipscreen::scenario {

// `wells_crs`: the CRS of the wells (observations without their own "# crs:" line use it);
// `pore_pressure_gradient`: the region's (Pa/m), for absolute pressures.
ObservationsSpec read_observations_spec(const formats::Section& s, const std::string& wells_crs,
                                        double pore_pressure_gradient);

}  // namespace slipscreen::scenario
