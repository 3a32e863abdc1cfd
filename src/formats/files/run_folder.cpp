#include "formats/files/run_folder.hpp"

#include <fcntl.h>
#include <unistd.h>
#ifdef __linux__
#include <sys/syscall.h>
#endif

#include <algorithm>
#include <cerrno>
#include <cstring>
#include <mutex>
#include <string>
#include <system_error>

#include "core/errors.hpp"
#include "formats/files/earlier_run.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/files/stale_runs.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

// ---- the runs of this process in progress, for the interrupt handler ----

struct ActiveRun {
  fs::path remove;           // the staging folder, or an earlier run being deleted after a replace
  bool unfinished = true;    // `remove` is a staging folder (not yet committed)
  fs::path innermost_parent;  // the target's parent folder
  fs::path created_parent;    // the outermost parent folder this run created ("" if none)
};

struct Registry {
  std::mutex mutex;
  std::map<const RunFolder*, ActiveRun> runs;
};

// Never destroyed: the interrupt thread may still use it while the process exits.
Registry& registry() {
  static Registry* r = new Registry;
  return *r;
}

std::vector<fs::path> in_use(const Registry& reg) {
  std::vector<fs::path> paths;
  for (const auto& [run, active] : reg.runs) paths.push_back(active.remove);
  return paths;
}

// Removes the parent folders a run created, innermost first, while they are empty.
void remove_created_parents(const fs::path& innermost, const fs::path& created) {
  if (created.empty()) return;
  std::error_code ec;
  for (fs::path p = innermost;; p = p.parent_path())
    if (!fs::remove(p, ec) || p == created || p == p.parent_path()) break;
}

// remove_all, repeated while another thread may still be creating files in the folder.
void remove_tree(const fs::path& p) {
  for (int attempt = 0; attempt < 20; ++attempt) {
    std::error_code ec;
    fs::remove_all(p, ec);
    if (!fs::exists(fs::symlink_status(p, ec))) return;
  }
}

// ---- the target ----

fs::path sibling(const fs::path& target, const std::string& suffix) {
  return target.parent_path() / (target.filename().string() + suffix + "-" + std::to_string(::getpid()));
}

std::string shown(const fs::path& target) { return "run folder '" + display_name(target) + "'"; }

// The absolute, normalised target; refuses a path that is not a local folder name.
fs::path normalised_target(const fs::path& target) {
  const std::string text = target.string();
  if (text.empty()) throw RefusedError("run folder: empty path; give a folder name");
  if (has_control_character(text))
    throw RefusedError("run folder '" + escaped_text(text) +
                       "': a control character (newline, tab, NUL, ...) in a folder name; choose another name");
  const auto not_local = [&](const std::string& path) {
    throw RefusedError("run folder '" + text + "': " + path +
                       " is a GDAL virtual or network path; a run folder must be a folder on a local file system");
  };
  if (is_virtual_or_network_path(text)) not_local("it");
  fs::path t = fs::absolute(target).lexically_normal();
  if (!t.has_filename()) t = t.parent_path();  // "out/" -> "out"
  if (t.filename().empty() || t == t.root_path()) throw RefusedError("run folder '" + text + "': the root folder; choose a folder inside it");
  if (is_virtual_or_network_path(t.string())) not_local("its full path '" + t.string() + "'");
  return t;
}

// True when `p` is `folder` or lies inside it (both canonical).
bool within(const fs::path& p, const fs::path& folder) {
  auto pi = p.begin();
  for (auto fi = folder.begin(); fi != folder.end(); ++fi, ++pi)
    if (pi == p.end() || *pi != *fi) return false;
  return true;
}

fs::path canonical_or_self(const fs::path& p) {
  std::error_code ec;
  fs::path c = fs::weakly_canonical(fs::absolute(p), ec);
  return ec ? fs::absolute(p).lexically_normal() : c;
}

