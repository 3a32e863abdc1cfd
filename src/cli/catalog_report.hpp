#pragma once
// The readable catalog-review summary (console), shared by `slipscreen catalog` and `run`.
// `max_fault_bounds` limits the per-fault magnitude bounds shown (the largest first); volumes and
// fault lengths are shown in `units` (m3 and km, or bbl and mi).
#include <optional>
#include <ostream>

#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "outputs/output_units.hpp"
#include "screening/rt_view.hpp"

namespace slipscreen::cli {

void print_catalog_summary(std::ostream& out, const formats::CatalogReadResult& read, const seismo::FilterCounts& c,
                           const seismo::CatalogSummary& s, const std::optional<screening::RtView>& rt,
                           std::size_t max_fault_bounds = static_cast<std::size_t>(-1),
                           const outputs::OutputUnits& units = outputs::OutputUnits());

}  // namespace slipscreen::cli
