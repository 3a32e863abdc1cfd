#pragma once
// Is an existing folder an earlier run of slipscreen? Only such a folder is ever replaced by a
// forced run (run_folder.hpp; docs/gis.md, "The run folder").
//
// A run folder holds manifest.json (manifest.hpp) whose "tool"."name" is "slipscreen", and nothing
// that manifest does not list: every regular file is manifest.json itself, one of its
// "outputs"[].path entries or one of its "report"."files" (the report, manifest.hpp), and every folder is a parent of such a file. Symbolic links, FIFOs,
// sockets and devices are never part of a run. The folder is walked in sorted order, so the entry
// named as foreign is the same on every call, and the walk stops at the first one.
#include <filesystem>
#include <optional>
#include <string>

namespace slipscreen::formats {

// The name every manifest gives as "tool"."name".
inline constexpr const char* kRunToolName = "slipscreen";

// nullopt when `folder` is a run of this tool; otherwise why not, naming the first entry that is
// not part of a run (relative to `folder`, a folder with a trailing '/'), e.g.
//   "it holds 'notes.txt', which its manifest.json does not list"
//   "it has no manifest.json (it holds 'report.pdf')"
// Never throws for what it finds in the folder: an entry that cannot be read makes it not a run.
std::optional<std::string> not_a_run(const std::filesystem::path& folder);

}  // namespace slipscreen::formats
