// README.txt of a run folder: the title and facts, the caution once, one line per file.
#include "outputs/run_readme.hpp"

#include <doctest/doctest.h>

#include <fstream>
#include <stdexcept>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "formats/files/text_file.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

namespace {

std::size_t count(const std::string& text, const std::string& part) {
  std::size_t n = 0;
  for (auto at = text.find(part); at != std::string::npos; at = text.find(part, at + 1)) ++n;
  return n;
}

outputs::ReadmeContent sample() {
  outputs::ReadmeContent c;
  c.title = "slipscreen run: test";
  c.facts = {"Scenario: s.toml", "Screens run: deterministic screen"};
  c.files = {{"segments.csv", "one row per fault segment"}, {"tables/./times.csv", "one row per segment and time"},
             {"never_written.csv", "only listed when present"}};
  return c;
}

}  // namespace

TEST_CASE("README text: title, facts, the caution once, the listed files in order, aligned") {
  const std::string t = outputs::readme_text(sample(), {"tables/times.csv", "segments.csv"});
  CHECK(t.rfind("slipscreen run: test\n====================\nScenario: s.toml\nScreens run: deterministic screen\n", 0) == 0);
  // The caution, wrapped, appears once (its words joined back give the text).
  const auto from = t.find("CAUTION\n") + 8, to = t.find("\n\nFILES\n");
  std::string caution = t.substr(from, to - from);
  for (char& ch : caution)
    if (ch == '\n') ch = ' ';
  CHECK(caution == kScreeningCaution);
  CHECK(count(t, "Screening estimate") == 1);
  CHECK(t.find("segments.csv      one row per fault segment\ntables/times.csv  one row per segment and time\n") !=
        std::string::npos);
  CHECK(t.find("never_written.csv") == std::string::npos);
  CHECK_THROWS_AS(outputs::readme_text(sample(), {"other.csv"}), std::logic_error);
}

TEST_CASE("write_readme lists what the folder holds, itself and the manifest; refuses a taken name") {
  test::TempDir dir("readme");
  {
    formats::RunFolder run(dir / "run");
    formats::write_text_file(run.output("k", "segments.csv"), "a\n");
    outputs::write_readme(run, sample());
    run.commit();
  }
  const std::string t = [&] {
    std::ifstream in(dir / "run" / "README.txt");
    return std::string(std::istreambuf_iterator<char>(in), {});
  }();
  CHECK(t.find("\nREADME.txt     this description\n") != std::string::npos);
  CHECK(t.find("\nmanifest.json  what was run:") != std::string::npos);
  CHECK(t.find("\nsegments.csv   one row per fault segment\n") != std::string::npos);

  formats::RunFolder taken(dir / "taken");
  formats::write_text_file(taken.output("k", "manifest.json"), "{}\n");
  CHECK_THROWS_WITH_AS(outputs::write_readme(taken, sample()), doctest::Contains("'manifest.json'"), InputError);
  auto renamed = sample();
  renamed.manifest = "record.json";
  CHECK_NOTHROW(outputs::write_readme(taken, [&] {
    renamed.files.push_back({"manifest.json", "a table named so on purpose"});
    return renamed;
  }()));
}
