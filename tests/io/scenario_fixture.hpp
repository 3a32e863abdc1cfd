#pragma once
// Test helper: a copy of tests/data/scenario/tiny in a fresh temporary folder, with edits.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>

namespace slipscreen::test {

class TinyScenario {
 public:
  TinyScenario() {
    std::random_device rd;
    dir_ = std::filesystem::temp_directory_path() / ("slipscreen-tiny-" + std::to_string(rd()) + std::to_string(rd()));
    std::filesystem::create_directories(dir_);
    std::filesystem::copy(std::filesystem::path(SLIPSCREEN_TEST_DATA) / "scenario/tiny", dir_,
                          std::filesystem::copy_options::recursive);
  }
  ~TinyScenario() {
    std::error_code ec;
    std::filesystem::remove_all(dir_, ec);
  }
  TinyScenario(const TinyScenario&) = delete;
  TinyScenario& operator=(const TinyScenario&) = delete;

  const std::filesystem::path& dir() const { return dir_; }
  std::filesystem::path scenario() const { return dir_ / "scenario.toml"; }

  std::string read(const std::string& name) const {
    std::ifstream in(dir_ / name, std::ios::binary);
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
  }
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
  std::filesystem::path dir_;
};

}  // namespace slipscreen::test
