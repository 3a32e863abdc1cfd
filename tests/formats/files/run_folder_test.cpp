#include "formats/files/run_folder.hpp"

#include <doctest/doctest.h>

#include <fstream>
#include <stdexcept>
#include <string>

#include "core/errors.hpp"
#include "formats/files/manifest.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {
void write_text(const fs::path& p, const std::string& s) { std::ofstream(p) << s; }
// An earlier run at `target`: its files, then the manifest listing them (manifest.hpp).
void make_run(const fs::path& target, const std::string& file, const std::string& text) {
  formats::RunFolder run(target);
  write_text(run.output("k", file), text);
  formats::ManifestContent m;
  m.caution = "test caution";
  formats::write_manifest(run.output("manifest", "manifest.json"), m, run.staging());
  run.commit();
}
formats::RunFolderOptions forced(std::vector<fs::path> inputs = {}) {
  formats::RunFolderOptions o;
  o.force = true;
  o.inputs = std::move(inputs);
  return o;
}
// Runs `f` with `dir` as the working directory.
template <class F>
void in_folder(const fs::path& dir, F f) {
  const fs::path before = fs::current_path();
  fs::current_path(dir);
  try {
    f();
  } catch (...) {
    fs::current_path(before);
    throw;
  }
  fs::current_path(before);
}
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
  CHECK_THROWS_AS((formats::RunFolder{dir / "file", forced()}), RefusedError);
}

