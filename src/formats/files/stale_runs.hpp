#pragma once
// Leftovers of a run that ended without cleaning up (SIGKILL, a power loss, a crash), found beside
// a run folder's target and cleaned before a new run starts (run_folder.hpp; docs/gis.md):
//   "<target>.partial-<pid>"   the staging folder of an unfinished run: removed;
//   "<target>.replaced-<pid>"  an earlier run moved aside by a forced replace (the rename fallback
//                              in run_folder.hpp). If the target is missing, the replace was cut
//                              between its two renames: the earlier run is PUT BACK as the target.
//                              If the target is a complete run (earlier_run.hpp), the leftover is
//                              removed; otherwise it is left alone and said so.
// Only leftovers of a process that no longer exists are touched (kill(pid, 0) fails with ESRCH); a
// live process, or one of another user (EPERM), is left alone. This process's own pid counts as
// gone except for the paths in `in_use` (its own runs in progress). Only folders are touched, never
// a file or a symbolic link of that name, and only names of exactly that form (<pid> in digits).
#include <filesystem>
#include <string>
#include <vector>

namespace slipscreen::formats {

// True when no process has this pid: kill(pid, 0) == -1 with errno ESRCH.
bool process_gone(long pid);

// Cleans the stale leftovers of `target` (an absolute, normalised path) and returns one line per
// leftover found, e.g.
//   "removed 'runs/demo.partial-4242', left by a run that did not finish (process 4242 is gone)"
// Throws IoError when an earlier run cannot be put back; nothing else is touched then.
std::vector<std::string> clean_stale_runs(const std::filesystem::path& target,
                                          const std::vector<std::filesystem::path>& in_use = {});

}  // namespace slipscreen::formats
