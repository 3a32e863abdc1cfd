// The wells of a [[what_if]] entry; see what_if_split.hpp.
#include "screening/what_if_split.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "screening/capacity_split.hpp"

namespace slipscreen::screening {

std::vector<std::string> what_if_wells(const scenario::WhatIfSpec& w, const PreparedRun& p) {
  if (!w.wells.empty()) return w.wells;
  std::vector<std::string> faults;
  for (const auto& seg : p.segments)
    if (std::find(faults.begin(), faults.end(), seg.fault_id) == faults.end()) faults.push_back(seg.fault_id);
  if (std::find(faults.begin(), faults.end(), w.fault) == faults.end())
    throw InputError("what_if.fault", w.fault, "the id of a fault of the fault map" + util::did_you_mean(w.fault, faults),
                     w.where);
  std::vector<std::string> ids;
  for (const auto& well : p.inputs.wells) {
    bool near = false;
    for (std::size_t i = 0; i < p.segments.size() && !near; ++i) {
      if (p.segments[i].fault_id != w.fault) continue;
      for (const auto& c : p.inputs.segments[i].check_points)
        near = near || std::hypot(c.x - well.x, c.y - well.y) <= w.radius;
    }
    if (near) ids.push_back(well.id);
  }
  if (ids.empty())
    throw InputError("what_if.radius", util::number_text(w.radius / 1000.0, 6) + " km",
                     "a radius holding at least one well near fault " + w.fault, w.where);
  return ids;
}

probabilistic::GroupSplit what_if_split(const scenario::WhatIfSpec& w, const PreparedRun& p,
                                        const std::vector<probabilistic::WellInput>& wells) {
  probabilistic::GroupSplit g = split_group(wells, what_if_wells(w, p), w.from, "what_if.wells", w.where);
  g.factor = w.factor;
  return g;
}

}  // namespace slipscreen::screening
