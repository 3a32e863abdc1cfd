#pragma once
#include <array>
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "formats/catalog/catalog_file.hpp"
#include "scenario/unset.hpp"

namespace slipscreen::scenario {

// The scenario's [catalog] table: an earthquake catalog reviewed with the run (docs/catalogs.md).
// Times in s since 1970, lengths in m, pressures in Pa.
struct CatalogSpec {
  std::filesystem::path path;   // the catalog file
  std::string file;             // display name
  std::string where;            // "scenario.toml line 60, column 8" of the file key
  std::string format = "auto";  // auto, csv, quakeml
  std::string columns;          // CSV column mapping text ("" = defaults)
  formats::CatalogFormat format_kind = formats::CatalogFormat::automatic;  // `format`, parsed
  formats::CatalogColumns column_map;  // `columns`, parsed (checked against the file's header when read)
  bool strict = false;
  // Filters (events outside them are counted, not used)
  std::optional<double> from, to;            // s
  std::optional<double> depth_min, depth_max;  // m
  std::vector<std::string> magnitude_types;
  std::optional<double> well_buffer;         // m: keep events within this distance of a well
  std::vector<std::array<double, 2>> polygon;  // working CRS: keep events inside (empty: no polygon)
  // Statistics
  double bin_width = 0.1;
  double mc_correction = 0.0;
  std::optional<double> mc;
  std::size_t bootstrap = 0;
  double bootstrap_confidence = 0.95;
  double shear_modulus = 3.0e10;             // Pa
  std::vector<double> forecast_magnitudes{3.0, 4.0};
  std::string length_regression = "surface";  // or "subsurface"
  // Events against the model
  double footprint_threshold = 0.1e6;        // Pa
  std::string rt_well;                       // "" = the well with the most volume by the catalog's end
  std::vector<double> diffusivities;         // m²/s for the r-t fronts; empty = from the run
  // Seismicity-rate response (Dieterich 1994); absent when [catalog.rate_state] is not given
  bool rate_state = false;
  double background_rate_per_m = kUnset;     // events/s per m of fault trace
  double a_sigma = kUnset;                   // Pa
  double aftershock_duration = kUnset;       // s
};

}  // namespace slipscreen::scenario
