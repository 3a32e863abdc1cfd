#pragma once
// Reading the scenario's [uncertainty] table (docs/uncertainty.md) into an UncertaintySpec.
// Used inside this layer only (load_scenario resolves it with the rest of the scenario).
#include <string>
#include <vector>

#include <toml++/toml.h>

#include "scenario/region.hpp"
#include "scenario/uncertainty.hpp"

namespace slipscreen::scenario {

// Everything the reader needs to know about the scenario to check keys against it.
struct UncertaintyContext {
  std::string file;  // display name of the scenario file
  std::uint64_t seed = 1;
  StressModel stress_model = StressModel::gradients;
  bool poroelastic_path = false;      // [stress] poroelastic_path: biot and poisson_ratio may be uncertain
  bool density_layers = false;        // Sv from a density table (no vertical_gradient)
  bool from_transmissivity = false;   // formation given as T and S
  bool leaky = false;                 // [formation] model = "leaky": only k (or T) may be uncertain
  bool poroelastic_3d = false;        // [formation] model = "poroelastic_3d": the solid's constants, k and friction
  std::vector<std::string> well_ids;  // existing and proposed wells
};
// Reads an [uncertainty] table (null: not given, the defaults above). Throws InputError naming
// file, line, column, key path, the value and what was expected: unknown keys (with "did you
// mean"), keys that do not apply to the region's stress model or formation form, unknown well
// ids, bad distributions (distribution_text.hpp), a realization count out of range, and a
// distribution that puts more than 1e-9 of its probability outside the physical range of its
// quantity (e.g. a normal friction reaching below 0: use truncnormal).
UncertaintySpec read_uncertainty(const toml::table* table, const UncertaintyContext& context);

}  // namespace slipscreen::scenario
