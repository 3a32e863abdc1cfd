#pragma once
// The catalog review's files in a run folder (screening/catalog_review.hpp; docs/catalogs.md):
// catalog_summary.json, catalog_events.csv, rt_events.csv, rt_fronts.csv and (with rates)
// seismicity_rate.csv and seismicity_rate_faults.csv.
#include <nlohmann/json.hpp>

#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/catalog_review.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::outputs {

void write_catalog_review(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                          const screening::PreparedRun& p, const screening::CatalogReview& review);

// Their lines in README.txt.
std::vector<ReadmeFile> catalog_review_readme(const screening::CatalogReview& review);

// The resolved [catalog] settings and counts for the manifest.
nlohmann::json catalog_manifest(const screening::CatalogReview& review);

// The summary JSON: the catalog statistics (catalog_summary_json) with the run's block.
nlohmann::json catalog_review_json(const scenario::ResolvedScenario& s, const screening::PreparedRun& p,
                                   const screening::CatalogReview& review);

}  // namespace slipscreen::outputs
