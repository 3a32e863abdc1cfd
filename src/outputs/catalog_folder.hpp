#pragma once
// The folder of `slipscreen catalog --out` (docs/catalogs.md): catalog_summary.json,
// catalog_events.csv (the kept events), with an r-t view rt_events.csv and rt_fronts.csv, then
// README.txt and manifest.json (the command line, the inputs' hashes, the build, the caution).
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/seismo/catalog.hpp"
#include "formats/files/manifest.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/output_units.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::outputs {

// The r-t view's block of the summary JSON.
nlohmann::json rt_view_json(const screening::RtView& v);

// What the manifest of the folder records besides the outputs.
struct CatalogFolderRecord {
  std::vector<std::string> command_line;
  std::vector<formats::ManifestInput> inputs;  // the catalog and the volume history
  units::UnitSystem units = units::UnitSystem::si;  // of the tables (depths, distances)
};

// catalog_events.csv: event_id,time,<coordinates>,depth_m,magnitude,magnitude_type, where the
// coordinates are longitude_deg,latitude_deg for a geographic catalog and x_m,y_m for a
// projected one; depth_ft in oilfield units.
std::string catalog_events_csv(const seismo::Catalog& c, const OutputUnits& u);

void write_catalog_folder(const formats::RunFolder& folder, const nlohmann::json& summary, const seismo::Catalog& c,
                          const std::optional<screening::RtView>& rt, const CatalogFolderRecord& record);

}  // namespace slipscreen::outputs
