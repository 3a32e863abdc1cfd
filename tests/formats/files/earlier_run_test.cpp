#include "formats/files/earlier_run.hpp"

#include <doctest/doctest.h>

#include <fstream>
#include <string>

#include "formats/files/manifest.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {

void write_text(const fs::path& p, const std::string& s) {
  fs::create_directories(p.parent_path());
  std::ofstream(p, std::ios::binary) << s;
}

// A folder as a run leaves it: outputs, then the manifest listing them (manifest.hpp).
void make_run(const fs::path& folder) {
  write_text(folder / "segments.csv", "a\n");
  write_text(folder / "tables" / "times.csv", "b\n");
  formats::ManifestContent m;
  m.caution = "test caution";
  formats::write_manifest(folder / "manifest.json", m, folder);
}

}  // namespace

TEST_CASE("a folder written as a run, with its manifest, is a run") {
  test::TempDir dir("earlier-run");
  make_run(dir / "run");
  CHECK_FALSE(formats::not_a_run(dir / "run").has_value());
}

TEST_CASE("a file or folder the manifest does not list makes it not a run, and is named") {
  test::TempDir dir("earlier-run-foreign");
  const fs::path run = dir / "run";
  make_run(run);
  write_text(run / "tables" / "notes.txt", "mine");
  auto why = formats::not_a_run(run);
  REQUIRE(why.has_value());
  CHECK(*why == "it holds 'tables/notes.txt', which its manifest.json does not list");
  fs::remove(run / "tables" / "notes.txt");

  fs::create_directories(run / "drafts");  // an empty folder the run never made
  why = formats::not_a_run(run);
  REQUIRE(why.has_value());
  CHECK(*why == "it holds 'drafts/', which its manifest.json does not list");
  fs::remove(run / "drafts");

  // A symbolic link in place of a listed file is not part of a run either.
  fs::rename(run / "segments.csv", dir / "segments.csv");
  fs::create_symlink(dir / "segments.csv", run / "segments.csv");
  why = formats::not_a_run(run);
  REQUIRE(why.has_value());
  CHECK(why->find("'segments.csv'") != std::string::npos);
}

TEST_CASE("a folder without a slipscreen manifest is not a run") {
  test::TempDir dir("earlier-run-manifest");
  const fs::path f = dir / "reports";
  fs::create_directories(f);
  CHECK(formats::not_a_run(f) == std::optional<std::string>("it has no manifest.json (it is empty)"));
  write_text(f / "b.pdf", "%PDF");
  write_text(f / "a.txt", "notes");
  // The first entry in sorted order is named, on every call.
  CHECK(formats::not_a_run(f) == std::optional<std::string>("it has no manifest.json (it holds 'a.txt')"));

  write_text(f / "manifest.json", "{\"tool\": {\"name\": \"another-tool\"}, \"outputs\": []}");
  auto why = formats::not_a_run(f);
  REQUIRE(why.has_value());
  CHECK(why->find("not written by slipscreen") != std::string::npos);

  write_text(f / "manifest.json", "{ not json");
  why = formats::not_a_run(f);
  REQUIRE(why.has_value());
  CHECK(why->find("not a slipscreen run manifest") != std::string::npos);

  // A manifest of ours whose outputs name files outside the folder grants nothing.
  fs::remove(f / "a.txt");
  fs::remove(f / "b.pdf");
  write_text(f / "manifest.json",
             "{\"tool\": {\"name\": \"slipscreen\"}, \"outputs\": [{\"path\": \"../x\"}, {\"path\": \"/etc/passwd\"}]}");
  CHECK_FALSE(formats::not_a_run(f).has_value());  // only manifest.json: a run with no outputs
  write_text(f / "x", "x");
  CHECK(formats::not_a_run(f).has_value());
}

TEST_CASE("the report's files, listed by name in the manifest's report block, belong to the run") {
  test::TempDir dir("earlier-run-report");
  const fs::path run = dir.path() / "run";
  make_run(run);
  write_text(run / "report.html", "<html></html>\n");
  write_text(run / "figures" / "area_map.svg", "<svg/>\n");
  REQUIRE(formats::not_a_run(run).has_value());  // not listed yet: foreign
  formats::record_report_files(run / "manifest.json", {"report.html", "figures/area_map.svg"});
  CHECK_FALSE(formats::not_a_run(run).has_value());
  // The block lists names only, sorted, with who writes them; the rest of the manifest is unchanged.
  std::ifstream in(run / "manifest.json");
  const auto j = nlohmann::json::parse(in);
  CHECK(j["report"]["files"] == nlohmann::json::array({"figures/area_map.svg", "report.html"}));
  CHECK(j["report"]["written_by"] == formats::kReportWrittenBy);
  CHECK(formats::report_files(j) == std::vector<std::string>{"figures/area_map.svg", "report.html"});
  CHECK(j["outputs"].size() == 2);
  // An empty list removes the block, and the files are foreign again.
  formats::record_report_files(run / "manifest.json", {});
  CHECK(formats::not_a_run(run).has_value());
  CHECK_FALSE(fs::exists(run / "manifest.json.writing"));
}
