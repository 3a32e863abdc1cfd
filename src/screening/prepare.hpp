#pragma once
// Preparing a run: read the fault map, reproject wells and faults into the working CRS, split
// faults into segments, resolve the stress at the reference depth and the Theis parameters,
// and lay out the output grid. Everything that can fail on bad input fails here, before any
// output folder exists.
#include "core/geomech/horizontal_stress.hpp"
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "core/geometry/raster_grid.hpp"
#include "core/hydro/pressure_grid.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "formats/gis/crs.hpp"
#include "formats/files/manifest.hpp"
#include "scenario/scenario.hpp"
#include "formats/gis/fault_map.hpp"

namespace slipscreen::screening {

// The statement of the time grid searched for first crossings (core/screen/tracking_grid.hpp).
inline constexpr const char* kTrackingGridStatement =
    "first crossings are searched on the first day of every month, every rate-change time and "
    "every output time, from the first injection to the last output time; a crossing happened "
    "in the interval ending at the reported date (at most one month)";

struct PreparedRun {
  formats::Crs working;
  std::vector<formats::FaultSegment> segments;  // geometry in the working CRS (strikes: grid azimuths)
  std::vector<scenario::WellSpec> wells;         // x, y in the working CRS
  screen::ScreenInputs inputs;         // strikes converted to true-north azimuths
  geometry::RasterGrid grid;
  double convergence_rad = 0;          // meridian convergence at the centre of the faults
  std::vector<formats::ManifestInput> manifest_inputs;
  std::size_t fault_count = 0;
  std::optional<formats::CatalogReadResult> catalog;  // [catalog], as read (the file's own CRS)
};

// Throws InputError / IoError / RefusedError naming the file, feature or key.
PreparedRun prepare_run(const scenario::ResolvedScenario& s, bool allow_network);

// The in-situ stress at the reference depth from the region's description (geomech engines).
// The uniaxial-strain model's parameters of a stress description (not checked).
geomech::UniaxialStrainModel uniaxial_strain_model_of(const scenario::StressSpec& st);

geomech::AndersonianStress stress_at_reference_depth(const scenario::RegionSpec& r);
// κ = α(1−2ν)/(1−ν) of the region's poroelastic stress path (Engelder & Fischer 1994,
// geomech::stress_path_coefficient); 0 without [stress] poroelastic_path.
double stress_path_kappa_of(const scenario::StressSpec& st);
// One line naming the stress path used (manifest, console, README).
std::string stress_path_statement(const scenario::StressSpec& st);

// The pressure-grid engine's sources (every well with its image wells, signed rates) and
// formation (smallest well radius) of a prepared run.
std::vector<hydro::GridSource> grid_sources(const PreparedRun& p);
hydro::GridFormation grid_formation(const PreparedRun& p);
// The pressure-grid engine's geometry of a raster grid (north-up: negative row step).
hydro::GridGeometry grid_geometry(const geometry::RasterGrid& g);

// A well's rate history in the pressure engine's form.
hydro::RateHistory rate_history_of(const scenario::WellSpec& w);

}  // namespace slipscreen::screening
