#pragma once
// The scenario's [uncertainty] table (docs/uncertainty.md): which inputs take a distribution,
// how many realizations, which sampler, and the probability thresholds that flag segments.
// Every input not named keeps the region's (or scenario override's) best estimate as a fixed
// value, so the probabilistic screen always sees a complete model.
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "core/probabilistic/slip_probability.hpp"
#include "core/stats/sampler.hpp"
#include "io/scenario.hpp"

namespace slipscreen::io {

struct UncertaintySpec {
  bool enabled = false;                    // false: no [uncertainty] table, deterministic only
  std::uint64_t realizations = 0;
  stats::SamplingMethod method = stats::SamplingMethod::latin_hypercube;
  std::vector<double> thresholds;          // probabilities in (0, 1), increasing
  probabilistic::UncertainModel model;     // fault_friction / well_rate_factor filled by the run
  std::map<std::string, stats::Distribution> fault_friction;     // by fault id
  std::map<std::string, stats::Distribution> well_rate_factor;   // by well id
  std::string fault_friction_where;        // "scenario.toml line 40" for unknown-id messages
  std::string well_rate_factor_where;
  // Probability maps for unmapped faults: cell size (m) and an optional user orientation.
  double map_cell_size = 0.0;              // 0: the output grid's cell size
  std::optional<double> map_strike, map_dip;  // rad
  std::vector<std::string> written;        // the distribution of each named input, canonical text
};

// Reads scenario.uncertainty (may be null). Throws InputError naming the file, line, key, value
// and what was expected (unknown keys with "did you mean").
UncertaintySpec load_uncertainty(const ResolvedScenario& scenario);

// Resolved uncertainty for the manifest.
nlohmann::json to_json(const UncertaintySpec& u);

}  // namespace slipscreen::io
