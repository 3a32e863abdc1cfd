// `slipscreen validate SCENARIO`: loads and checks a scenario without running it, and prints a
// summary of what a run would use.
#include <CLI/CLI.hpp>
#include <iomanip>
#include <memory>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/scenario_summary.hpp"
#include <algorithm>

#include "core/geomech/frictional_limit.hpp"
#include "screening/conditioning.hpp"
#include "screening/prepare.hpp"
#include "screening/run_cost.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::cli {
namespace {

struct ValidateOptions {
  std::string scenario;
  bool allow_network = false;
};

int run_validate(const ValidateOptions& o, Context& ctx) {
  const scenario::ResolvedScenario s = scenario::load_scenario(o.scenario);
  // Everything a run checks before computing: CRSs, the fault map, stresses, formation, grid.
  const screening::PreparedRun p = screening::prepare_run(s, o.allow_network);
  screening::observation_inputs(s, p);  // [observations]: an observation at an injector is refused
  const screening::RunCost cost = screening::estimate_run_cost(s, p);
  screening::refuse_beyond_memory(cost, screening::memory_limit_bytes(s), s.file);
  print_scenario_summary(s, ctx.out);
  ctx.out << "Faults     " << p.fault_count << " faults in " << p.segments.size() << " segments (working CRS "
          << p.working.name() << "); " << p.inputs.tracking_times.size() << " tracking times\n";
  const auto& st = p.inputs.stress;
  ctx.out << "  stress at reference depth: Sv " << std::fixed << std::setprecision(1) << st.sv / 1e6 << " MPa, SHmax "
          << st.shmax / 1e6 << " MPa, Shmin " << st.shmin / 1e6 << " MPa, p0 " << st.pore_pressure / 1e6 << " MPa\n";
  {
    const double s1 = std::max({st.sv, st.shmax, st.shmin}), s3 = std::min({st.sv, st.shmax, st.shmin});
    const auto lim = geomech::check_frictional_limit(s1, s3, st.pore_pressure, p.inputs.friction.mu);
    ctx.out << "  frictional limit (Jaeger & Cook): (S1-p0)/(S3-p0) = " << std::setprecision(3) << lim.ratio
            << ", limit " << lim.limit << " for friction " << std::setprecision(2) << p.inputs.friction.mu << ": "
            << geomech::to_string(lim.status)
            << (lim.status == geomech::LimitStatus::beyond ? " (such a stress cannot persist: check the stress description)" : "")
            << "\n";
  }
  if (s.output.rasters)
    ctx.out << "  raster: " << p.grid.columns << " x " << p.grid.rows << " cells\n";
  ctx.out << screening::cost_line(cost, screening::memory_limit_bytes(s)) << "\n";
  ctx.out << "  by part: " << screening::cost_parts_text(cost) << "\n";
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
