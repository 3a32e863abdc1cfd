#pragma once
// The what-if variants' file in a run folder (screening/what_if.hpp; docs/outputs.md):
// what_if.csv, one row per fault segment and output time with P(slip) of the base and of every
// variant and the change; its README line, manifest block and console lines.
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/what_if.hpp"

namespace slipscreen::outputs {

// Segments listed per variant on the console (largest change at the last output time first).
inline constexpr std::size_t kWhatIfConsoleSegments = 5;

void write_what_if_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                         const screening::WhatIfResult& w);
std::vector<ReadmeFile> what_if_readme(const screening::WhatIfResult& w);
nlohmann::json what_if_manifest(const screening::WhatIfResult& w);
std::vector<std::string> what_if_console(const scenario::ResolvedScenario& s, const screening::WhatIfResult& w);

}  // namespace slipscreen::outputs
