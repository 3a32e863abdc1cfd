// `slipscreen run SCENARIO`: runs a scenario into its run folder and prints a summary.
#include <CLI/CLI.hpp>
#include <memory>

#include "cli/commands.hpp"
#include "cli/option_range.hpp"
#include "cli/run_report.hpp"

namespace slipscreen::cli {

// What `run` does today (run/run_scenario.cpp), in its order; `demo` shows the same.
std::string run_footer() {
  return "What run does, in order:\n"
         "  1. reads and checks every input the scenario names (region, wells, histories, fault map, catalog);\n"
         "     bad input stops it here with one message, before anything is computed or written\n"
         "  2. deterministic screen: Theis pore-pressure change at every fault segment against its Coulomb\n"
         "     dp_crit, and the first date it is reached\n"
         "  3. with [uncertainty]: probabilistic screen, P(slip) by each output time with Wilson intervals\n"
         "  4. with [catalog]: catalog review (Mc, b-value, bounds, seismogenic index), the events against\n"
         "     the model, and the r-t view around a well\n"
         "  5. with [output] rasters: pressure map of the pore-pressure change\n"
         "  6. writes the CSV tables, GeoTIFFs and screen.gpkg that [output] asks for, README.txt and\n"
         "     manifest.json into a staging folder, then renames it to the run folder (--out, else\n"
         "     [output] folder): all or nothing.\n"
         "  7. unless [output] report = false: the report drawn from those files, report.html, report.pdf and\n"
         "     figures/ (docs/report.md), in the same staging folder; `slipscreen report` rebuilds it.\n"
         "An existing run folder is refused unless --force. Outputs: docs/outputs.md.";
}

void register_run_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<RunCommandOptions>();
  CLI::App* sub = app.add_subcommand(
      "run", "Run a scenario: every screen it asks for, written into one run folder (what it does: below)");
  sub->footer(run_footer());
  sub->add_option("scenario", opts->scenario, "Scenario file (TOML), see docs/scenario.md")->required();
  sub->add_option("--out", opts->out, "Run folder (default: [output] folder of the scenario)");
  sub->add_flag("--force", opts->force, "Replace an earlier slipscreen run folder (one holding only what its manifest lists); the old one stays until the new run is complete");
  sub->add_flag("--allow-network", opts->allow_network, "Allow GDAL network paths (/vsicurl/ ...) in the scenario");
  sub->add_flag("--reproducible", opts->reproducible,
                "Leave the creation time out of the manifest and fix the GeoPackage timestamp (byte-identical reruns)");
  sub->add_option("--units", opts->units,
                  "Units of the tables and the summary: SI (MPa, m) or oilfield (psi, ft, bbl); default: the "
                  "scenario's [output] units, else SI")
      ->check(unit_system_name());
  sub->add_flag("--timings", opts->timings,
                "Print each stage's wall time, the bytes exchanged between ranks and the peak memory on stderr "
                "(under mpirun: every rank, docs/cluster.md)");
  sub->add_option("--closest", opts->closest, "Number of faults listed in the summary")
      ->default_val(10)
      ->check(in_range(0, 10000, "a number of faults"));
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return run_and_report(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
