#pragma once
// The catalog review summary as JSON (nlohmann_json). Statistics that could not be computed are
// null with a "note" saying why; no NaN or infinity is ever written.
#include "core/caution.hpp"
#include <nlohmann/json.hpp>

#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "formats/catalog/catalog_file.hpp"

namespace slipscreen::outputs {

using slipscreen::kScreeningCaution;  // core/caution.hpp

nlohmann::json catalog_summary_json(const formats::CatalogReadResult& read, const seismo::FilterCounts& counts,
                                    const seismo::CatalogSummary& summary);

}  // namespace slipscreen::outputs
