#pragma once
// The command line as a library function, so it is tested in-process.
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

// Runs `slipscreen <args...>` (args excludes the program name) and returns the exit code.
// Every typed error is caught here and mapped to its exit code with one message on err.
int run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err,
        bool err_is_terminal = false);

// Subcommand registration, one function per command file (src/cli/<command>_command.cpp).
using Registrar = void (*)(CLI::App& app, Context& ctx);

}  // namespace slipscreen::cli
