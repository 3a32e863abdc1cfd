#pragma once
// README.txt in every run folder: what the run is, the screening caution (once), and one line
// per file saying what it holds (docs/outputs.md). It holds nothing that varies between builds
// or reruns (no version, no build, no time), so reruns give the same bytes.
#include <string>
#include <vector>

#include "formats/files/run_folder.hpp"

namespace slipscreen::outputs {

struct ReadmeFile {
  std::string path;  // relative to the run folder, '/'-separated
  std::string what;  // one line
};

struct ReadmeContent {
  std::string title;               // "slipscreen run: <scenario title>"
  std::vector<std::string> facts;  // "Scenario: ...", "Screens run: ..."
  std::vector<ReadmeFile> files;   // descriptions of the files the run may write
  std::string manifest = "manifest.json";  // the manifest's name, written after README.txt
  bool oilfield_units = false;     // the tables are in oilfield units (psi, ft, bbl; docs/outputs.md)
};

// The text: title, facts, the caution, then one line per file in `listed` (sorted by path).
std::string readme_text(const ReadmeContent& content, const std::vector<std::string>& listed);

// Writes README.txt into the staging folder, listing every file already there, README.txt
// itself and the manifest (written last, after it). Throws InputError when an output already
// took the name of README.txt or of the manifest, std::logic_error when a file has no description (a writer without
// its line here).
void write_readme(const formats::RunFolder& folder, ReadmeContent content);

inline constexpr const char* kReadmeName = "README.txt";
inline constexpr const char* kManifestDescription =
    "what was run: slipscreen version and build, command line, resolved parameters, the screens run, "
    "SHA-256 and size of every input and output file, the caution";

}  // namespace slipscreen::outputs
