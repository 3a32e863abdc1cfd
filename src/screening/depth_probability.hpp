#pragma once
// The probabilistic screen of faults in depth for a region with [formation] model =
// "poroelastic_3d" and a scenario with [uncertainty] (docs/uncertainty.md, "The 3-D poroelastic
// model"): the realizations of the solid's G, ν, ν_u, α, the permeability and the friction of
// every fault are drawn by the scenario's sampler (stats/sampler.hpp), every realization is
// checked (0 ≤ ν < ν_u < 0.5 and the other ranges, poro/rudnicki.hpp) before any screen, and
// the engine of poro/depth_monte_carlo.hpp counts per segment and output time the realizations
// that have failed by then. Writes nothing.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/poro/depth_monte_carlo.hpp"
#include "core/stats/sampler.hpp"
#include "scenario/scenario.hpp"
#include "screening/depth_screen.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

struct DepthProbability {
  std::size_t realizations = 0;
  stats::SamplerDescriptor sampler;
  std::vector<std::string> input_names;             // the sampler's inputs, in draw order
  double z = 0;                                     // normal quantile of [uncertainty] confidence
  std::vector<std::vector<std::uint32_t>> slipped;  // [segment][output time]: realizations failed by then
};

// The keys of [uncertainty] that drive the screen in depth, in the sampler's input order (each
// consumes one uniform per realization whether fixed or not, stats/sampler.hpp).
inline constexpr const char* kDepthUncertainKeys[] = {
    "formation.shear_modulus", "formation.poisson_ratio", "formation.undrained_poisson_ratio",
    "formation.biot",          "formation.permeability",  "faults.friction"};

// The realizations of the uncertain inputs, drawn and checked before any computing.
struct DepthDraws {
  std::vector<poro::DepthRealization> draws;
  stats::SamplerDescriptor sampler;
  std::vector<std::string> input_names;  // the sampler's inputs, in draw order
};

// Empty unless the region's formation is poroelastic_3d and the scenario has [uncertainty].
// InputError naming the realization and the drawn values when a realization's medium or
// friction is outside its physical range.
std::optional<DepthDraws> depth_draws(const scenario::ResolvedScenario& s, const PreparedRun& p);

// The counts of poro/depth_monte_carlo.hpp over `draws`, on the inputs of the screen in depth `d`.
DepthProbability depth_probability(const scenario::ResolvedScenario& s, const DepthScreen& d, const DepthDraws& draws);

}  // namespace slipscreen::screening
