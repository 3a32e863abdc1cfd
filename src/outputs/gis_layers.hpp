#pragma once
// screen.gpkg: the layers fault_segments (the deterministic screen, and the probabilistic
// screen's probabilities when run), segment_times (segment x output time, time-aware), wells
// (with injected volumes), dp_footprint (contours of the Δp raster at the footprint threshold)
// and earthquakes (the catalog review's events against the model), each with its default style
// in layer_styles (outputs/gis_styles.hpp; docs/outputs.md, docs/gis.md). Pressures, lengths and
// volumes follow the run's unit system ([output] units; outputs/output_units.hpp), like the tables.
#include "core/screen/deterministic_screen.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/catalog_review.hpp"
#include "screening/prepare.hpp"
#include "screening/pressure_map.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::outputs {

// `prob`, `review` and `pressure` may be null (no footprint layer without the pressure map).
// `reproducible`: a fixed GeoPackage timestamp.
void write_gis_layers(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                      const screening::PreparedRun& p, const screen::ScreenResult& r, bool reproducible,
                      const screening::ProbabilisticRun* prob, const screening::CatalogReview* review,
                      const screening::PressureMap* pressure);

// Its line in README.txt.
ReadmeFile gis_layers_readme(const scenario::ResolvedScenario& s, bool probabilistic, bool review, bool footprint);

}  // namespace slipscreen::outputs
