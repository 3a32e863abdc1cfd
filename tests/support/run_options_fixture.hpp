#pragma once
// Test helper: run options that write into `out` with reproducible outputs (no timestamps).
#include <filesystem>

#include "run/run_scenario.hpp"

namespace slipscreen::test {

inline run::RunOptions options_into(const std::filesystem::path& out) {
  run::RunOptions o;
  o.out = out;
  o.reproducible = true;
  o.command_line = {"slipscreen", "run", "scenario.toml"};
  return o;
}

}  // namespace slipscreen::test
