#pragma once
// Reading the scenario's [[what_if]] entries (docs/scenario.md). Used inside this layer only.
#include <vector>

#include "formats/toml/toml_section.hpp"
#include "scenario/wells.hpp"
#include "scenario/what_if_spec.hpp"

namespace slipscreen::scenario {

// One entry; `wells` are the scenario's (ids named must be among them).
WhatIfSpec read_what_if(const formats::Section& s, const std::vector<WellSpec>& wells);

}  // namespace slipscreen::scenario
