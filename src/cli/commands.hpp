#pragma once
// The list of subcommands. Each lives in its own src/cli/<name>_command.cpp and exposes one
// registrar; add a line here and in commands.cpp when adding a command.
#include <vector>

#include "cli/context.hpp"

namespace slipscreen::cli {

const std::vector<Registrar>& registrars();

void register_units_command(CLI::App& app, Context& ctx);
void register_pressure_command(CLI::App& app, Context& ctx);
void register_catalog_command(CLI::App& app, Context& ctx);
void register_validate_command(CLI::App& app, Context& ctx);
void register_fault_stress_command(CLI::App& app, Context& ctx);
void register_run_command(CLI::App& app, Context& ctx);
void register_demo_command(CLI::App& app, Context& ctx);
void register_report_command(CLI::App& app, Context& ctx);
void register_compare_command(CLI::App& app, Context& ctx);

}  // namespace slipscreen::cli
