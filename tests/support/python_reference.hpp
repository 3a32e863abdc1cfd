#pragma once
// Reference values computed at test time by a Python script under /usr/bin/python3 (scipy,
// Debian's python3-scipy): the input lines go to the script's stdin through a temporary file,
// its stdout comes back line by line. REQUIREs that the script ran and exited 0.
#include <doctest/doctest.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <unistd.h>

namespace slipscreen::test {

// `script`: a path relative to the source tree (tests/...).
inline std::vector<std::string> python_reference(const std::string& script, const std::vector<std::string>& input) {
  const auto in = std::filesystem::temp_directory_path() /
                  ("slipscreen_pyref_" + std::to_string(::getpid()) + "_" + std::filesystem::path(script).stem().string());
  {
    std::ofstream f(in);
    for (const auto& line : input) f << line << "\n";
    REQUIRE(f.good());
  }
  const std::string cmd = "/usr/bin/python3 " + std::string(SLIPSCREEN_SOURCE_DIR) + "/" + script + " < " + in.string();
  std::vector<std::string> out;
  FILE* p = ::popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  char line[1024];
  while (std::fgets(line, sizeof line, p)) out.emplace_back(line);
  const int status = ::pclose(p);
  std::filesystem::remove(in);
  REQUIRE(status == 0);
  return out;
}

}  // namespace slipscreen::test
