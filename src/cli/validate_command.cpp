// `slipscreen validate SCENARIO`: loads and checks a scenario without running it, and prints a
// summary of what a run would use.
#include <CLI/CLI.hpp>
#include <iomanip>
#include <memory>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/scenario_summary.hpp"
#include "io/scenario.hpp"

namespace slipscreen::cli {
namespace {

struct ValidateOptions {
  std::string scenario;
  bool allow_network = false;
};

int run_validate(const ValidateOptions& o, Context& ctx) {
  const io::ResolvedScenario s = io::load_scenario(o.scenario);
  print_scenario_summary(s, ctx.out);
  ctx.out << "scenario is valid: " << s.file << "\n";
  return kExitOk;
}

}  // namespace

void register_validate_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<ValidateOptions>();
  CLI::App* sub = app.add_subcommand("validate", "Check a scenario file and its inputs without running it");
  sub->add_option("scenario", opts->scenario, "Scenario file (TOML), see docs/scenario.md")->required();
  sub->add_flag("--allow-network", opts->allow_network, "Allow GDAL network paths (/vsicurl/ ...) in the scenario");
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return run_validate(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
