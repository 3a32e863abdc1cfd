#pragma once
// A run folder that appears all at once, or not at all, and never costs the user a file.
//
//   formats::RunFolder run("out/review-2031", {.force = false, .inputs = {scenario, wells}});
//   write_geotiff(run.output("rasters.pressure", "dp.tif"), ...);   // inside the staging folder
//   run.commit();                                             // into place
//
// - Everything is written into a sibling staging folder "<target>.partial-<pid>" (same parent,
//   so the final rename is atomic on one file system).
// - What may be at the target: nothing, or (only with `force`) an earlier run of this tool —
//   manifest.json written by slipscreen and nothing the manifest does not list (earlier_run.hpp).
//   Refused, even with `force`, naming the folder and the first foreign entry: anything else; a
//   file or symbolic link; the working directory or a folder holding it; a folder holding one of
//   `inputs` (so the scenario's own folder is never replaced); paths compared in canonical form.
//   GDAL virtual and network paths ("/vsimem/...", "/vsizip/...", "https://...") and names with
//   control characters are refused as targets: the run folder is a local folder.
// - Before anything else, leftovers of a killed run beside the target are cleaned (stale_runs.hpp):
//   a stale "<target>.partial-<pid>" is removed, a stale "<target>.replaced-<pid>" is put back when
//   the target is missing; each said in one line to `notice`.
// - A forced replace keeps the earlier run reachable at every instant. In this order:
//     1. the new run is complete in the staging folder (the manifest is written last);
//     2. the target is checked again (it is still a run of this tool);
//     3. Linux: renameat2(staging, target, RENAME_EXCHANGE) swaps the two folders in one atomic
//        step; the earlier run is now at the staging name and is deleted;
//     3'. where the exchange is not supported (other file systems, kernels before 3.15): the target
//        is renamed to "<target>.replaced-<pid>", then the staging folder to the target; if that
//        second rename fails the earlier run is renamed back; then the earlier run is deleted.
//        A kill between the two renames leaves "<target>.replaced-<pid>", which the next run puts
//        back (stale_runs.hpp).
// - If commit() is never reached (an exception, an early return), the destructor removes the
//   staging folder (and any parent folders it had to create): no half-written output is left.
// - An interrupt (SIGINT, SIGTERM) is handled by a thread that calls
//   abandon_unfinished_run_folders() and ends the process (run/interrupt.hpp): every staging
//   folder in progress is removed. Steps 2-3' are one critical section, so the interrupt
//   lands before or after a commit, never inside it.
// - output(key, relative) checks a path named by scenario key `key` (path_policy.hpp: no
//   absolute paths, no "..", no network paths, no control characters), refuses a path already
//   given to another output (or a folder of one), creates its parent folders inside the staging
//   folder and returns the full path to write.
#include <filesystem>
#include <functional>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::formats {

struct RunFolderOptions {
  bool force = false;  // replace an earlier run of this tool (only once the new one is complete)
  // Files the run reads (scenario, region, fault map, wells, catalog, ...): a folder holding one is
  // never replaced.
  std::vector<std::filesystem::path> inputs;
  // One line per stale leftover cleaned beside the target (stale_runs.hpp); none if empty.
  std::function<void(const std::string&)> notice;
  // When set, a forced replace also needs this to accept the earlier run (nothing: accepted;
  // otherwise why not, for the message): `slipscreen compare` replaces only an earlier comparison.
  std::function<std::optional<std::string>(const std::filesystem::path&)> replaceable;
};

class RunFolder {
 public:
  // Cleans stale leftovers beside `target`, then throws RefusedError when the target may not be
  // used (see above: it exists and !force, is not a run of this tool, is protected or not local).
  // The constructor does the same; call this before a long computation to refuse early.
  static void check_target(const std::filesystem::path& target, const RunFolderOptions& options);

  // check_target, then creates the staging folder (IoError when it cannot).
  explicit RunFolder(std::filesystem::path target, RunFolderOptions options = {});
  ~RunFolder();
  RunFolder(const RunFolder&) = delete;
  RunFolder& operator=(const RunFolder&) = delete;

  const std::filesystem::path& target() const noexcept { return target_; }
  // Where to write until commit().
  const std::filesystem::path& staging() const noexcept { return staging_; }
  bool committed() const noexcept { return committed_; }

  // Full path for an output named by scenario key `key` with relative path `relative`.
  // RefusedError naming both keys when the path, or a folder of it, was given to another output.
  std::filesystem::path output(std::string_view key, std::string_view relative) const;

  // Moves the staging folder into place (see above). Throws RefusedError if the target changed
  // meanwhile into something that may not be replaced, IoError if a rename fails (staging is then
  // removed by the destructor and an earlier run is left in place). Calling it twice throws IoError.
  void commit();

 private:
  void replace_earlier_run();
  std::filesystem::path target_, staging_;
  std::filesystem::path created_parent_;  // outermost parent folder this run created, if any
  RunFolderOptions options_;
  mutable std::map<std::filesystem::path, std::string> claimed_;  // output path -> key
  bool committed_ = false;
};

// Removes every staging folder of this process that is not committed (and the parent folders
// those runs created), finishes deleting an earlier run being replaced, and returns the staging
// folders removed. For the interrupt handler only, just before the process ends: it keeps the
// run folders' lock, so every RunFolder call in other threads blocks from then on.
std::vector<std::filesystem::path> abandon_unfinished_run_folders() noexcept;

}  // namespace slipscreen::formats
