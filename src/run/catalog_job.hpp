#pragma once
// `slipscreen catalog` end to end: read the catalog (and a volume history), filter, summarize,
// build the r-t view, and write the --out folder through a RunFolder (the same "nothing is
// lost" rule as a scenario run, formats/files/run_folder.hpp: an existing folder is replaced only
// with force, only when it is an earlier run of slipscreen, and only once the new one is
// complete). The folder holds a manifest.json (the inputs' SHA-256 and the command line).
#include <array>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "core/units/units.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::run {

struct RtRequest {
  std::array<double, 2> well{};          // in the catalog's coordinates
  std::optional<double> start;           // s since 1970; default: the volume history's first time
  std::vector<double> diffusivities;     // m²/s
};

struct CatalogJob {
  std::string file;
  formats::CatalogFormat format = formats::CatalogFormat::automatic;
  formats::CatalogColumns columns;
  bool strict = false;
  seismo::CatalogFilter filter;
  seismo::SummaryOptions summary;
  std::string volume_history;            // CSV of time,cumulative_volume ("" = none)
  std::optional<RtRequest> rt;
  std::filesystem::path out;             // "" = no folder
  bool force = false;
  units::UnitSystem units = units::UnitSystem::si;  // of the folder's tables
  std::vector<std::string> command_line; // for the folder's manifest
  // One line per stale leftover of a killed run cleaned beside the folder (stale_runs.hpp).
  std::function<void(const std::string& line)> notice;
};

struct CatalogJobResult {
  formats::CatalogReadResult read;
  seismo::FilterResult filtered;
  seismo::CatalogSummary summary;
  std::optional<screening::RtView> rt;
  nlohmann::json json;                   // the summary as written to catalog_summary.json
};

// Throws the typed errors of the inputs (InputError, IoError, RefusedError).
CatalogJobResult run_catalog_job(const CatalogJob& job);

}  // namespace slipscreen::run
