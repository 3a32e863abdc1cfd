#pragma once
// segment_pressure_history.csv (docs/outputs.md): Δp by well on the monthly grid at the segments
// closest to failure (screening/pressure_history.hpp), the data of the report's stacked
// pressure figure. Written beside segment_times.csv when [output] tables is on.
#include <vector>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/pressure_history.hpp"

namespace slipscreen::outputs {

// The table's name inside the run folder.
std::string pressure_history_path(const scenario::ResolvedScenario& s);

void write_pressure_history(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                            const screening::PreparedRun& p, const screening::SegmentPressureHistory& h);

// Its line in README.txt.
ReadmeFile pressure_history_readme(const scenario::ResolvedScenario& s, std::size_t segments);

}  // namespace slipscreen::outputs
