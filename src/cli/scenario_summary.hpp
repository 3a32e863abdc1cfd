#pragma once
// A plain-text summary of a resolved scenario (validate, run and demo print it).
#include <iosfwd>

#include "scenario/scenario.hpp"

namespace slipscreen::cli {

void print_scenario_summary(const scenario::ResolvedScenario& s, std::ostream& out);

}  // namespace slipscreen::cli
