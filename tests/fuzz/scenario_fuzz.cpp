// Fuzz target: a scenario with everything it names (scenario/scenario.hpp, screening/prepare.hpp).
// Input: up to six files joined by the part separator (fuzz_support.hpp), in this order:
//   scenario.toml, region.toml, faults.geojson, wells.csv, histories.csv, catalog.csv
// Each is written under that name into this process's scratch folder (a missing part is a
// missing file), then the scenario is loaded and prepared as `slipscreen run` does before it
// computes (load_scenario, prepare_run without network access), and the resolved scenario is
// turned into the manifest's JSON text, the first thing a run writes.
#include <array>
#include <filesystem>

#include <nlohmann/json.hpp>

#include "fuzz_support.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

using namespace slipscreen;

namespace {
const std::array<const char*, 6> kFiles = {"scenario.toml", "region.toml",  "faults.geojson",
                                           "wells.csv",     "histories.csv", "catalog.csv"};
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const auto parts = fuzz::split_parts(fuzz::as_text(data, size), fuzz::kPartSeparator, kFiles.size());
  for (std::size_t i = 0; i < kFiles.size(); ++i) {
    if (i < parts.size()) fuzz::write_scratch(kFiles[i], parts[i]);
    else std::filesystem::remove(fuzz::scratch_dir() / kFiles[i]);
  }
  return fuzz::expect_typed_errors([&] {
    const scenario::ResolvedScenario s = scenario::load_scenario(fuzz::scratch_dir() / "scenario.toml");
    const screening::PreparedRun run = screening::prepare_run(s, false);
    (void)scenario::to_json(s).dump(2);
  });
}
