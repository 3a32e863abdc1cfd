// End-to-end command-line tests as data: every tests/cli/cases/*.case file lists cases as
//   case: <name>
//   args: <arguments, shell-style quoting>
//   exit: <expected exit code>
//   stdout: <text that must appear on stdout>       (any number of these)
//   stderr: <text that must appear on stderr>       (any number of these)
//   no-stdout: <text that must not appear on stdout>
// The cases run in-process through slipscreen::cli::run, from the repository root.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "cli/app.hpp"
#include "cli/context.hpp"

namespace fs = std::filesystem;

namespace {

struct CliCase {
  std::string name, file;
  std::vector<std::string> args;
  int exit_code = 0;
  std::vector<std::string> out_has, err_has, out_lacks;
};

std::vector<std::string> split_shell(const std::string& s) {
  std::vector<std::string> out;
  std::string cur;
  bool in_word = false;
  char quote = 0;
  for (char c : s) {
    if (quote) {
      if (c == quote) quote = 0;
      else cur += c;
    } else if (c == '\'' || c == '"') {
      quote = c;
      in_word = true;
    } else if (c == ' ' || c == '\t') {
      if (in_word) out.push_back(cur);
      cur.clear();
      in_word = false;
    } else {
      cur += c;
      in_word = true;
    }
  }
  if (in_word) out.push_back(cur);
  return out;
}

std::vector<CliCase> load_cases() {
  std::vector<CliCase> cases;
  std::vector<fs::path> files;
  for (const auto& e : fs::directory_iterator(fs::path(SLIPSCREEN_SOURCE_DIR) / "tests/cli/cases"))
    if (e.path().extension() == ".case") files.push_back(e.path());
  std::sort(files.begin(), files.end());
  for (const auto& f : files) {
    std::ifstream in(f);
    std::string line;
    while (std::getline(in, line)) {
      if (line.empty() || line[0] == '#') continue;
      const auto colon = line.find(':');
      REQUIRE_MESSAGE(colon != std::string::npos, f.string() << ": bad line: " << line);
      const std::string key = line.substr(0, colon);
      std::string val = line.substr(colon + 1);
      if (!val.empty() && val[0] == ' ') val.erase(0, 1);
      if (key == "case") {
        cases.push_back({});
        cases.back().name = val;
        cases.back().file = f.filename().string();
        continue;
      }
      REQUIRE_MESSAGE(!cases.empty(), f.string() << ": a case must start with 'case:'");
      auto& c = cases.back();
      if (key == "args") c.args = split_shell(val);
      else if (key == "exit") c.exit_code = std::stoi(val);
      else if (key == "stdout") c.out_has.push_back(val);
      else if (key == "stderr") c.err_has.push_back(val);
      else if (key == "no-stdout") c.out_lacks.push_back(val);
      else FAIL(f.string() << ": unknown key '" << key << "'");
    }
  }
  return cases;
}

}  // namespace

TEST_CASE("command-line cases from tests/cli/cases") {
  const auto previous = fs::current_path();
  fs::current_path(SLIPSCREEN_SOURCE_DIR);
  const auto cases = load_cases();
  CHECK(!cases.empty());
  for (const auto& c : cases) {
    CAPTURE(c.file);
    CAPTURE(c.name);
    std::ostringstream out, err;
    const int code = slipscreen::cli::run(c.args, out, err);
    CAPTURE(out.str());
    CAPTURE(err.str());
    CHECK(code == c.exit_code);
    for (const auto& s : c.out_has) CHECK_MESSAGE(out.str().find(s) != std::string::npos, "stdout lacks: " << s);
    for (const auto& s : c.err_has) CHECK_MESSAGE(err.str().find(s) != std::string::npos, "stderr lacks: " << s);
    for (const auto& s : c.out_lacks) CHECK_MESSAGE(out.str().find(s) == std::string::npos, "stdout has: " << s);
  }
  fs::current_path(previous);
}
