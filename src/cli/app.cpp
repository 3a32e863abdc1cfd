#include "cli/app.hpp"

#include <CLI/CLI.hpp>
#include <algorithm>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "core/caution.hpp"
#include "core/errors.hpp"
#include "slipscreen/version.hpp"

namespace slipscreen::cli {
namespace {

int exit_code_for(ErrorCategory c) {
  switch (c) {
    case ErrorCategory::input: return kExitInput;
    case ErrorCategory::io: return kExitIo;
    case ErrorCategory::refused: return kExitRefused;
    case ErrorCategory::numerical: return kExitNumerical;
  }
  return kExitInternal;
}

}  // namespace

int run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err,
        bool err_is_terminal) {
  Context ctx{out, err, {}, err_is_terminal, {}};
  ctx.command_line.push_back("slipscreen");
  ctx.command_line.insert(ctx.command_line.end(), args.begin(), args.end());

  CLI::App app{"slipscreen " + std::string(kVersion) +
               " - screening of injection wells for induced-earthquake hazard.\n" + kScreeningCaution};
  app.name("slipscreen");
  app.set_version_flag("--version", std::string("slipscreen ") + kVersion);
  app.require_subcommand(1);
  app.fallthrough(true);  // --version and --help work after any subcommand too

  for (Registrar r : registrars()) r(app, ctx);

  std::vector<std::string> reversed(args.rbegin(), args.rend());  // CLI11 parses from the back
  try {
    app.parse(reversed);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e, out, err);
    return code == 0 ? kExitOk : kExitUsage;
  }
  if (!ctx.action) return kExitUsage;
  try {
    return ctx.action();
  } catch (const Error& e) {
    err << "slipscreen: error: " << e.what() << "\n";
    return exit_code_for(e.category());
  } catch (const std::exception& e) {
    err << "slipscreen: internal error: " << e.what()
        << "\n(please report this with the command line that caused it)\n";
    return kExitInternal;
  }
}

}  // namespace slipscreen::cli