TEST_CASE("force replaces the old run only once the new one is complete") {
  test::TempDir dir("run-force");
  const fs::path target = dir / "review";
  make_run(target, "old.txt", "old");
  {
    formats::RunFolder run(target, forced());
    write_text(run.output("k", "new.txt"), "new");
    CHECK(read_text(target / "old.txt") == "old");  // still there while the new run is written
    run.commit();
  }
  CHECK_FALSE(fs::exists(target / "old.txt"));
  CHECK(read_text(target / "new.txt") == "new");
  CHECK(entries(dir.path()) == 1);  // no ".replaced-" or ".partial-" copy left
  // The new run has no manifest, so it is no longer a run that force may replace.
  CHECK_THROWS_WITH_AS((formats::RunFolder{target, forced()}), doctest::Contains("no manifest.json"),
                       RefusedError);
  make_run(dir / "second", "new.txt", "new");
  fs::remove_all(target);
  fs::rename(dir / "second", target);

  // A forced run that fails keeps the old one.
  try {
    formats::RunFolder run(target, forced());
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

TEST_CASE("force refuses a folder that is not a run of this tool, naming the first foreign file") {
  test::TempDir dir("run-foreign");
  const fs::path target = dir / "review";
  make_run(target, "segments.csv", "old");
  write_text(target / "notes.txt", "the user's notes");
  CHECK_THROWS_WITH_AS((formats::RunFolder{target, forced()}),
                       doctest::Contains("it holds 'notes.txt', which its manifest.json does not list"), RefusedError);
  CHECK(read_text(target / "notes.txt") == "the user's notes");
  CHECK(entries(dir.path()) == 1);

  // The folder may change while the new run is written: commit checks again.
  fs::remove(target / "notes.txt");
  {
    formats::RunFolder run(target, forced());
    write_text(run.output("k", "segments.csv"), "new");
    write_text(target / "notes.txt", "written meanwhile");
    CHECK_THROWS_WITH_AS(run.commit(), doctest::Contains("notes.txt"), RefusedError);
  }
  CHECK(read_text(target / "segments.csv") == "old");
  CHECK(entries(dir.path()) == 1);
}

TEST_CASE("never the working directory, a folder holding it, or a folder holding an input") {
  test::TempDir dir("run-protected");
  // Each folder is a complete earlier run, so only the protection refuses it.
  const fs::path project = dir / "project";
  make_run(project, "segments.csv", "a run folder that is also the working directory");
  in_folder(project, [&] {
    CHECK_THROWS_WITH_AS((formats::RunFolder{".", forced()}), doctest::Contains("is the working directory"),
                         RefusedError);
    CHECK_THROWS_WITH_AS((formats::RunFolder{"./", forced()}), doctest::Contains("is the working directory"),
                         RefusedError);
  });
  fs::create_directories(project / "sub");
  in_folder(project / "sub", [&] {
    CHECK_THROWS_WITH_AS((formats::RunFolder{"..", forced()}), doctest::Contains("holds the working directory"),
                         RefusedError);
  });
  fs::remove(project / "sub");
  CHECK(fs::exists(project / "segments.csv"));

  // An input inside the folder, named through a symbolic link: compared in canonical form.
  const fs::path data = dir / "data";
  make_run(data, "segments.csv", "run");
  write_text(data / "scenario.toml", "title = 'x'");
  fs::create_directory_symlink(data, dir / "link");
  CHECK_THROWS_WITH_AS((formats::RunFolder{data, forced({dir / "link" / "scenario.toml"})}),
                       doctest::Contains("holds the input file"), RefusedError);
  CHECK_THROWS_WITH_AS((formats::RunFolder{dir / "link" / ".." / "data", forced({data / "scenario.toml"})}),
                       doctest::Contains("holds the input file"), RefusedError);
  CHECK(fs::exists(data / "scenario.toml"));
}

TEST_CASE("GDAL virtual and network paths and control characters are refused as run folders") {
  for (const char* p : {"/vsimem/run", "/vsizip/out.zip/run", "/VSIMEM/run", "/vsis3/bucket/run", "https://h/run"}) {
    CAPTURE(p);
    CHECK_THROWS_WITH_AS(formats::RunFolder{p}, doctest::Contains("GDAL virtual or network path"), RefusedError);
  }
  CHECK_THROWS_WITH_AS(formats::RunFolder{"run\nname"}, doctest::Contains("'run\\nname'"), RefusedError);
  CHECK_THROWS_AS(formats::RunFolder{"/"}, RefusedError);
}

TEST_CASE("stale leftovers beside the target are cleaned first, one line each") {
  test::TempDir dir("run-stale");
  const fs::path target = dir / "review";
  fs::create_directories(dir / "review.partial-999999999");  // above the largest pid: no such process
  std::vector<std::string> notes;
  formats::RunFolderOptions o;
  o.notice = [&](const std::string& line) { notes.push_back(line); };
  formats::RunFolder::check_target(target, o);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("review.partial-999999999") != std::string::npos);
  CHECK(entries(dir.path()) == 0);
}

TEST_CASE("two outputs may not share a file, or a file and a folder") {
  test::TempDir dir("run-claims");
  formats::RunFolder run(dir / "review");
  run.output("output.files.segments", "tables/segments.csv");
  CHECK_THROWS_WITH_AS(run.output("output.files.segment_times", "./tables//segments.csv"),
                       doctest::Contains("the same file as output.files.segments"), RefusedError);
  CHECK_THROWS_WITH_AS(run.output("output.files.geopackage", "tables/segments.csv/x.gpkg"),
                       doctest::Contains("inside the file of output.files.segments"), RefusedError);
  run.output("output.files.geopackage", "tables/screen.gpkg");
  CHECK_THROWS_AS(run.output("output.files.pressure_raster", "tables"), RefusedError);
}

TEST_CASE("a caller's rule narrows what force replaces, checked before the run and at its commit") {
  test::TempDir dir("run-replaceable");
  const fs::path target = dir / "review";
  make_run(target, "old.txt", "old");
  formats::RunFolderOptions only_comparisons = forced();
  only_comparisons.replaceable = [](const fs::path&) -> std::optional<std::string> { return "not a comparison"; };
  CHECK_THROWS_WITH_AS((formats::RunFolder{target, only_comparisons}), doctest::Contains("not a comparison"),
                       RefusedError);
  CHECK(read_text(target / "old.txt") == "old");
  // Accepted when the run is written, refused by the time it is committed: the earlier run stays.
  bool accept = true;
  formats::RunFolderOptions changing = forced();
  changing.replaceable = [&accept](const fs::path&) -> std::optional<std::string> {
    if (accept) return std::nullopt;
    return "changed meanwhile";
  };
  {
    formats::RunFolder run(target, changing);
    write_text(run.output("k", "new.txt"), "new");
    accept = false;
    CHECK_THROWS_WITH_AS(run.commit(), doctest::Contains("changed meanwhile"), RefusedError);
  }
  CHECK(read_text(target / "old.txt") == "old");
  CHECK(entries(dir.path()) == 1);
  accept = true;
  {
    formats::RunFolder run(target, changing);
    write_text(run.output("k", "new.txt"), "new");
    run.commit();
  }
  CHECK(read_text(target / "new.txt") == "new");
}
