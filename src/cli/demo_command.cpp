// `slipscreen demo`: runs the bundled, fictional demo scenario (regions/marrowick) into a run
// folder (default runs/demo under the current directory) and prints where the outputs are.
#include <CLI/CLI.hpp>
#include <filesystem>
#include <memory>

#include "cli/commands.hpp"
#include "cli/option_range.hpp"
#include "cli/run_report.hpp"
#include "core/errors.hpp"

namespace slipscreen::cli {
namespace {

std::string demo_scenario() {
  namespace fs = std::filesystem;
  const fs::path rel = "regions/marrowick/scenario.toml";
  std::error_code ec;
  if (fs::is_regular_file(rel, ec)) return rel.generic_string();
  const fs::path bundled = fs::path(SLIPSCREEN_SOURCE_DIR) / rel;
  if (fs::is_regular_file(bundled, ec)) return bundled.generic_string();
  throw IoError("the demo scenario " + rel.generic_string() + " was found neither here nor in " SLIPSCREEN_SOURCE_DIR);
}

}  // namespace

void register_demo_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<RunCommandOptions>();
  CLI::App* sub = app.add_subcommand(
      "demo", "Run the bundled demo scenario (the fictional Marrowick Basin, regions/marrowick) with every screen into "
              "runs/demo, as `run` does");
  sub->footer("The demo scenario has wells with monthly volumes, a planned well, mapped faults, [uncertainty] and a\n"
              "synthetic [catalog], so every screen runs.\n\n" + run_footer());
  sub->add_option("--out", opts->out, "Run folder")->default_val("runs/demo");
  sub->add_flag("--force", opts->force, "Replace an earlier slipscreen run folder (one holding only what its manifest lists); the old one stays until the new run is complete");
  sub->add_flag("--reproducible", opts->reproducible,
                "Leave the creation time out of the manifest and fix the GeoPackage timestamp (byte-identical reruns)");
  sub->add_option("--units", opts->units,
                  "Units of the tables and the summary: SI (MPa, m) or oilfield (psi, ft, bbl); default: the "
                  "scenario's [output] units, else SI")
      ->check(unit_system_name());
  sub->callback([opts, &ctx] {
    ctx.action = [opts, &ctx] {
      RunCommandOptions o = *opts;
      o.scenario = demo_scenario();
      return run_and_report(o, ctx);
    };
  });
}

}  // namespace slipscreen::cli
