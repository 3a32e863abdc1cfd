#pragma once
// Reading the scenario's [capacity] table (docs/scenario.md). Used inside this layer only: it
// takes the TOML layer's Section, which stays out of the layer's public headers.
#include <vector>

#include "formats/toml/toml_section.hpp"
#include "scenario/capacity_spec.hpp"
#include "scenario/wells.hpp"

namespace slipscreen::scenario {

// `wells` are the scenario's (existing, then proposed): every id named must be one of them, and
// without `wells` the group is the proposed wells (an error when there are none).
CapacitySpec read_capacity_spec(const formats::Section& s, const std::vector<WellSpec>& wells);

}  // namespace slipscreen::scenario
