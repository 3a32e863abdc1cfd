#pragma once
// Reading the scenario's [catalog] table (docs/catalogs.md). Used inside this layer only: it
// takes the TOML layer's Section, which stays out of the layer's public headers.
#include <vector>

#include "formats/toml/toml_section.hpp"
#include "scenario/catalog_spec.hpp"
#include "scenario/wells.hpp"

namespace slipscreen::scenario {

// `wells` are the scenario's, for `rt_well`.
CatalogSpec read_catalog_spec(const formats::Section& s, const std::vector<WellSpec>& wells);

}  // namespace slipscreen::scenario
