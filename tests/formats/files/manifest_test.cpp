#include "formats/files/manifest.hpp"

#include <doctest/doctest.h>

#include <fstream>

#include <Eigen/Core>
#include <boost/version.hpp>
#include <gdal.h>

#include "core/errors.hpp"
#include "slipscreen/build_info.hpp"
#include "slipscreen/version.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;
namespace fs = std::filesystem;

namespace {
std::string read_text(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), {});
}
formats::ManifestContent sample(const test::TempDir& dir) {
  std::ofstream(dir / "abc.txt", std::ios::binary) << "abc";
  std::ofstream(dir / "empty.csv", std::ios::binary);
  formats::ManifestContent c;
  c.command_line = {"slipscreen", "run", "scenario.toml"};
  c.parameters = {{"zeta", 1.5}, {"alpha", {{"b", 2}, {"a", 1}}}};
  c.seed = 20310101;
  c.inputs = {{"wells", dir / "abc.txt", "inputs/abc.txt"}, {"history", dir / "empty.csv", ""}};
  c.caution = "Screening estimate only.";
  return c;
}
}  // namespace

TEST_CASE("manifest content: version, command line, seed, hashes, caution, time") {
  test::TempDir dir("manifest");
  const auto c = sample(dir);
  // 2031-01-01T00:00:00Z is 1924992000 s after the Unix epoch (python3: calendar.timegm((2031,1,1,0,0,0))).
  const auto t = std::chrono::system_clock::time_point(std::chrono::seconds(1924992000));
  const nlohmann::json j = formats::manifest_json(c, t);
  CHECK(j["tool"]["version"] == kVersion);
  CHECK(j["tool"]["name"] == "slipscreen");
  CHECK(j["command_line"] == nlohmann::json::array({"slipscreen", "run", "scenario.toml"}));
  CHECK(j["seed"] == 20310101);
  CHECK(j["created_utc"] == "2031-01-01T00:00:00Z");
  CHECK(j["caution"] == "Screening estimate only.");
  CHECK(j["parameters"]["alpha"]["a"] == 1);
  REQUIRE(j["inputs"].size() == 2);
  CHECK(j["inputs"][0]["role"] == "wells");
  CHECK(j["inputs"][0]["path"] == "inputs/abc.txt");
  CHECK(j["inputs"][0]["bytes"] == 3);
  // FIPS 180-2 Appendix B.1: SHA-256("abc").
  CHECK(j["inputs"][0]["sha256"] == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(j["inputs"][1]["path"] == (dir / "empty.csv").generic_string());
  CHECK(j["inputs"][1]["sha256"] == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("manifest text is sorted and differs between reruns only in the timestamp") {
  test::TempDir dir("manifest-det");
  auto c = sample(dir);
  const auto t1 = std::chrono::system_clock::time_point(std::chrono::seconds(1924992000));
  const auto t2 = t1 + std::chrono::hours(30);
  std::string a = formats::manifest_json(c, t1).dump(2), b = formats::manifest_json(c, t2).dump(2);
  CHECK(a != b);
  a.replace(a.find("2031-01-01T00:00:00Z"), 20, "T");
  b.replace(b.find("2031-01-02T06:00:00Z"), 20, "T");
  CHECK(a == b);
  // Keys sorted: "alpha" before "zeta", "caution" before "tool".
  CHECK(a.find("\"alpha\"") < a.find("\"zeta\""));
  CHECK(a.find("\"caution\"") < a.find("\"tool\""));

  c.include_timestamp = false;
  formats::write_manifest(dir / "m1.json", c);
  formats::write_manifest(dir / "m2.json", c);
  const std::string m1 = read_text(dir / "m1.json");
  CHECK(m1 == read_text(dir / "m2.json"));
  CHECK(m1.find("created_utc") == std::string::npos);
  CHECK(m1.back() == '\n');
  CHECK(nlohmann::json::parse(m1)["seed"] == 20310101);
}

TEST_CASE("outputs are listed with hashes, sorted, without the manifest itself") {
  test::TempDir dir("manifest-out");
  auto c = sample(dir);
  const fs::path run = dir / "run";
  fs::create_directories(run / "tables");
  std::ofstream(run / "tables" / "z.csv", std::ios::binary) << "abc";
  std::ofstream(run / "a.tif", std::ios::binary) << "";
  formats::write_manifest(run / "manifest.json", c, run);
  const auto j = nlohmann::json::parse(read_text(run / "manifest.json"));
  REQUIRE(j["outputs"].size() == 2);
  CHECK(j["outputs"][0]["path"] == "a.tif");
  CHECK(j["outputs"][1]["path"] == "tables/z.csv");
  CHECK(j["outputs"][1]["sha256"] == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  // A CSV output also gets its header names and its count of data records.
  CHECK(j["outputs"][1]["columns"] == nlohmann::json::array({"abc"}));
  CHECK(j["outputs"][1]["rows"] == 0);
  CHECK_FALSE(j["outputs"][0].contains("rows"));
}

TEST_CASE("a CSV output's columns and rows: quoted line feeds stay in their record, a last line may lack one") {
  test::TempDir dir("manifest-shape");
  auto c = sample(dir);
  const fs::path run = dir / "run";
  fs::create_directories(run);
  std::ofstream(run / "t.csv", std::ios::binary) << "id,\"note, long\",dp_MPa\r\nW-1,\"two\nlines\",1.5\nW-2,x,2";
  const auto j = formats::manifest_json(c, std::chrono::system_clock::now(), run);
  REQUIRE(j["outputs"].size() == 1);
  CHECK(j["outputs"][0]["columns"] == nlohmann::json::array({"id", "note, long", "dp_MPa"}));
  CHECK(j["outputs"][0]["rows"] == 2);
}

TEST_CASE("the manifest records the build and the screens that ran") {
  test::TempDir dir("manifest-build");
  auto c = sample(dir);
  c.screens = {{"deterministic", true}, {"probabilistic", false}};
  const auto j = formats::manifest_json(c);
  CHECK(j["tool"]["version"] == kVersion);
  CHECK(j["tool"]["git_commit"] == kGitCommit);
  CHECK(!j["tool"]["git_commit"].get<std::string>().empty());
  CHECK(j["tool"]["compiler"] == std::string(kCompilerId) + " " + kCompilerVersion);
  // Library versions as the library itself reports them (GDAL) or as compiled (Eigen, Boost).
  CHECK(j["tool"]["libraries"]["gdal"] == GDALVersionInfo("RELEASE_NAME"));
  CHECK(j["tool"]["libraries"]["eigen"] == std::to_string(EIGEN_WORLD_VERSION) + "." + std::to_string(EIGEN_MAJOR_VERSION) +
                                               "." + std::to_string(EIGEN_MINOR_VERSION));
  const std::string boost = j["tool"]["libraries"]["boost"];
  CHECK(boost.rfind(std::string(BOOST_LIB_VERSION).replace(1, 1, ".") + ".", 0) == 0);  // "1_74" -> "1.74."
  const std::string proj = j["tool"]["libraries"]["proj"];
  CHECK(proj.find('.') != std::string::npos);
  CHECK(proj.rfind("0.", 0) != 0);  // a real PROJ major version
  CHECK(j["screens"]["deterministic"] == true);
  CHECK(j["screens"]["probabilistic"] == false);
  c.screens = nlohmann::json::object();
  CHECK_FALSE(formats::manifest_json(c).contains("screens"));
  c.screens = nlohmann::json::array();
  CHECK_THROWS_AS(formats::manifest_json(c), InputError);
}

TEST_CASE("manifest errors") {
  test::TempDir dir("manifest-bad");
  auto c = sample(dir);
  c.inputs.push_back({"faults", dir / "missing.gpkg", ""});
  CHECK_THROWS_WITH_AS(formats::manifest_json(c), doctest::Contains("missing.gpkg"), IoError);
  c = sample(dir);
  c.caution.clear();
  CHECK_THROWS_AS(formats::manifest_json(c), InputError);
  c = sample(dir);
  c.parameters = nlohmann::json::array();
  CHECK_THROWS_AS(formats::manifest_json(c), InputError);
}

TEST_CASE("streamed arrays: the written bytes equal the manifest built whole") {
  test::TempDir dir("manifest-streamed");
  auto c = sample(dir);
  c.include_timestamp = false;
  c.parameters["scenario"] = {{"title", "t"}, {"zz", 1}};
  // Elements with nested objects and arrays (the wells' periods), an empty array, one at the
  // parameters' top level, and two in one object around other keys.
  const auto well = [](std::size_t i) {
    return nlohmann::json{{"id", "W-" + std::to_string(i)},
                          {"periods", nlohmann::json::array({{{"start", "2001-01-01"}, {"rate", 0.5 * i}}, {{"rate", 1}}})},
                          {"empty", nlohmann::json::array()}};
  };
  c.streamed.push_back({nlohmann::json::json_pointer("/scenario/wells"), 3, well});
  c.streamed.push_back({nlohmann::json::json_pointer("/scenario/a_first"), 1, [](std::size_t) { return 7; }});
  c.streamed.push_back({nlohmann::json::json_pointer("/none"), 0, well});
  c.streamed.push_back({nlohmann::json::json_pointer("/top"), 2, [](std::size_t i) { return nlohmann::json::array({i}); }});
  formats::write_manifest(dir / "m.json", c);
  const nlohmann::json whole = formats::manifest_json(c);
  CHECK(read_text(dir / "m.json") == whole.dump(2) + "\n");
  // The content is where it was asked for (a placeholder left anywhere would fail this).
  CHECK(whole["parameters"]["scenario"]["wells"].size() == 3);
  CHECK(whole["parameters"]["scenario"]["wells"][2]["periods"][0]["rate"] == 1.0);
  CHECK(whole["parameters"]["scenario"]["a_first"] == nlohmann::json::array({7}));
  CHECK(whole["parameters"]["none"] == nlohmann::json::array());
  CHECK(whole["parameters"]["top"][1][0] == 1);
  CHECK(read_text(dir / "m.json").find("streamed array") == std::string::npos);

  // A place without a parent object, or already taken, is refused before anything is written.
  auto orphan = c;
  orphan.streamed = {{nlohmann::json::json_pointer("/missing/wells"), 1, well}};
  CHECK_THROWS_WITH_AS(formats::write_manifest(dir / "o.json", orphan), doctest::Contains("/missing/wells"), InputError);
  CHECK_FALSE(fs::exists(dir / "o.json"));
  auto taken = c;
  taken.streamed = {{nlohmann::json::json_pointer("/scenario/title"), 1, well}};
  CHECK_THROWS_WITH_AS(formats::manifest_json(taken), doctest::Contains("/scenario/title"), InputError);
}
