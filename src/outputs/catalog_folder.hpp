#pragma once
// The folder of `slipscreen catalog --out`: catalog_summary.json, catalog_events.csv (the kept
// events, with the caution in a first '#' line) and, with an r-t view, rt_events.csv and
// rt_fronts.csv (docs/catalogs.md).
#include <optional>

#include <nlohmann/json.hpp>

#include "core/seismo/catalog.hpp"
#include "formats/files/run_folder.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::outputs {

// The r-t view's block of the summary JSON.
nlohmann::json rt_view_json(const screening::RtView& v);

void write_catalog_folder(const formats::RunFolder& folder, const nlohmann::json& summary, const seismo::Catalog& c,
                          const std::optional<screening::RtView>& rt);

}  // namespace slipscreen::outputs
