#pragma once
// The probabilistic screen of a scenario run: builds the Monte Carlo model from the prepared run
// (wells, fault segments, stress, formation) and the scenario's [uncertainty] table, runs it
// (core/probabilistic/slip_probability.hpp) and writes its tables and probability rasters.
//
// Outputs (docs/outputs.md):
//   segment_probability.csv          one row per segment × output time: P(slip by t) with its
//                                    Wilson interval, the already-critical fraction, Δp percentiles
//   segment_probability_summary.csv  one row per segment: Δp_crit percentiles, final P, first date
//                                    each probability threshold is reached
//   sensitivity.csv                  per fault (its most probable segment): Spearman ρ of every
//                                    sampled input with the final slip margin, ranked
//   median_well_shares.csv           per segment × output time: the median realization (rank
//                                    ⌊(n−1)/2⌋ by Δp at the segment) and each well's contribution
//                                    and share there (probabilistic::MedianAttribution); rows for
//                                    wells with a share ≥ kMedianShareMin, then one row for the rest
//   slip_probability_dangerous.tif   P(slip by t) of a fault of the most dangerous orientation
//   slip_probability_oriented.tif    the same for the [uncertainty.maps] orientation (if given)
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/geometry/raster_grid.hpp"
#include "core/probabilistic/slip_probability.hpp"
#include "io/run_folder.hpp"
#include "io/run_inputs.hpp"
#include "io/scenario.hpp"
#include "io/scenario_uncertainty.hpp"

namespace slipscreen::io {

struct ProbabilisticRun {
  probabilistic::ProbabilisticResult result;
  std::vector<std::string> fault_ids;       // fault index -> id
  std::vector<std::size_t> segment_fault;   // segment -> fault index
  std::vector<double> tracked_times;        // s
  geometry::RasterGrid map_grid;            // grid of the probability rasters (may be coarser)
  double confidence = 0.95;
  std::vector<double> thresholds;
  std::optional<double> map_strike, map_dip;  // rad
  double mc_half_width_max = 0.0;           // largest half-width of the Wilson intervals
  nlohmann::json manifest;                  // probabilistic_manifest(), filled by the run
  // The engine's inputs as run (for audits against the plain method).
  std::vector<probabilistic::WellInput> wells;
  std::vector<probabilistic::SegmentInput> segments;
  probabilistic::RunSettings settings;
};

// Builds the model (best estimates from the region, distributions from `spec`) and runs it.
// Probability maps cover the output grid, coarsened to at most kMapCells cells.
// `audit_realizations` × `audit_segments` keep the fast path's per-realization results
// (ProbabilisticResult::audit) for checks against probabilistic::plain_slip_check.
ProbabilisticRun run_probabilistic_screen(const ResolvedScenario& s, const PreparedRun& p,
                                          const UncertaintySpec& spec,
                                          std::vector<std::uint64_t> audit_realizations = {},
                                          std::vector<std::size_t> audit_segments = {});
inline constexpr std::size_t kMapCells = 6400;
// Wells below this share of the median Δp are summed in one row of median_well_shares.csv.
inline constexpr double kMedianShareMin = 0.01;

// The base model: every input at its best estimate (region with scenario overrides), as fixed
// distributions; `spec` then replaces what it names.
probabilistic::UncertainModel uncertain_model(const ResolvedScenario& s, const PreparedRun& p,
                                              const UncertaintySpec& spec, std::vector<std::string>& fault_ids,
                                              std::vector<std::size_t>& segment_fault);

void write_probabilistic_outputs(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                                 const ProbabilisticRun& run);

// The probabilistic block of the manifest.
nlohmann::json probabilistic_manifest(const ProbabilisticRun& run, const UncertaintySpec& spec);

// P(slip by output time k) of segment i, injection-induced only.
double slip_probability(const ProbabilisticRun& run, std::size_t segment, std::size_t k);

}  // namespace slipscreen::io
