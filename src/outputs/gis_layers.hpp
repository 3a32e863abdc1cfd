#pragma once
// screen.gpkg: the layers fault_segments (the deterministic screen, and the probabilistic
// screen's probabilities when run), wells (with injected volumes) and earthquakes (the
// catalog review's events against the model) (docs/outputs.md, docs/gis.md).
#include "core/screen/deterministic_screen.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/catalog_review.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::outputs {

// `prob` and `review` may be null. `reproducible`: a fixed GeoPackage timestamp.
void write_gis_layers(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                      const screening::PreparedRun& p, const screen::ScreenResult& r, bool reproducible,
                      const screening::ProbabilisticRun* prob, const screening::CatalogReview* review);

// Its line in README.txt.
ReadmeFile gis_layers_readme(const scenario::ResolvedScenario& s, bool probabilistic, bool review);

}  // namespace slipscreen::outputs
