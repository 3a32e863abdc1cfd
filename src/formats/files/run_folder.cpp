#include "formats/files/run_folder.hpp"

#include <unistd.h>

#include <string>
#include <system_error>

#include "core/errors.hpp"
#include "formats/files/path_policy.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

fs::path sibling(const fs::path& target, const std::string& suffix) {
  return target.parent_path() / (target.filename().string() + suffix + "-" + std::to_string(::getpid()));
}

void refuse_existing(const fs::path& target, bool force) {
  std::error_code ec;
  const auto st = fs::symlink_status(target, ec);
  if (!fs::exists(st)) return;
  if (!fs::is_directory(st))
    throw RefusedError(target.string() + ": exists and is not a run folder; choose another output folder");
  if (!force)
    throw RefusedError(target.string() +
                       ": a run folder already exists here; it is never overwritten unless forced "
                       "(--force), or choose another output folder");
}

}  // namespace

RunFolder::RunFolder(fs::path target, RunFolderOptions options) : options_(options) {
  if (target.empty()) throw RefusedError("run folder: empty path");
  target_ = fs::absolute(target).lexically_normal();
  if (!target_.has_filename()) target_ = target_.parent_path();  // "out/" -> "out"
  refuse_existing(target_, options_.force);
  staging_ = sibling(target_, ".partial");
  std::error_code ec;
  fs::remove_all(staging_, ec);  // left over by a killed process that had our pid
  for (fs::path p = target_.parent_path(); !p.empty() && !fs::exists(p, ec); p = p.parent_path()) {
    created_parent_ = p;
    if (p == p.parent_path()) break;
  }
  fs::create_directories(staging_, ec);
  if (ec) throw IoError(staging_.string() + ": cannot create the run's staging folder: " + ec.message());
}

RunFolder::~RunFolder() {
  if (committed_) return;
  std::error_code ec;
  fs::remove_all(staging_, ec);  // best effort; a destructor must not throw
  if (created_parent_.empty()) return;
  // Remove the parent folders this run created, innermost first, while they are empty.
  for (fs::path p = target_.parent_path();; p = p.parent_path()) {
    if (!fs::remove(p, ec) || p == created_parent_) break;
  }
}

fs::path RunFolder::output(std::string_view key, std::string_view relative) const {
  const fs::path rel = safe_relative_output(key, relative);
  const fs::path full = staging_ / rel;
  std::error_code ec;
  fs::create_directories(full.parent_path(), ec);
  if (ec) throw IoError(full.parent_path().string() + ": cannot create the folder: " + ec.message());
  return full;
}

void RunFolder::commit() {
  if (committed_) throw IoError(target_.string() + ": run folder already committed");
  refuse_existing(target_, options_.force);
  std::error_code ec;
  const bool replacing = fs::exists(fs::symlink_status(target_, ec));
  if (!replacing) {
    fs::rename(staging_, target_, ec);
    if (ec) throw IoError(target_.string() + ": cannot move the finished run into place: " + ec.message());
    committed_ = true;
    return;
  }
  const fs::path aside = sibling(target_, ".replaced");
  fs::remove_all(aside, ec);
  fs::rename(target_, aside, ec);
  if (ec) throw IoError(target_.string() + ": cannot move the earlier run aside: " + ec.message());
  fs::rename(staging_, target_, ec);
  if (ec) {
    std::error_code restore;
    fs::rename(aside, target_, restore);
    throw IoError(target_.string() + ": cannot move the finished run into place (the earlier run is kept): " +
                  ec.message());
  }
  committed_ = true;
  fs::remove_all(aside, ec);  // the new run is in place; failing to delete the old copy is harmless
}

}  // namespace slipscreen::formats
