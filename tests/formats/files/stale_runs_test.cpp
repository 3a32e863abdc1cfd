#include "formats/files/stale_runs.hpp"

#include <doctest/doctest.h>
#include <unistd.h>

#include <fstream>
#include <string>

#include "formats/files/manifest.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {

// Above the kernel's largest pid (PID_MAX_LIMIT = 2^22, linux/threads.h): no process has it.
constexpr long kDeadPid = 999999999;

void write_text(const fs::path& p, const std::string& s) {
  fs::create_directories(p.parent_path());
  std::ofstream(p, std::ios::binary) << s;
}
std::string read_text(const fs::path& p) {
  std::ifstream in(p);
  return std::string(std::istreambuf_iterator<char>(in), {});
}
void make_run(const fs::path& folder, const std::string& content) {
  write_text(folder / "segments.csv", content);
  formats::ManifestContent m;
  m.caution = "test caution";
  formats::write_manifest(folder / "manifest.json", m, folder);
}
fs::path leftover(const fs::path& target, const char* kind, long pid) {
  return target.parent_path() / (target.filename().string() + kind + std::to_string(pid));
}
bool contains(const std::vector<std::string>& notes, const std::string& s) {
  for (const auto& n : notes)
    if (n.find(s) != std::string::npos) return true;
  return false;
}

}  // namespace

TEST_CASE("a pid is gone only when kill(pid, 0) says so") {
  CHECK(formats::process_gone(kDeadPid));
  CHECK_FALSE(formats::process_gone(::getpid()));
  CHECK_FALSE(formats::process_gone(::getppid()));
  CHECK_FALSE(formats::process_gone(0));
}

TEST_CASE("a stale staging folder is removed; a live process's is left alone") {
  test::TempDir dir("stale-partial");
  const fs::path target = dir / "review";
  write_text(leftover(target, ".partial-", kDeadPid) / "half.csv", "x");
  write_text(leftover(target, ".partial-", ::getppid()) / "busy.csv", "y");
  const auto notes = formats::clean_stale_runs(target);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("removed") == 0);
  CHECK(notes[0].find("review.partial-999999999") != std::string::npos);
  CHECK(notes[0].find("process 999999999 is gone") != std::string::npos);
  CHECK_FALSE(fs::exists(leftover(target, ".partial-", kDeadPid)));
  CHECK(fs::exists(leftover(target, ".partial-", ::getppid()) / "busy.csv"));

  // This process's own pid counts as gone, unless the folder is one of its runs in progress.
  const fs::path own = leftover(target, ".partial-", ::getpid());
  fs::create_directories(own);
  CHECK(formats::clean_stale_runs(target, {own}).empty());
  CHECK(fs::exists(own));
  CHECK(formats::clean_stale_runs(target).size() == 1);
  CHECK_FALSE(fs::exists(own));
}

TEST_CASE("only folders named exactly <target>.partial-<pid> are touched") {
  test::TempDir dir("stale-names");
  const fs::path target = dir / "review";
  for (const char* name : {"review.partial-12x", "review.partial-0123", "review.partial-", "reviewer.partial-999999999",
                           "other.partial-999999999", "review.partial-9999999999"})
    fs::create_directories(dir / name);
  write_text(leftover(target, ".partial-", kDeadPid), "a file, not a folder");
  CHECK(formats::clean_stale_runs(target).empty());
  CHECK(fs::is_regular_file(leftover(target, ".partial-", kDeadPid)));
  CHECK(fs::is_directory(dir / "review.partial-0123"));
}

TEST_CASE("a replace cut between its two renames is put back") {
  test::TempDir dir("stale-replaced");
  const fs::path target = dir / "review";
  const fs::path aside = leftover(target, ".replaced-", kDeadPid);
  make_run(aside, "earlier run");
  write_text(leftover(target, ".partial-", kDeadPid) / "segments.csv", "the unfinished new run");
  const auto notes = formats::clean_stale_runs(target);
  CHECK(notes.size() == 2);
  CHECK(contains(notes, "put back the earlier run"));
  CHECK(read_text(target / "segments.csv") == "earlier run");
  CHECK_FALSE(fs::exists(aside));
  CHECK_FALSE(fs::exists(leftover(target, ".partial-", kDeadPid)));
}

TEST_CASE("a leftover earlier run beside a complete run is removed; beside anything else it is kept") {
  test::TempDir dir("stale-replaced-done");
  const fs::path target = dir / "review";
  const fs::path aside = leftover(target, ".replaced-", kDeadPid);
  make_run(aside, "earlier run");
  fs::create_directories(target);
  write_text(target / "notes.txt", "not a run");
  auto notes = formats::clean_stale_runs(target);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("alone") != std::string::npos);
  CHECK(fs::exists(aside / "segments.csv"));

  fs::remove_all(target);
  make_run(target, "new run");
  notes = formats::clean_stale_runs(target);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("removed") == 0);
  CHECK_FALSE(fs::exists(aside));
  CHECK(read_text(target / "segments.csv") == "new run");
}
