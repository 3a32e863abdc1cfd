#include "cli/app.hpp"

#include <CLI/CLI.hpp>
#include <algorithm>
#include <ostream>
#include <sstream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/util/suggest.hpp"
#include "run/mpi_cluster.hpp"
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

// The subcommand named on the command line, if any (the first word that names one).
CLI::App* chosen_subcommand(CLI::App& app, const std::vector<std::string>& args) {
  for (const auto& a : args) {
    if (a == "--") break;
    if (!a.empty() && a[0] == '-') continue;
    for (CLI::App* sub : app.get_subcommands({}))
      if (sub->check_name(a)) return sub;
  }
  return nullptr;
}

std::vector<std::string> long_option_names(const CLI::App& app) {
  std::vector<std::string> names;
  for (const CLI::Option* o : app.get_options())
    for (const auto& l : o->get_lnames()) names.push_back("--" + l);
  return names;
}

// CLI11 says an option is unknown; this adds the nearest option name of the subcommand (edit
// distance, core/util/suggest.hpp), or the nearest subcommand for an unknown first word.
void suggest_names(CLI::App& app, const std::vector<std::string>& args, std::ostream& err) {
  CLI::App* sub = chosen_subcommand(app, args);
  std::vector<std::string> options = long_option_names(app);
  if (sub) {
    const auto more = long_option_names(*sub);
    options.insert(options.end(), more.begin(), more.end());
  }
  std::vector<std::string> subcommands;
  for (const CLI::App* s : app.get_subcommands({})) subcommands.push_back(s->get_name());
  bool first_word = true;
  for (const auto& a : args) {
    if (a == "--") break;
    if (a.rfind("--", 0) == 0 && a.size() > 2) {
      const std::string name = a.substr(0, a.find('='));
      if (std::find(options.begin(), options.end(), name) != options.end()) continue;
      const std::string where = sub ? " of '" + sub->get_name() + "'" : "";
      const std::string hint = util::did_you_mean(name, options);
      err << "slipscreen: '" << name << "' is not an option" << where
          << (hint.empty() ? " (see 'slipscreen " + (sub ? sub->get_name() + " " : "") + "--help')" : hint) << "\n";
    } else if (first_word && !a.empty() && a[0] != '-') {
      first_word = false;
      if (!sub) err << "slipscreen: '" << a << "' is not a command" << util::did_you_mean(a, subcommands) << "\n";
    }
  }
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
    // Every rank parses the same arguments and ends alike; under mpirun rank 0 alone prints the
    // help or the usage error (once, not once per rank).
    std::ostringstream elsewhere;
    std::ostream& o = run::cluster_rank() == 0 ? out : elsewhere;
    std::ostream& e_out = run::cluster_rank() == 0 ? err : elsewhere;
    const int code = app.exit(e, o, e_out);
    if (code != 0) suggest_names(app, args, e_out);
    return code == 0 ? kExitOk : kExitUsage;
  }
  if (!ctx.action) return kExitUsage;
  // Under mpirun every rank gets here; rank 0 alone prints, and every rank ends with rank 0's
  // exit code (run/mpi_cluster.hpp, docs/cluster.md).
  int code = kExitOk, category = run::kClusterOk;
  std::string message;
  try {
    const auto subs = app.get_subcommands();
    if (run::cluster_ranks() > 1 && (subs.empty() || subs.front()->get_name() != "run"))
      throw RefusedError("only 'run' splits its work across MPI ranks (docs/cluster.md); start '" +
                         (subs.empty() ? std::string("this command") : subs.front()->get_name()) + "' without mpirun");
    code = ctx.action();
  } catch (const Error& e) {
    message = e.what();
    category = static_cast<int>(e.category());
    code = exit_code_for(e.category());
    if (run::cluster_rank() == 0) err << "slipscreen: error: " << e.what() << "\n";
  } catch (const std::exception& e) {
    message = e.what();
    category = run::kClusterInternal;
    code = kExitInternal;
    if (run::cluster_rank() == 0)
      err << "slipscreen: internal error: " << e.what()
          << "\n(please report this with the command line that caused it)\n";
  }
  return run::cluster_finish(code, category, message, err);
}

}  // namespace slipscreen::cli
