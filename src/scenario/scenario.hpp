#pragma once
// The scenario: one TOML file naming a region, wells, injection histories, proposed wells with
// planned schedules, output times, the output grid, the outputs wanted and the run folder.
// Everything is resolved into plain value structs in SI (docs/scenario.md, docs/regions.md).
//
// Times are seconds since 1970-01-01T00:00Z (util::to_seconds); a date names the start of that
// day, so a period "from 2027-01-01 to 2028-01-01" covers all of 2027.
// Well coordinates are kept in the CRS they were given in; the run reprojects them into the
// working CRS (the region's `crs`).
#include <array>
#include <cstdint>
#include <filesystem>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "core/units/units.hpp"
#include "core/util/civil_date.hpp"
#include "scenario/capacity_spec.hpp"
#include "scenario/catalog_spec.hpp"
#include "scenario/observations.hpp"
#include "scenario/what_if_spec.hpp"
#include "scenario/region.hpp"
#include "scenario/uncertainty.hpp"
#include "scenario/unset.hpp"
#include "scenario/wells.hpp"

namespace slipscreen::scenario {


struct OutputGrid {
  bool automatic_extent = true;  // around wells and faults
  double xmin = 0, ymin = 0, xmax = 0, ymax = 0;  // in `crs`
  double margin = 5000;          // m, for the automatic extent
  double cell_size = 1000;       // m
  std::string crs;               // empty: the working CRS
};

struct OutputFiles {
  std::string segment_times = "segment_times.csv";
  std::string segments = "segments.csv";
  std::string pressure_raster = "pressure_change.tif";
  std::string geopackage = "screen.gpkg";
  std::string manifest = "manifest.json";
};

struct OutputSpec {
  std::string folder;            // run folder as written (relative to the working directory)
  bool tables = true, rasters = true, geopackage = true, cog = false;
  units::UnitSystem units = units::UnitSystem::si;  // of the tables and the console (docs/outputs.md)
  // Pa: the Δp footprint drawn as contour polygons in screen.gpkg ([output] footprint, else the
  // catalog review's footprint_threshold, else 0.1 MPa; docs/outputs.md)
  double footprint = 0.1e6;
  bool footprint_given = false;  // written under [output]
  bool report = true;            // report.html, report.pdf and figures/ (docs/report.md)
  std::string page = "A4";       // the PDF report's page size: "A4" or "Letter"
  std::string report_maps = "last";  // the report's area map: at the last output time, or "each" output time
  std::vector<util::CivilDate> dates;
  std::vector<double> times;     // seconds, strictly increasing
  OutputGrid grid;
  OutputFiles files;
};


struct ResolvedScenario {
  std::filesystem::path path;    // the scenario file
  std::string file;              // its display name
  std::string title;
  std::uint64_t seed = 1;
  RegionSpec region;
  std::string wells_file, histories_file;  // display names (empty if none)
  std::filesystem::path wells_path, histories_path;
  std::vector<WellSpec> wells;   // existing wells, then proposed wells
  bool allow_outside = false;    // [wells] allow_outside: wells may lie outside the study area
  double memory_limit = 0;       // bytes (memory_limit); 0: the machine's physical memory
  OutputSpec output;
  std::vector<std::filesystem::path> inputs;  // every file read (for the manifest hashes)
  std::optional<CatalogSpec> catalog;           // [catalog]: the review runs with the screen
  UncertaintySpec uncertainty;                  // [uncertainty] (given = false: deterministic only)
  std::optional<CapacitySpec> capacity;         // [capacity]: the group's allowable rate (needs [uncertainty])
  std::vector<WhatIfSpec> what_if;              // [[what_if]]: rate changes (need [uncertainty])
  std::optional<ObservationsSpec> observations; // [observations]: condition the probabilistic screen (needs [uncertainty])
};

// Loads and resolves a scenario. `file` is the display name (defaults to the path as given).
// Throws InputError / Error(input) for bad content, IoError for unreadable files.
ResolvedScenario load_scenario(const std::filesystem::path& path);


// Every resolved value, in SI with units in the key names, for the manifest. Without the wells
// ("wells": each one's to_json) when `with_wells` is false: a run's manifest writes them one at a
// time (formats::StreamedArray).
nlohmann::json to_json(const ResolvedScenario& s, bool with_wells = true);

// One well of the manifest's "wells": its place, depths, status and rate periods.
nlohmann::json to_json(const WellSpec& w);


}  // namespace slipscreen::scenario
