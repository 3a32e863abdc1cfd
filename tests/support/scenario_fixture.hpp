#pragma once
// Test helper: a copy of tests/data/scenario/tiny in a fresh temporary folder, with edits.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "support/temp_dir.hpp"

namespace slipscreen::test {

// The bytes of a file ("" when it cannot be read).
inline std::string slurp(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

class TinyScenario {
 public:
  TinyScenario() : temp_("tiny"), dir_(temp_.path()) {
    std::filesystem::copy(std::filesystem::path(SLIPSCREEN_TEST_DATA) / "scenario/tiny", dir_,
                          std::filesystem::copy_options::recursive);
  }

  const std::filesystem::path& dir() const { return dir_; }
  std::filesystem::path scenario() const { return dir_ / "scenario.toml"; }

  std::string read(const std::string& name) const { return slurp(dir_ / name); }
  void write(const std::string& name, const std::string& text) const {
    std::ofstream(dir_ / name, std::ios::binary) << text;
  }
  // Replaces the first occurrence of `from` in a file (the test fails if it is absent).
  void replace(const std::string& name, const std::string& from, const std::string& to) const {
    std::string t = read(name);
    const auto pos = t.find(from);
    REQUIRE_MESSAGE(pos != std::string::npos, name << " lacks: " << from);
    t.replace(pos, from.size(), to);
    write(name, t);
  }
  void append(const std::string& name, const std::string& text) const { write(name, read(name) + text); }

 private:
  TempDir temp_;
  std::filesystem::path dir_;
};

}  // namespace slipscreen::test
