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

TEST_CASE("--timings prints every stage's wall time and the totals on stderr, outside the summary") {
  const fs::path out = fs::temp_directory_path() / "slipscreen-cli-timings";
  fs::remove_all(out);
  const std::string scenario = std::string(SLIPSCREEN_SOURCE_DIR) + "/tests/data/scenario/tiny/scenario.toml";
  std::ostringstream o, e;
  CHECK(slipscreen::cli::run({"run", scenario, "--out", out.string(), "--timings"}, o, e, false) == 0);
  const std::string err = e.str();
  CAPTURE(err);
  for (const char* stage : {"reading faults and wells", "pressure at fault segments", "writing outputs"})
    CHECK(err.find(std::string("slipscreen: timing: ") + stage + ": ") != std::string::npos);
  CHECK(err.find("slipscreen: timing: total ") != std::string::npos);
  CHECK(err.find("sent 0 bytes, received 0 bytes, peak memory ") != std::string::npos);  // one process: no merge
  CHECK(err.find("rank ") == std::string::npos);
  CHECK(o.str().find("slipscreen: timing") == std::string::npos);
  fs::remove_all(out);
}
