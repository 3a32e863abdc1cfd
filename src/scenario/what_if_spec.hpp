#pragma once
// The scenario's [[what_if]] entries (docs/scenario.md): rate changes of some wells, each
// computed on the probabilistic screen's own realizations (screening/what_if.hpp), in SI.
#include <string>
#include <vector>

namespace slipscreen::scenario {

struct WhatIfSpec {
  std::string name;
  std::vector<std::string> wells;  // ids given; or empty, with a radius around a fault
  std::string fault;               // fault id: the wells within `radius` of any of its check points
  double radius = 0.0;             // m
  double factor = 1.0;             // on the wells' rates from `from` on
  double from = 0.0;               // s since 1970-01-01 UTC
  std::string where;               // the entry's place, for messages
};

}  // namespace slipscreen::scenario
