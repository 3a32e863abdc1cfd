#pragma once
// Reading a region file (regions/<name>/region.toml; docs/regions.md) with the scenario's
// [region.override] tables layered over it. Used inside this layer only.
#include <filesystem>
#include <string>

#include <toml++/toml.h>

#include "scenario/region.hpp"

namespace slipscreen::scenario {

// Resolves only a region file (docs/regions.md), optionally with an override table.
RegionSpec load_region(const std::filesystem::path& path, const std::string& file,
                       const toml::table* override_table = nullptr, const std::string& override_file = "",
                       const std::string& override_prefix = "", const std::filesystem::path& override_dir = {});

}  // namespace slipscreen::scenario
