#pragma once
// The allowable rate's files in a run folder (screening/capacity.hpp; docs/outputs.md):
// capacity.csv (per fault segment: P(slip by T) at f = 0 and f = 1, and the factor at which it
// exceeds each threshold) and capacity_curve.csv (P(slip by T | f) on a fine grid of f: the
// largest over the segments and the segments that bind), the README lines, the manifest block
// and the lines the console prints.
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "formats/files/run_folder.hpp"
#include "outputs/output_units.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/capacity.hpp"

namespace slipscreen::outputs {

// Points of capacity_curve.csv's grid of f (0 to its end, evenly spaced).
inline constexpr std::size_t kCapacityCurvePoints = 201;
// Segments with a column of their own in capacity_curve.csv.
inline constexpr std::size_t kCapacityCurveSegments = 5;

void write_capacity_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                           const screening::CapacityResult& c);

std::vector<ReadmeFile> capacity_readme(const screening::CapacityResult& c);

nlohmann::json capacity_manifest(const screening::CapacityResult& c);

// The schedule a factor means, one line per group well: "MW-P1: up to 0.62 x plan: 4960 bbl/d
// from 2027-01-01 to 2029-01-01, ..." (rates in the output units, 3 significant digits).
std::vector<std::string> capacity_schedule(const screening::CapacityResult& c, double f, const OutputUnits& u);

// The console section (after the probabilistic screen's).
std::vector<std::string> capacity_console(const screening::CapacityResult& c, const OutputUnits& u);

}  // namespace slipscreen::outputs
