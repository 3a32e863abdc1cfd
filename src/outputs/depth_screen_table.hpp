#pragma once
// fault_depth.csv: the deterministic screen of faults in depth under the 3-D poroelastic model
// (screening/depth_screen.hpp), one row per segment, output time and depth level.
#include <vector>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/depth_screen.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::outputs {

void write_depth_screen_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                              const screening::PreparedRun& p, const screening::DepthScreen& d);

ReadmeFile depth_screen_readme(const scenario::ResolvedScenario& s);

}  // namespace slipscreen::outputs
