#pragma once
// What every subcommand gets, and how a subcommand registers itself (commands.hpp).
#include <functional>
#include <iosfwd>
#include <string>
#include <vector>

namespace CLI {
class App;
}

namespace slipscreen::cli {

// What every subcommand gets: the streams (results to out, diagnostics to err), the full
// command line (for manifests) and whether err is an interactive terminal (progress display).
struct Context {
  std::ostream& out;
  std::ostream& err;
  std::vector<std::string> command_line;
  bool err_is_terminal = false;
  // Set by the chosen subcommand's parse callback; run after parsing succeeds.
  std::function<int()> action;
};

// Subcommand registration, one function per command file (src/cli/<command>_command.cpp).
using Registrar = void (*)(CLI::App& app, Context& ctx);

}  // namespace slipscreen::cli
