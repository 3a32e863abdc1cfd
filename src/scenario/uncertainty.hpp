#pragma once
// The scenario's [uncertainty] table: which inputs take a distribution, the sampler, the
// realization count, the confidence level and the probability thresholds (docs/uncertainty.md).
//
//   [uncertainty]
//   realizations = 2000                 # 1 ... 100000000 (default 1000)
//   sampler = "latin-hypercube"         # or "monte-carlo" (default)
//   confidence = 0.95                   # level of the Wilson interval (default 0.95)
//   thresholds = [0.05, 0.2]            # probabilities that flag a segment (default [0.05])
//   pore_pressure_gradient = "normal(0.433 psi/ft, 0.01 psi/ft)"
//   rate_factor = "lognormal(median=1, sigma_ln=0.1)"   # every well
//   [uncertainty.stress]      vertical_gradient, shmax_azimuth, and by stress model:
//                             shmax_gradient, shmin_gradient | poisson_ratio | a_phi
//   [uncertainty.formation]   permeability, thickness, porosity, total_compressibility,
//                             viscosity | transmissivity, storativity
//   [uncertainty.faults]      friction, cohesion, strike_perturbation, dip_perturbation
//                             (every fault; perturbations are added to the mapped orientation)
//   [uncertainty.fault."F-12"]  friction of one fault (replaces [uncertainty.faults] friction)
//   [uncertainty.well."MW-01"]  rate_factor of one well (multiplies the global rate_factor)
//   [uncertainty.seismicity]  a_sigma, background_rate_per_km (with [observations] seismicity = true)
//   [uncertainty.maps]        cell_size = "2 km"; strike = "30 deg", dip = "70 deg" (optional)
//   With [formation] model = "poroelastic_3d" only [uncertainty.formation] permeability,
//   shear_modulus, poisson_ratio, undrained_poisson_ratio, biot and [uncertainty.faults] friction.
//
// These map one to one onto the fields of the Monte Carlo driver's model
// (probabilistic::UncertainModel); a key left out keeps the region's or scenario's value.
// Keys of `values`: "pore_pressure_gradient", "rate_factor", "stress.a_phi",
// "formation.permeability", "faults.friction", "fault.F-12.friction", "well.MW-01.rate_factor"
// (sorted, so the spec does not depend on the order of the lines in the file).
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "core/probabilistic/screen_inputs.hpp"
#include "core/stats/distribution.hpp"
#include "core/stats/sampler.hpp"
#include "core/units/units.hpp"

namespace slipscreen::scenario {

// The input of the Monte Carlo model a key replaces (the key table of uncertainty_reader.cpp is
// the one place that names them): a model-wide input, or the friction of one fault or the rate
// factor of one well, named by `id`.
using UncertainField = stats::Distribution probabilistic::UncertainModel::*;
// poro3d: an input of the screen in depth ([formation] model = "poroelastic_3d"), named by its key
// alone (the Theis model has no field for it; screening/depth_probability.hpp reads these).
enum class UncertainScope { model, fault_friction, well_rate_factor, poro3d };

struct UncertainValue {
  std::string key;              // e.g. "formation.permeability" (see above)
  units::Dimension dimension;
  stats::Distribution distribution;  // SI
  std::string text;             // as written
  std::string where;            // "scenario.toml line 31, column 16"
  UncertainScope scope = UncertainScope::model;
  UncertainField field = nullptr;  // scope model: the model's input
  std::string id;                  // scope fault_friction / well_rate_factor: the fault's or well's id
};

struct UncertaintySpec {
  bool given = false;  // the scenario has an [uncertainty] table
  stats::SamplingMethod sampler = stats::SamplingMethod::monte_carlo;
  stats::RealizationCount realizations{1000};
  std::uint64_t seed = 1;
  double confidence = 0.95;
  std::vector<double> thresholds{0.05};  // increasing, each in (0, 1)
  std::vector<UncertainValue> values;    // sorted by key
  std::vector<std::string> fault_ids;    // ids named under [uncertainty.fault], for check_fault_ids
  // [uncertainty.maps]: cell size of the probability rasters (0: the output grid's) and an
  // optional fault orientation for the second raster.
  double map_cell_size = 0.0;
  std::optional<double> map_strike, map_dip;  // rad

  // The value for `key`, or null.
  const UncertainValue* find(std::string_view key) const;
};

// The first [uncertainty.seismicity] value (key "seismicity. ..."), or null.
const UncertainValue* seismicity_value(const UncertaintySpec& spec);

// Refuses [uncertainty.fault."id"] tables whose id is not among the fault map's ids (the fault
// map is read after the scenario).
void check_fault_ids(const UncertaintySpec& spec, const std::vector<std::string>& fault_ids);

// For the manifest: sampler, seed, realizations, stream version, confidence, thresholds and
// every input's distribution as written and in canonical SI form.
nlohmann::json to_json(const UncertaintySpec& spec);

}  // namespace slipscreen::scenario
