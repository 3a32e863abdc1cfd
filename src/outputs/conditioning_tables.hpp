#pragma once
// The files of a probabilistic screen conditioned on observations (docs/conditioning.md):
// posterior_inputs.csv, observation_fit.csv, the conditioned columns of segment_probability.csv,
// their README lines and the manifest block.
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "formats/files/run_folder.hpp"
#include "outputs/output_units.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::outputs {

// segment_probability.csv's conditioned columns: the header part (",p_slip_conditioned,...")
// and one row's part, empty when the run is not conditioned.
std::string conditioned_columns_header(const screening::ProbabilisticRun& run, const OutputUnits& u);
std::string conditioned_columns(const screening::ProbabilisticRun& run, std::size_t segment, std::size_t k, double z,
                                const OutputUnits& u);

// segment_probability_summary.csv's conditioned columns (final P(slip) with its interval, Δp_crit
// percentiles), empty when the run is not conditioned.
std::string conditioned_summary_header(const screening::ProbabilisticRun& run, const OutputUnits& u);
std::string conditioned_summary_columns(const screening::ProbabilisticRun& run, std::size_t segment, double z,
                                        const OutputUnits& u);

// posterior_inputs.csv and observation_fit.csv (tables on, run conditioned).
void write_conditioning_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                               const screening::ProbabilisticRun& run, const OutputUnits& u);
std::vector<ReadmeFile> conditioning_readme(const screening::ProbabilisticRun& run, units::UnitSystem system);
nlohmann::json conditioning_manifest(const scenario::ResolvedScenario& s, const screening::ProbabilisticRun& run);

}  // namespace slipscreen::outputs
