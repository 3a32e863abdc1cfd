#pragma once
// The folder of `slipscreen compare` (docs/compare.md): comparison.csv (one row per fault segment
// and common output date: P(slip) of both runs, the change, the noise test, the median Δp, the
// thresholds crossed), comparison.json (everything: inputs, parameters, wells and volumes,
// probabilities, thresholds, catalog; SI), README.txt with the caution, and manifest.json (the two
// run manifests as inputs; "screens": {"comparison": true} marks the folder as a comparison, the
// only kind of folder a forced comparison replaces).
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "formats/files/manifest.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/output_units.hpp"
#include "screening/comparison.hpp"

namespace slipscreen::outputs {

inline constexpr const char* kComparisonTable = "comparison.csv";
inline constexpr const char* kComparisonJson = "comparison.json";

// comparison.csv; the median Δp columns in `u`'s unit (dp_p50_old_MPa or dp_p50_old_psi).
std::string comparison_csv(const screening::Comparison& c, const OutputUnits& u);

// comparison.json's content (SI; the caution first).
nlohmann::json comparison_json(const screening::Comparison& c, const screening::RunRecord& old_run,
                               const screening::RunRecord& new_run);

struct ComparisonRecord {
  std::vector<std::string> command_line;
  std::vector<formats::ManifestInput> inputs;  // the two runs' manifests
  units::UnitSystem units = units::UnitSystem::si;
  bool reproducible = false;                   // no creation time in the manifest
};

// Writes the four files into the folder's staging folder (commit is the caller's).
void write_comparison_folder(const formats::RunFolder& folder, const screening::Comparison& c,
                             const screening::RunRecord& old_run, const screening::RunRecord& new_run,
                             const ComparisonRecord& record);

// Why `folder` is not a comparison written by slipscreen (nothing when it is one): for the forced
// replace of an earlier comparison (formats::RunFolderOptions::replaceable).
std::optional<std::string> not_a_comparison(const std::filesystem::path& folder);

}  // namespace slipscreen::outputs
