#pragma once
// The catalog review summary as JSON (nlohmann_json). Statistics that could not be computed are
// null with a "note" saying why; no NaN or infinity is ever written.
#include <nlohmann/json.hpp>

#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "io/catalog_file.hpp"

namespace slipscreen::io {

inline constexpr const char* kScreeningCaution =
    "Screening estimate: results depend on simplified physics and uncertain inputs; they do not replace a "
    "site-specific study, monitoring, or the judgement of a licensed professional geoscientist or engineer. "
    "Local regulations and the permitting authority govern.";

nlohmann::json catalog_summary_json(const CatalogReadResult& read, const seismo::FilterCounts& counts,
                                    const seismo::CatalogSummary& summary);

}  // namespace slipscreen::io
