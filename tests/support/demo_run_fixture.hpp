#pragma once
// Test helper: the demo scenario (regions/marrowick, FICTIONAL) run once per test process into a
// temporary folder that lives until the process ends. It runs every screen (deterministic,
// probabilistic, pressure map, catalog review), so report figures can be built from it.
#include <filesystem>
#include <memory>

#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/temp_dir.hpp"

namespace slipscreen::test {

inline const std::filesystem::path& demo_run_folder() {
  static const std::unique_ptr<TempDir> dir = std::make_unique<TempDir>("demo-run");
  static const std::filesystem::path folder = [] {
    auto s = scenario::load_scenario(std::filesystem::path(SLIPSCREEN_SOURCE_DIR) / "regions/marrowick/scenario.toml");
    // Reduced so that a test process pays a second or two, not the whole demo: fewer
    // realizations and catalog bootstrap resamples (the figures' shape, not their precision, is tested).
    s.uncertainty.realizations = stats::RealizationCount(200);
    if (s.catalog && s.catalog->bootstrap > 100) s.catalog->bootstrap = 100;
    const std::filesystem::path out = dir->path() / "demo";
    run::run_scenario(s, options_into(out));
    return out;
  }();
  return folder;
}

}  // namespace slipscreen::test
