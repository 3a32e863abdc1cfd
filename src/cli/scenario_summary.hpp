#pragma once
// A plain-text summary of a resolved scenario (validate, run and demo print it).
#include <iosfwd>

#include "io/scenario.hpp"

namespace slipscreen::cli {

void print_scenario_summary(const io::ResolvedScenario& s, std::ostream& out);

}  // namespace slipscreen::cli
