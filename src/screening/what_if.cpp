// What-if rate changes; see what_if.hpp.
#include "screening/what_if.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::screening {

WhatIfResult what_if_result(const scenario::ResolvedScenario& s, const PreparedRun& p, ProbabilisticRun& prob) {
  WhatIfResult r;
  for (const auto& w : s.what_if) {
    r.names.push_back(w.name);
    r.wells.push_back(what_if_wells(w, p));
    r.factors.push_back(w.factor);
    r.from.push_back(w.from);
  }
  r.realizations = prob.result.realizations;
  for (const auto& seg : p.segments) {
    r.segment_ids.push_back(seg.segment_id);
    r.fault_ids.push_back(seg.fault_id);
  }
  for (const auto& seg : prob.result.segments) r.base.push_back(seg.slipped_by);
  r.variant = std::move(prob.result.what_if);
  return r;
}

}  // namespace slipscreen::screening
