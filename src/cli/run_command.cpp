// `slipscreen run SCENARIO`: runs a scenario into its run folder and prints a summary.
#include <CLI/CLI.hpp>
#include <memory>

#include "cli/commands.hpp"
#include "cli/option_range.hpp"
#include "cli/run_report.hpp"

namespace slipscreen::cli {

void register_run_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<RunCommandOptions>();
  CLI::App* sub = app.add_subcommand("run", "Run a scenario: deterministic screen into a run folder");
  sub->add_option("scenario", opts->scenario, "Scenario file (TOML), see docs/scenario.md")->required();
  sub->add_option("--out", opts->out, "Run folder (default: [output] folder of the scenario)");
  sub->add_flag("--force", opts->force, "Replace an existing run folder (only once the new run is complete)");
  sub->add_flag("--allow-network", opts->allow_network, "Allow GDAL network paths (/vsicurl/ ...) in the scenario");
  sub->add_flag("--reproducible", opts->reproducible,
                "Leave the creation time out of the manifest and fix the GeoPackage timestamp (byte-identical reruns)");
  sub->add_option("--closest", opts->closest, "Number of faults listed in the summary")
      ->default_val(10)
      ->check(in_range(0, 10000, "a number of faults"));
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return run_and_report(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
