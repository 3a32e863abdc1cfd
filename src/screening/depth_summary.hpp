#pragma once
// What the console summary of a run with [formation] model = "poroelastic_3d" needs from the
// screen in depth (docs/physics.md, "The 3-D poroelastic model"): per segment the first crossing
// in depth (its date, the depth of the crossing point and ΔCFF there) and, with [uncertainty],
// P(slip by the last output time) with its Wilson interval (fault_depth_probability.csv).
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "scenario/scenario.hpp"
#include "screening/depth_probability.hpp"
#include "screening/depth_screen.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

struct DepthLine {
  std::string segment_id, fault_id;
  bool already_critical = false;               // some check point has Δp_crit ≤ 0
  std::optional<std::string> first_crossing;   // ISO date of the first tracked time with ΔCFF ≥ μΔp_crit
  double crossing_depth = 0, crossing_dcff = 0;  // m, Pa: at the crossing point and time (with first_crossing)
  double closest_margin = 0;                   // Pa: smallest μΔp_crit − ΔCFF over the output times
  std::optional<double> p_final, ci_low, ci_high;  // with [uncertainty]: P(slip by the last output time)
};

struct DepthSummary {
  std::size_t segments = 0, crossing_count = 0, already_critical_count = 0;
  std::size_t realizations = 0;  // 0: deterministic only
  std::vector<DepthLine> lines;  // every segment, most critical first (below)
};

// With `probability`: by P(slip by the last output time), highest first; else already critical
// first, then by first crossing (earliest first), then by the closest margin. Ties keep the
// segments' order.
DepthSummary summarize_depth(const PreparedRun& p, const DepthScreen& d, const DepthProbability* probability);

}  // namespace slipscreen::screening
