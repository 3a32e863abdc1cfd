#pragma once
// The wells of a [[what_if]] entry and the split the probabilistic screen needs for it
// (RunSettings::what_if; what_if.hpp).
#include <string>
#include <vector>

#include "core/probabilistic/screen_inputs.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

// The entry's wells: its ids, or the wells within its radius of a check point of its fault
// (working CRS). InputError naming the entry for an unknown fault or no well in the radius.
std::vector<std::string> what_if_wells(const scenario::WhatIfSpec& w, const PreparedRun& p);

// The split the probabilistic screen needs for the entry (RunSettings::what_if).
probabilistic::GroupSplit what_if_split(const scenario::WhatIfSpec& w, const PreparedRun& p,
                                        const std::vector<probabilistic::WellInput>& wells);

}  // namespace slipscreen::screening
