#pragma once
// fault_depth.csv: the deterministic screen of faults in depth under the 3-D poroelastic model
// (screening/depth_screen.hpp), one row per segment and output time; with [uncertainty]
// fault_depth_probability.csv: P(slip by each output time) per segment with its Wilson interval
// (screening/depth_probability.hpp).
#include <vector>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include <nlohmann/json.hpp>

#include "screening/depth_probability.hpp"
#include "screening/depth_screen.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::outputs {

void write_depth_screen_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                              const screening::PreparedRun& p, const screening::DepthScreen& d);

ReadmeFile depth_screen_readme(const scenario::ResolvedScenario& s);

void write_depth_probability_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                                   const screening::PreparedRun& p, const screening::DepthProbability& d);
ReadmeFile depth_probability_readme(const scenario::ResolvedScenario& s);
// The manifest's "depth_probability" block: the [uncertainty] spec, sampler, stream and inputs.
nlohmann::json depth_probability_manifest(const scenario::ResolvedScenario& s, const screening::DepthProbability& d);

}  // namespace slipscreen::outputs
