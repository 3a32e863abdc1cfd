#include "formats/files/stale_runs.hpp"

#include <signal.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <optional>

#include "core/errors.hpp"
#include "formats/files/earlier_run.hpp"
#include "formats/files/path_policy.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

// The pid in "<prefix><digits>", if `name` has that form (at most 9 digits, no leading zero).
std::optional<long> pid_after(const std::string& name, const std::string& prefix) {
  if (name.size() <= prefix.size() || name.compare(0, prefix.size(), prefix) != 0) return std::nullopt;
  const std::string digits = name.substr(prefix.size());
  if (digits.size() > 9 || digits[0] == '0') return std::nullopt;
  if (!std::all_of(digits.begin(), digits.end(), [](char c) { return c >= '0' && c <= '9'; })) return std::nullopt;
  return std::stol(digits);
}

struct Leftover {
  fs::path path;
  long pid = 0;
  bool replaced = false;  // "<target>.replaced-<pid>" (else "<target>.partial-<pid>")
};

std::vector<Leftover> stale_leftovers(const fs::path& target, const std::vector<fs::path>& in_use) {
  std::vector<Leftover> found;
  const std::string name = target.filename().string();
  std::error_code ec;
  for (fs::directory_iterator it(target.parent_path(), ec), end; !ec && it != end; it.increment(ec)) {
    const std::string entry = it->path().filename().string();
    Leftover l{it->path()};
    if (auto pid = pid_after(entry, name + ".partial-")) l.pid = *pid;
    else if (auto rpid = pid_after(entry, name + ".replaced-")) l.pid = *rpid, l.replaced = true;
    else continue;
    std::error_code st_ec;
    if (!fs::is_directory(fs::symlink_status(l.path, st_ec))) continue;
    const bool ours_now = l.pid == ::getpid();
    const bool gone = ours_now ? std::find(in_use.begin(), in_use.end(), l.path) == in_use.end() : process_gone(l.pid);
    if (gone) found.push_back(l);
  }
  std::sort(found.begin(), found.end(), [](const Leftover& a, const Leftover& b) { return a.path < b.path; });
  return found;
}

std::string quoted(const fs::path& p) {
  std::string s = "'";
  s += display_name(p);
  s += "'";
  return s;
}
std::string gone_note(long pid) { return " (process " + std::to_string(pid) + " is gone)"; }

std::string remove_leftover(const Leftover& l, const std::string& what) {
  std::error_code ec;
  fs::remove_all(l.path, ec);
  if (ec) return "could not remove " + quoted(l.path) + ", " + what + gone_note(l.pid) + ": " + ec.message();
  return "removed " + quoted(l.path) + ", " + what + gone_note(l.pid);
}

std::string handle_replaced(const fs::path& target, const Leftover& l) {
  std::error_code ec;
  if (!fs::exists(fs::symlink_status(target, ec))) {
    fs::rename(l.path, target, ec);
    if (ec)
      throw IoError("cannot put back the earlier run " + quoted(l.path) + " as " + quoted(target) +
                    " (a forced replace by process " + std::to_string(l.pid) + " was cut short): " + ec.message() +
                    "; rename it back by hand");
    return "put back the earlier run " + quoted(target) + " from " + quoted(l.path) +
           ": a forced replace was cut short between its two renames" + gone_note(l.pid);
  }
  if (const auto why = not_a_run(target))
    return "left " + quoted(l.path) + " alone: it may hold an earlier run, and " + quoted(target) +
           " is not a complete slipscreen run (" + *why + ")";
  return remove_leftover(l, "an earlier run already replaced by " + quoted(target));
}

}  // namespace

bool process_gone(long pid) { return pid > 0 && ::kill(static_cast<pid_t>(pid), 0) == -1 && errno == ESRCH; }

std::vector<std::string> clean_stale_runs(const fs::path& target, const std::vector<fs::path>& in_use) {
  std::vector<std::string> notes;
  const std::vector<Leftover> leftovers = stale_leftovers(target, in_use);
  // Put an earlier run back before anything else is removed.
  for (const Leftover& l : leftovers)
    if (l.replaced) notes.push_back(handle_replaced(target, l));
  for (const Leftover& l : leftovers)
    if (!l.replaced) notes.push_back(remove_leftover(l, "left by a run that did not finish"));
  return notes;
}

}  // namespace slipscreen::formats
