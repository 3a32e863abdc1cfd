#pragma once
// Every file of a scenario run, written into the staging folder of a RunFolder: one writer per
// output family (docs/outputs.md), then the manifest, which records the others' hashes.
//   screen_tables.hpp        segment_times.csv, well_shares.csv, segments.csv
//   pressure_raster.hpp      pressure_change.tif
//   gis_layers.hpp           screen.gpkg
//   probabilistic_tables.hpp segment_probability*.csv, sensitivity.csv, median_well_shares.csv,
//                            slip_probability_*.tif
//   pressure_history_table.hpp segment_pressure_history.csv
//   capacity_tables.hpp      capacity.csv, capacity_curve.csv
//   what_if_table.hpp        what_if.csv
//   catalog_review_files.hpp catalog_summary.json, catalog_events.csv, rt_*.csv, seismicity_rate*.csv
//   manifest.json            version, command line, resolved parameters, SHA-256 of every input
#include <string>
#include <vector>

#include "core/screen/deterministic_screen.hpp"
#include "formats/files/run_folder.hpp"
#include "scenario/scenario.hpp"
#include "screening/depth_probability.hpp"
#include "screening/depth_screen.hpp"
#include "screening/capacity.hpp"
#include "screening/what_if.hpp"
#include "screening/catalog_review.hpp"
#include "screening/prepare.hpp"
#include "screening/pressure_history.hpp"
#include "screening/pressure_map.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::outputs {

struct OutputOptions {
  std::vector<std::string> command_line;
  bool reproducible = false;  // no creation time in the manifest, fixed GeoPackage timestamp
};

// The results of one run, as the screens computed them; the optional parts may be null.
struct RunResults {
  const screening::PreparedRun& prepared;
  const screen::ScreenResult& screen;
  const screening::PressureMap* pressure = nullptr;            // when [output] rasters
  const screening::ProbabilisticRun* probabilistic = nullptr;  // when [uncertainty]
  const screening::CatalogReview* review = nullptr;            // when [catalog]
  const screening::SegmentPressureHistory* history = nullptr;  // monthly Δp by well at the top segments
  const screening::CapacityResult* capacity = nullptr;         // when [capacity]
  const screening::WhatIfResult* what_if = nullptr;            // when [[what_if]]
  const screening::DepthScreen* depth = nullptr;               // when [formation] model = "poroelastic_3d"
  const screening::DepthProbability* depth_probability = nullptr;  // 3-D model with [uncertainty]
};

// Writes every output the scenario asks for. Throws IoError (nothing is committed then).
void write_run_outputs(const formats::RunFolder& folder, const scenario::ResolvedScenario& s, const RunResults& r,
                       const OutputOptions& options);

}  // namespace slipscreen::outputs
