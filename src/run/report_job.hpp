#pragma once
// Building the report of a run folder (docs/report.md), all or nothing:
//   - inside a run that is still in its staging folder (run_scenario.cpp): the report is written
//     there after the manifest, which then lists the report's files (manifest.hpp,
//     record_report_files), and the whole folder is committed together;
//   - on a finished run folder (`slipscreen report`): the folder must be a run of slipscreen
//     (earlier_run.hpp); the report is written into a staging subfolder ".report-staging-<pid>"
//     and only when every file is complete are they moved into place; the manifest lists the old
//     and new report files while they are moved, then the new ones only. An error leaves the
//     earlier report (if any) untouched and removes the staging subfolder.
#include <cstddef>
#include <filesystem>
#include <string>
#include <vector>

namespace slipscreen::run {

struct ReportJobOptions {
  std::string page = "";      // "A4" or "Letter"; "" = the scenario's [output] page (A4 when absent)
  bool reproducible = false;  // no build time in the report (a rebuild gives the same bytes)
  std::size_t top = 5;        // segments in the "top segments" tables and figures
  std::string maps = "";      // "last" or "each" (area maps); "" = the scenario's [output] report_maps (last when absent)
};

struct ReportJobResult {
  std::filesystem::path folder;
  std::vector<std::string> files;  // relative to the folder, sorted
};

// Writes the report into the run folder `folder` whose manifest is `manifest_name` (in place:
// for a run's staging folder). Throws the typed errors of the reading and writing.
ReportJobResult write_report_into(const std::filesystem::path& folder, const ReportJobOptions& options,
                                  const std::string& manifest_name = "manifest.json");

// `slipscreen report FOLDER`: RefusedError when FOLDER is not a run of slipscreen; otherwise the
// report is built beside and moved into place as described above.
ReportJobResult rebuild_report(const std::filesystem::path& folder, const ReportJobOptions& options);

}  // namespace slipscreen::run