// Never the working directory, a folder holding it, or a folder holding an input of the run.
void refuse_protected(const fs::path& target, const std::vector<fs::path>& inputs) {
  const fs::path folder = canonical_or_self(target);
  std::error_code ec;
  const fs::path cwd = fs::current_path(ec);
  const auto refuse = [&](const std::string& what) {
    throw RefusedError(shown(target) + " " + what +
                       ": such a folder is never replaced, even with --force; choose another output folder");
  };
  if (!ec && within(canonical_or_self(cwd), folder))
    refuse(canonical_or_self(cwd) == folder ? "is the working directory" : "holds the working directory");
  for (const fs::path& in : inputs)
    if (!in.empty() && within(canonical_or_self(in), folder)) refuse("holds the input file '" + display_name(in) + "'");
}

// Throws RefusedError when `target` (normalised) may not be written or replaced.
void refuse_target(const fs::path& target, const RunFolderOptions& options) {
  std::error_code ec;
  const auto st = fs::symlink_status(target, ec);
  if (!fs::exists(st)) return;
  if (fs::is_symlink(st) || !fs::is_directory(st))
    throw RefusedError(shown(target) + ": exists and is not a folder (" +
                       (fs::is_symlink(st) ? "a symbolic link" : "a file") + "); choose another output folder");
  refuse_protected(target, options.inputs);
  if (!options.force)
    throw RefusedError(shown(target) +
                       " already exists: it is never overwritten unless forced; choose another folder or give --force "
                       "to replace it (only an earlier slipscreen run is replaced)");
  if (const auto why = not_a_run(target))
    throw RefusedError(shown(target) + " is not a slipscreen run, so --force does not replace it: " + *why +
                       "; choose another output folder");
  if (options.replaceable)
    if (const auto why = options.replaceable(target))
      throw RefusedError(shown(target) + " is not replaced by --force: " + *why + "; choose another output folder");
}

void clean_and_check(const fs::path& target, const RunFolderOptions& options, const std::vector<fs::path>& busy) {
  for (const std::string& line : clean_stale_runs(target, busy))
    if (options.notice) options.notice(line);
  refuse_target(target, options);
}

// renameat2(from, to, RENAME_EXCHANGE): true when the two were swapped; else errno is set.
bool exchange(const fs::path& from, const fs::path& to) {
#if defined(__linux__) && defined(SYS_renameat2)
  constexpr unsigned kRenameExchange = 1u << 1;  // RENAME_EXCHANGE, linux/fs.h
  return ::syscall(SYS_renameat2, AT_FDCWD, from.c_str(), AT_FDCWD, to.c_str(), kRenameExchange) == 0;
#else
  (void)from, (void)to;
  errno = ENOSYS;
  return false;
#endif
}

// The exchange is not available here (the kernel, the file system, or a seccomp filter).
bool exchange_unsupported(int err) {
  return err == ENOSYS || err == EINVAL || err == ENOTSUP || err == EOPNOTSUPP || err == EPERM;
}

}  // namespace

void RunFolder::check_target(const fs::path& target, const RunFolderOptions& options) {
  const fs::path t = normalised_target(target);
  Registry& reg = registry();
  std::lock_guard<std::mutex> lock(reg.mutex);
  clean_and_check(t, options, in_use(reg));
}

RunFolder::RunFolder(fs::path target, RunFolderOptions options) : options_(std::move(options)) {
  target_ = normalised_target(target);
  Registry& reg = registry();
  std::lock_guard<std::mutex> lock(reg.mutex);
  clean_and_check(target_, options_, in_use(reg));
  staging_ = sibling(target_, ".partial");
  std::error_code ec;
  if (fs::exists(fs::symlink_status(staging_, ec)))
    throw IoError(shown(target_) + ": this process is already writing it (" + display_name(staging_) + ")");
  for (fs::path p = target_.parent_path(); !p.empty() && !fs::exists(p, ec); p = p.parent_path()) {
    created_parent_ = p;
    if (p == p.parent_path()) break;
  }
  fs::create_directories(staging_, ec);
  if (ec) {
    remove_created_parents(target_.parent_path(), created_parent_);
    throw IoError(staging_.string() + ": cannot create the run's staging folder: " + ec.message());
  }
  reg.runs[this] = ActiveRun{staging_, true, target_.parent_path(), created_parent_};
}

