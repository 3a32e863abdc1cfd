#pragma once
// pressure_change.tif: Δp (MPa) over the output grid, one Float32 band per output time, band
// descriptions = ISO dates, with its QGIS style pressure_change.qml beside it (docs/outputs.md).
#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/pressure_map.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::outputs {

void write_pressure_raster(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                           const screening::PreparedRun& p, const screening::PressureMap& map);

// Its lines in README.txt (the raster and its style).
std::vector<ReadmeFile> pressure_raster_readme(const scenario::ResolvedScenario& s);

}  // namespace slipscreen::outputs
