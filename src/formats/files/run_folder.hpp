#pragma once
// A run folder that appears all at once, or not at all.
//
//   formats::RunFolder run("out/review-2031", {.force = false});   // refuses an existing folder
//   write_geotiff(run.output("rasters.pressure", "dp.tif"), ...);   // inside the staging folder
//   run.commit();                                             // rename into place
//
// - Everything is written into a sibling staging folder "<target>.partial-<pid>" (same parent,
//   so the final std::filesystem::rename is atomic on one file system).
// - An existing target is never touched unless `force`; then it is moved aside to
//   "<target>.replaced-<pid>" only after the new run is complete, the new one is renamed into
//   place, and the old one is deleted. If the second rename fails the old run is put back.
// - If commit() is never reached (an exception, an early return), the destructor removes the
//   staging folder (and any parent folders it had to create), so no half-written output is
//   left behind.
// - output(key, relative) checks a path named by scenario key `key` (path_policy.hpp: no
//   absolute paths, no "..", no network paths), creates its parent folders inside the staging
//   folder and returns the full path to write.
// A process killed without unwinding (SIGKILL, power loss) can leave a "*.partial-<pid>" folder;
// it is never mistaken for a run, and a later run with the same pid removes it first.
#include <filesystem>
#include <string_view>

namespace slipscreen::formats {

struct RunFolderOptions {
  bool force = false;  // replace an existing run folder (only once the new one is complete)
};

class RunFolder {
 public:
  // Throws RefusedError when `target` exists and !force (or exists and is not a folder), and
  // IoError when the staging folder cannot be created.
  explicit RunFolder(std::filesystem::path target, RunFolderOptions options = {});
  ~RunFolder();
  RunFolder(const RunFolder&) = delete;
  RunFolder& operator=(const RunFolder&) = delete;

  const std::filesystem::path& target() const noexcept { return target_; }
  // Where to write until commit().
  const std::filesystem::path& staging() const noexcept { return staging_; }
  bool committed() const noexcept { return committed_; }

  // Full path for an output named by scenario key `key` with relative path `relative`.
  std::filesystem::path output(std::string_view key, std::string_view relative) const;

  // Renames the staging folder into place (see above). Throws RefusedError if the target
  // appeared meanwhile and !force, IoError if the rename fails (staging is then removed by the
  // destructor). Calling it twice throws IoError.
  void commit();

 private:
  std::filesystem::path target_, staging_;
  std::filesystem::path created_parent_;  // outermost parent folder this run created, if any
  RunFolderOptions options_;
  bool committed_ = false;
};

}  // namespace slipscreen::formats
