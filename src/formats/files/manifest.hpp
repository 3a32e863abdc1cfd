#pragma once
// The run manifest (manifest.json in the run folder): what was run, on what, by which version.
//
// Content (keys sorted; nlohmann::json objects are ordered maps):
//   {
//     "caution":      the screening caution, as given by the caller,
//     "command_line": ["slipscreen", "run", "scenario.toml", ...]   (argv as given),
//     "created_utc":  "2031-01-01T12:00:00Z"   (omitted when include_timestamp is false),
//     "inputs":       [{"role": "fault map", "path": "faults.gpkg", "bytes": 12345,
//                       "sha256": "<64 hex>"}, ...]                    (in the order given),
//     "outputs":      [{"path": "tables/summary.csv", "bytes": ..., "sha256": ...,
//                       "columns": ["segment_id", ...], "rows": 120}, ...]
//                     (sorted by path; optional; "columns" (the header) and "rows" (data records)
//                      for .csv files only),
//     "parameters":   the resolved parameters, as given by the caller (any JSON object),
//     "screens":      {"deterministic": true, "probabilistic": false, ...}: which screens ran
//                     (omitted when the caller gives none),
//     "seed":         the random seed (omitted when none),
//     "report":       {"written_by": "slipscreen report", "files": ["figures/area_map.csv", ...,
//                      "report.html", "report.pdf"], "note": ...}  (sorted; added by
//                     record_report_files after the report is built: names only, no hashes, since
//                     the report shows this manifest's inputs and hashes and is built after it),
//     "tool":         {"name": "slipscreen", "version": kVersion, "git_commit": ..., "compiler": ...,
//                      "libraries": {"gdal": ..., "proj": ..., "eigen": ..., "boost": ...}}
//                     (formats/files/build_info.hpp: the only build-dependent fields of a run)
//   }
// Written as 2-space indented JSON with a final newline. Given the same inputs and the same
// build, a rerun differs only in "created_utc"; with include_timestamp = false the file is
// byte-identical. Another build differs in "tool" (and nothing outside the manifest does).
#include <chrono>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

namespace slipscreen::formats {

struct ManifestInput {
  std::string role;              // e.g. "scenario", "wells", "fault map"
  std::filesystem::path path;    // where to read it to hash it
  std::string shown;             // how to name it in the manifest; "" = path as given (generic form)
};

// An array of the parameters that is written element by element and never held whole as JSON: a
// statewide review's wells with their 850,000 rate periods took about 1 GB as a JSON tree and its
// text (docs/cluster.md). The manifest holds item(0), ..., item(count - 1) at `at` (a JSON
// pointer into the parameters, whose parent object must exist there); the bytes are those of the
// same manifest built whole.
struct StreamedArray {
  nlohmann::json::json_pointer at;
  std::size_t count = 0;
  std::function<nlohmann::json(std::size_t)> item;
};

struct ManifestContent {
  std::vector<std::string> command_line;
  nlohmann::json parameters = nlohmann::json::object();
  std::vector<StreamedArray> streamed;  // arrays of the parameters written element by element
  std::optional<std::uint64_t> seed;
  std::vector<ManifestInput> inputs;
  nlohmann::json screens = nlohmann::json::object();  // screen name -> ran (true/false); {} = not recorded
  std::string caution;           // the screening caution (required, non-empty)
  bool include_timestamp = true;
};

// "YYYY-MM-DDTHH:MM:SSZ" (UTC, whole seconds).
std::string utc_iso_time(std::chrono::system_clock::time_point t);

// The manifest as JSON, the streamed arrays included. Hashes every input (IoError naming the
// file when one cannot be read) and, when `outputs_root` is given, every regular file under it
// except manifest.json itself. Throws InputError when the caution is empty, parameters or screens
// is not an object, or a streamed array's place has no parent object or is already taken.
nlohmann::json manifest_json(const ManifestContent& content,
                             std::chrono::system_clock::time_point now = std::chrono::system_clock::now(),
                             const std::optional<std::filesystem::path>& outputs_root = std::nullopt);

// Who writes the files of a manifest's "report" block.
inline constexpr const char* kReportWrittenBy = "slipscreen report";

// Rewrites the manifest at `path` with its "report" block listing `files` (relative, '/'-separated;
// an empty list removes the block); every other byte stays as it was. Written to a sibling
// temporary file and renamed over the manifest, so the manifest is never half written.
// IoError when it cannot be read or written; InputError when it is not a JSON object.
void record_report_files(const std::filesystem::path& path, std::vector<std::string> files);

// The files a manifest's "report" block lists (empty when none).
std::vector<std::string> report_files(const nlohmann::json& manifest);

// Writes manifest_json(...).dump(2) and a line feed to `path` (IoError on failure), with the
// streamed arrays written one element at a time. Call it last, after every other output, and
// pass the run folder's staging path as outputs_root to list the outputs.
void write_manifest(const std::filesystem::path& path, const ManifestContent& content,
                    const std::optional<std::filesystem::path>& outputs_root = std::nullopt);

}  // namespace slipscreen::formats
