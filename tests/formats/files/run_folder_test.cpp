#include "formats/files/run_folder.hpp"

#include <doctest/doctest.h>

#include <fstream>
#include <stdexcept>
#include <string>

#include "core/errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {
void write_text(const fs::path& p, const std::string& s) { std::ofstream(p) << s; }
std::string read_text(const fs::path& p) {
  std::ifstream in(p);
  return std::string(std::istreambuf_iterator<char>(in), {});
}
// Entries of a folder other than the named one (to find stray staging folders).
int entries(const fs::path& dir) {
  int n = 0;
  for (const auto& e : fs::directory_iterator(dir)) (void)e, ++n;
  return n;
}
}  // namespace

TEST_CASE("a complete run is renamed into place; nothing else is left beside it") {
  test::TempDir dir("run");
  const fs::path target = dir / "review";
  {
    formats::RunFolder run(target);
    CHECK(run.staging().parent_path() == fs::absolute(target).parent_path());
    CHECK(run.staging().filename().string().rfind("review.partial-", 0) == 0);
    write_text(run.output("outputs.summary", "tables/summary.csv"), "a,b\n");
    CHECK_FALSE(fs::exists(target));  // nothing at the target until commit
    run.commit();
    CHECK(run.committed());
    CHECK_THROWS_AS(run.commit(), IoError);
  }
  CHECK(read_text(target / "tables" / "summary.csv") == "a,b\n");
  CHECK(entries(dir.path()) == 1);
}

TEST_CASE("an existing run is refused without force and left untouched") {
  test::TempDir dir("run-exists");
  const fs::path target = dir / "review";
  fs::create_directories(target);
  write_text(target / "old.txt", "old");
  CHECK_THROWS_WITH_AS(formats::RunFolder{target}, doctest::Contains("already exists"), RefusedError);
  CHECK(read_text(target / "old.txt") == "old");
  CHECK(entries(dir.path()) == 1);
  // A plain file in the way is refused even with force.
  write_text(dir / "file", "x");
  CHECK_THROWS_AS((formats::RunFolder{dir / "file", {.force = true}}), RefusedError);
}

TEST_CASE("force replaces the old run only once the new one is complete") {
  test::TempDir dir("run-force");
  const fs::path target = dir / "review";
  fs::create_directories(target);
  write_text(target / "old.txt", "old");
  {
    formats::RunFolder run(target, {.force = true});
    write_text(run.output("k", "new.txt"), "new");
    CHECK(read_text(target / "old.txt") == "old");  // still there while the new run is written
    run.commit();
  }
  CHECK_FALSE(fs::exists(target / "old.txt"));
  CHECK(read_text(target / "new.txt") == "new");
  CHECK(entries(dir.path()) == 1);  // no ".replaced-" copy left

  // A forced run that fails keeps the old one.
  try {
    formats::RunFolder run(target, {.force = true});
    write_text(run.output("k", "half.txt"), "half");
    throw std::runtime_error("simulated failure mid-run");
  } catch (const std::runtime_error&) {
  }
  CHECK(read_text(target / "new.txt") == "new");
  CHECK_FALSE(fs::exists(target / "half.txt"));
  CHECK(entries(dir.path()) == 1);
}

TEST_CASE("an exception mid-run leaves no folder behind") {
  test::TempDir dir("run-throw");
  const fs::path target = dir / "review";
  fs::path staging;
  try {
    formats::RunFolder run(target);
    staging = run.staging();
    write_text(run.output("k", "deep/er/file.csv"), "partial");
    throw InputError("rate", "abc", "a number with a unit");
  } catch (const InputError&) {
  }
  CHECK_FALSE(fs::exists(target));
  CHECK_FALSE(fs::exists(staging));
  CHECK(entries(dir.path()) == 0);

  // Parent folders the run had to create go too.
  try {
    formats::RunFolder run(dir / "runs" / "2031" / "review");
    CHECK(fs::exists(dir / "runs" / "2031"));
    throw std::runtime_error("simulated failure");
  } catch (const std::runtime_error&) {
  }
  CHECK(entries(dir.path()) == 0);
  {
    formats::RunFolder run(dir / "runs" / "2031" / "review");
    run.commit();
  }
  CHECK(fs::is_directory(dir / "runs" / "2031" / "review"));
}

TEST_CASE("output paths that escape the run folder are refused, naming key and value") {
  test::TempDir dir("run-escape");
  formats::RunFolder run(dir / "review");
  CHECK_THROWS_WITH_AS(run.output("outputs.raster", "../x.tif"),
                       doctest::Contains("outputs.raster = '../x.tif'"), RefusedError);
  CHECK_THROWS_WITH_AS(run.output("outputs.raster", "/abs/x.tif"), doctest::Contains("absolute"), RefusedError);
  CHECK_THROWS_AS(run.output("k", "a/../../x"), RefusedError);
  CHECK_THROWS_AS(run.output("k", "a/.."), RefusedError);
  CHECK_THROWS_AS(run.output("k", ""), RefusedError);
  CHECK_THROWS_AS(run.output("k", "."), RefusedError);
  CHECK_THROWS_AS(run.output("k", "/vsis3/bucket/x.tif"), RefusedError);
  CHECK(run.output("k", "./a//b.csv") == run.staging() / "a" / "b.csv");
  CHECK_FALSE(fs::exists(dir / "x.tif"));
}
