#pragma once
// The probabilistic screen of a scenario run: builds the Monte Carlo model from the prepared run
// (wells, fault segments, stress, formation) and the scenario's [uncertainty] table and runs it
// (core/probabilistic/slip_probability.hpp). Its files are written by
// outputs/probabilistic_tables.hpp (docs/outputs.md).
#include <optional>
#include <string>
#include <vector>

#include "core/geometry/raster_grid.hpp"
#include "core/probabilistic/slip_probability.hpp"
#include "screening/prepare.hpp"
#include "screening/seismicity_likelihood.hpp"
#include "scenario/scenario.hpp"
#include "scenario/uncertainty.hpp"

namespace slipscreen::screening {

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
  scenario::UncertaintySpec spec;           // the [uncertainty] table as run
  std::optional<SeismicityUse> seismicity;  // [observations] seismicity = true: the events used
  // The engine's inputs as run (for audits against the plain method).
  std::vector<probabilistic::WellInput> wells;
  std::vector<probabilistic::SegmentInput> segments;
  probabilistic::RunSettings settings;
};

// Builds the model (best estimates from the region, distributions from `spec`) and runs it.
// Probability maps cover the output grid, coarsened to at most kMapCells cells.
// `audit_realizations` × `audit_segments` keep the fast path's per-realization results
// (ProbabilisticResult::audit) for checks against probabilistic::plain_slip_check.
// `split`: this process's part of a run split across processes (docs/cluster.md); on parts
// other than 0 the result holds only the run-level fields (result.merged_elsewhere).
ProbabilisticRun run_probabilistic_screen(const scenario::ResolvedScenario& s, const PreparedRun& p,
                                          const scenario::UncertaintySpec& spec,
                                          std::vector<std::uint64_t> audit_realizations = {},
                                          std::vector<std::size_t> audit_segments = {},
                                          const probabilistic::RealizationSplit* split = nullptr);
inline constexpr std::size_t kMapCells = 6400;
// Wells below this share of the median Δp are summed in one row of median_well_shares.csv.
inline constexpr double kMedianShareMin = 0.01;

// The base model: every input at its best estimate (region with scenario overrides), as fixed
// distributions; `spec` then replaces what it names.
probabilistic::UncertainModel uncertain_model(const scenario::ResolvedScenario& s, const PreparedRun& p,
                                              const scenario::UncertaintySpec& spec, std::vector<std::string>& fault_ids,
                                              std::vector<std::size_t>& segment_fault);

// P(slip by output time k) of segment i, injection-induced only.
double slip_probability(const ProbabilisticRun& run, std::size_t segment, std::size_t k);

// The first date (ISO) on the tracking grid (tracked_times: every month, rate change and output
// time) at which segment i's injection-induced P(slip) reaches `threshold`; empty if never by
// the last output time.
std::string first_date_reaching(const ProbabilisticRun& run, std::size_t segment, double threshold);

}  // namespace slipscreen::screening
