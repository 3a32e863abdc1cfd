#pragma once
// The command line as a library function, so it is tested in-process.
#include <iosfwd>
#include <string>
#include <vector>

namespace slipscreen::cli {

// Runs `slipscreen <args...>` (args excludes the program name) and returns the exit code.
// Every typed error is caught here and mapped to its exit code with one message on err.
int run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err,
        bool err_is_terminal = false);

}  // namespace slipscreen::cli
