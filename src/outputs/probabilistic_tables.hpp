#pragma once
// The probabilistic screen's files in a run folder (screening/probabilistic_screen.hpp;
// docs/outputs.md): segment_probability.csv, segment_probability_summary.csv, sensitivity.csv,
// median_well_shares.csv, dp_crit_quantiles.csv,
// slip_probability_dangerous.tif and slip_probability_oriented.tif.
#include <nlohmann/json.hpp>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::outputs {

// How many segments dp_crit_quantiles.csv covers (those with the highest final P(slip)).
inline constexpr std::size_t kDpCritQuantileSegments = 20;

void write_probabilistic_outputs(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                                 const screening::PreparedRun& p, const screening::ProbabilisticRun& run);

// Their lines in README.txt.
std::vector<ReadmeFile> probabilistic_readme(const screening::ProbabilisticRun& run, units::UnitSystem system);

// The probabilistic block of the manifest.
nlohmann::json probabilistic_manifest(const scenario::ResolvedScenario& s, const screening::ProbabilisticRun& run);

}  // namespace slipscreen::outputs