RunFolder::~RunFolder() {
  Registry& reg = registry();
  std::lock_guard<std::mutex> lock(reg.mutex);
  reg.runs.erase(this);
  if (committed_) return;
  std::error_code ec;
  fs::remove_all(staging_, ec);  // best effort; a destructor must not throw
  remove_created_parents(target_.parent_path(), created_parent_);
}

fs::path RunFolder::output(std::string_view key, std::string_view relative) const {
  const fs::path rel = safe_relative_output(key, relative);
  for (const auto& [path, owner] : claimed_) {
    if (!within(rel, path) && !within(path, rel)) continue;
    const std::string how = rel == path ? "the same file as" : within(rel, path) ? "inside the file of" : "a folder holding the file of";
    throw RefusedError(std::string(key) + " = '" + std::string(relative) + "': " + how + " " + owner + " ('" +
                       path.generic_string() + "'); each output needs its own file name in the run folder");
  }
  claimed_.emplace(rel, std::string(key));
  const fs::path full = staging_ / rel;
  std::lock_guard<std::mutex> lock(registry().mutex);  // an interrupt cannot remove the folder meanwhile
  std::error_code ec;
  fs::create_directories(full.parent_path(), ec);
  if (ec) throw IoError(full.parent_path().string() + ": cannot create the folder: " + ec.message());
  return full;
}

void RunFolder::commit() {
  if (committed_) throw IoError(target_.string() + ": run folder already committed");
  Registry& reg = registry();
  std::unique_lock<std::mutex> lock(reg.mutex);
  refuse_target(target_, options_);  // the target may have appeared or changed during the run
  std::error_code ec;
  if (!fs::exists(fs::symlink_status(target_, ec))) {
    fs::rename(staging_, target_, ec);
    if (ec) throw IoError(target_.string() + ": cannot move the finished run into place: " + ec.message());
    committed_ = true;
    reg.runs.erase(this);
    return;
  }
  // A forced replace (run_folder.hpp, steps 3 and 3'): afterwards `earlier` holds the old run.
  fs::path earlier = staging_;
  if (!exchange(staging_, target_)) {
    const int err = errno;
    if (!exchange_unsupported(err))
      throw IoError(target_.string() + ": cannot swap the finished run into place (the earlier run is kept): " +
                    std::strerror(err));
    earlier = sibling(target_, ".replaced");
    fs::rename(target_, earlier, ec);
    if (ec) throw IoError(target_.string() + ": cannot move the earlier run aside (it is kept): " + ec.message());
    fs::rename(staging_, target_, ec);
    if (ec) {
      std::error_code back;
      fs::rename(earlier, target_, back);
      throw IoError(target_.string() + ": cannot move the finished run into place: " + ec.message() +
                    (back ? "; the earlier run is in " + earlier.string() + " (putting it back failed: " +
                                back.message() + ")"
                          : "; the earlier run is kept"));
    }
  }
  committed_ = true;
  reg.runs[this] = ActiveRun{earlier, false, {}, {}};  // an interrupt finishes deleting it
  lock.unlock();
  remove_tree(earlier);  // the new run is in place; the old copy goes (a leftover is cleaned next time)
  lock.lock();
  reg.runs.erase(this);
}

std::vector<fs::path> abandon_unfinished_run_folders() noexcept {
  std::vector<fs::path> removed;
  Registry& reg = registry();
  reg.mutex.lock();  // kept: the process ends right after, and no RunFolder may act meanwhile
  try {
    for (const auto& [run, active] : reg.runs) {
      remove_tree(active.remove);
      remove_created_parents(active.innermost_parent, active.created_parent);
      if (active.unfinished) removed.push_back(active.remove);
    }
  } catch (...) {
    // out of memory while listing what was removed: the folders are removed all the same
  }
  return removed;
}

}  // namespace slipscreen::formats
