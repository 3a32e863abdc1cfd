#pragma once
// Conditioning the probabilistic screen on the scenario's [observations] (docs/conditioning.md):
// the observations in the engine's form, checked against the wells, and what the outputs and
// the console report about them.
#include <string>
#include <vector>

#include "core/probabilistic/screen_inputs.hpp"
#include "screening/prepare.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::screening {

// An observation closer than this to an injection well (or within the well's radius) is at the
// injector: refused unless [observations] at_injector = true.
inline constexpr double kAtInjectorDistance = 1.0;  // m

// n_eff below this: the observations are more informative than the prior sample can represent.
inline constexpr double kLowEffectiveSample = 200.0;

// The scenario's pressure observations in the working CRS with σ = √(sd² + model_error²), in
// file order. InputError (naming the file, line and well) for a place the working CRS cannot
// hold, or for an observation at an injection well without at_injector: the line-source
// (Theis) model ignores the skin and the wellbore storage, so it cannot be compared with a
// pressure measured in the injecting well itself. Empty without [observations].
std::vector<probabilistic::PressureObservation> observation_inputs(const scenario::ResolvedScenario& s,
                                                                   const PreparedRun& p);

// The warning printed and written when n_eff < kLowEffectiveSample; empty otherwise.
std::string low_effective_sample_warning(double n_eff, std::uint64_t realizations);

}  // namespace slipscreen::screening
