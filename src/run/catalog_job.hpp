#pragma once
// `slipscreen catalog` end to end: read the catalog (and a volume history), filter, summarize,
// build the r-t view, and write the --out folder through a RunFolder (the same "nothing is
// lost" rule as a scenario run: an existing folder is replaced only with force, and only once
// the new one is complete).
#include <array>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
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
  std::vector<std::string> command_line; // for the folder's manifest
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
