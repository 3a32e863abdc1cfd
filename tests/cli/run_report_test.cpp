// `run` in-process: the progress indication goes to stderr only when it is a terminal.
#include "cli/run_report.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <sstream>

#include "cli/app.hpp"
#include "cli/context.hpp"

namespace fs = std::filesystem;

TEST_CASE("progress on a terminal, none otherwise; results on stdout") {
  const fs::path out = fs::temp_directory_path() / "slipscreen-cli-progress";
  fs::remove_all(out);
  const std::string scenario = std::string(SLIPSCREEN_SOURCE_DIR) + "/tests/data/scenario/tiny/scenario.toml";
  {
    std::ostringstream o, e;
    CHECK(slipscreen::cli::run({"run", scenario, "--out", (out / "a").string()}, o, e, true) == 0);
    CHECK(e.str().find("pressure at fault segments 100%") != std::string::npos);
    CHECK(o.str().find("Faults closest to failure") != std::string::npos);
  }
  {
    std::ostringstream o, e;
    CHECK(slipscreen::cli::run({"run", scenario, "--out", (out / "b").string()}, o, e, false) == 0);
    CHECK(e.str().empty());
  }
  fs::remove_all(out);
}
