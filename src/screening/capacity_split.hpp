#pragma once
// The wells of a probabilistic run split for the allowable rate of a group (capacity.hpp): a
// group well scaled only from [capacity] from on becomes two wells at the same place, the part
// before (outside the group) and the part after (in it), whose rates add to the well's.
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/probabilistic/screen_inputs.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::screening {

// The group split the probabilistic screen needs (RunSettings::capacity) for the engine's
// wells `wells` (in the prepared run's well order) and the tracking grid.
probabilistic::GroupSplit capacity_split(const scenario::ResolvedScenario& s, const std::vector<probabilistic::WellInput>& wells,
                                         const std::vector<double>& tracked_times);

// The engine's wells split for a group: the wells named in `ids` are in the group (from `from` on
// only, when given: a well with rate before it becomes two, the part before outside the group).
// InputError (field `field`) when the group has no rate to scale.
probabilistic::GroupSplit split_group(const std::vector<probabilistic::WellInput>& wells,
                                      const std::vector<std::string>& ids, std::optional<double> from,
                                      const std::string& field, const std::string& where);

// The engine's rate steps split at `from`: the part before (ending with a shut-in step at `from`)
// and the part from `from` on; their sum is the whole. Either may be empty.
std::pair<hydro::RateSteps, hydro::RateSteps> split_steps(const hydro::RateSteps& steps, double from);

}  // namespace slipscreen::screening
