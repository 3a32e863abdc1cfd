#pragma once
// The scenario's [capacity] table (docs/scenario.md): the group of wells whose allowable rate
// the run reports (screening/capacity.hpp), in SI.
#include <optional>
#include <string>
#include <vector>

namespace slipscreen::scenario {

struct CapacitySpec {
  std::vector<std::string> wells;  // the group's well ids; empty in the file: the proposed wells
  std::optional<double> from;      // s since 1970-01-01 UTC: only the schedule from then on scales
  double margin = 0.0;             // Pa: the deterministic answer keeps Δp_crit − Δp ≥ margin
  double up_to = 10.0;             // factors are resolved exactly up to this multiple of the plan
  std::string where;               // the table's place, for messages
};

}  // namespace slipscreen::scenario
