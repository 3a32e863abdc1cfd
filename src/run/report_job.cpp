#include "run/report_job.hpp"

#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <chrono>
#include <csignal>
#include <fstream>

#include "core/errors.hpp"
#include "formats/files/earlier_run.hpp"
#include "formats/files/manifest.hpp"
#include "outputs/report/report.hpp"

namespace slipscreen::run {
namespace fs = std::filesystem;

namespace {

constexpr const char* kStagingPrefix = ".report-staging-";

outputs::report::ReportSource read_source(const fs::path& folder, const std::string& manifest_name,
                                          const ReportJobOptions& o) {
  outputs::report::ReportSource src;
  src.folder = folder;
  src.top_segments = o.top;
  const fs::path path = folder / manifest_name;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(path.string() + ": cannot read the run's manifest");
  src.manifest = nlohmann::json::parse(in, nullptr, /*allow_exceptions=*/false);
  if (src.manifest.is_discarded() || !src.manifest.is_object())
    throw InputError("manifest", path.string(), "the run's manifest.json (a JSON object)");
  std::string maps = o.maps;
  if (maps.empty())
    maps = src.manifest.value("parameters", nlohmann::json::object())
               .value("scenario", nlohmann::json::object())
               .value("output", nlohmann::json::object())
               .value("report_maps", std::string("last"));
  if (maps != "last" && maps != "each") throw InputError("report_maps", maps, "\"last\" or \"each\"", path.string());
  src.maps_each = maps == "each";
  return src;
}

outputs::report::ReportOptions report_options(const outputs::report::ReportSource& src, const ReportJobOptions& o) {
  outputs::report::ReportOptions r;
  r.page = o.page;
  if (r.page.empty()) {
    const auto& out = src.manifest.value("parameters", nlohmann::json::object())
                          .value("scenario", nlohmann::json::object())
                          .value("output", nlohmann::json::object());
    r.page = out.value("page", std::string("A4"));
  }
  if (!o.reproducible) r.built_utc = formats::utc_iso_time(std::chrono::system_clock::now());
  return r;
}

// Removes staging subfolders of report builds whose process is gone (a killed `slipscreen report`).
void clean_stale_staging(const fs::path& folder) {
  std::error_code ec;
  for (fs::directory_iterator it(folder, ec), end; !ec && it != end; it.increment(ec)) {
    const std::string name = it->path().filename().string();
    if (name.rfind(kStagingPrefix, 0) != 0) continue;
    const std::string pid_text = name.substr(std::char_traits<char>::length(kStagingPrefix));
    if (pid_text.empty() || !std::all_of(pid_text.begin(), pid_text.end(), ::isdigit)) continue;
    const long pid = std::stol(pid_text);
    if (pid == static_cast<long>(::getpid()) || (::kill(static_cast<pid_t>(pid), 0) == 0 || errno != ESRCH)) continue;
    std::error_code rm;
    fs::remove_all(it->path(), rm);
  }
}

// Only what a report writes is ever removed as an old report file.
bool is_report_file(const std::string& f) {
  if (f == "report.html" || f == "report.pdf") return true;
  const fs::path p(f);
  return p.parent_path() == "figures" && p.filename() != ".." && p.filename() != ".";
}

// Removes the staging subfolder when the build ends, finished or not.
struct StagingGuard {
  fs::path path;
  ~StagingGuard() {
    std::error_code ec;
    if (!path.empty()) fs::remove_all(path, ec);
  }
};

}  // namespace

ReportJobResult write_report_into(const fs::path& folder, const ReportJobOptions& o, const std::string& manifest_name) {
  const auto src = read_source(folder, manifest_name, o);
  ReportJobResult r{folder, outputs::report::write_report(src, report_options(src, o),
                                                          outputs::report::report_figure_builders(), folder)};
  formats::record_report_files(folder / manifest_name, r.files);
  return r;
}

ReportJobResult rebuild_report(const fs::path& folder, const ReportJobOptions& o) {
  std::error_code ec;
  if (!fs::is_directory(folder, ec))
    throw RefusedError(folder.string() + ": not a run folder of slipscreen: no such folder");
  clean_stale_staging(folder);
  if (const auto why = formats::not_a_run(folder))
    throw RefusedError(folder.string() + ": not a run folder of slipscreen: " + *why);
  const auto src = read_source(folder, "manifest.json", o);
  const std::vector<std::string> old_files = formats::report_files(src.manifest);

  StagingGuard staging{folder / (kStagingPrefix + std::to_string(::getpid()))};
  fs::remove_all(staging.path, ec);
  fs::create_directory(staging.path, ec);
  if (ec) throw IoError(staging.path.string() + ": cannot create the report's staging folder: " + ec.message());
  ReportJobResult r{folder, outputs::report::write_report(src, report_options(src, o),
                                                          outputs::report::report_figure_builders(), staging.path)};
  // Every file is complete: list old and new while moving, then the new ones only.
  std::vector<std::string> both = old_files;
  both.insert(both.end(), r.files.begin(), r.files.end());
  formats::record_report_files(folder / "manifest.json", both);
  for (const auto& f : r.files) {
    const fs::path to = folder / f;
    fs::create_directories(to.parent_path(), ec);
    fs::rename(staging.path / f, to, ec);
    if (ec) throw IoError(to.string() + ": cannot move the report file into place: " + ec.message());
  }
  for (const auto& f : old_files)
    if (!std::binary_search(r.files.begin(), r.files.end(), f) && is_report_file(f)) fs::remove(folder / f, ec);
  formats::record_report_files(folder / "manifest.json", r.files);
  return r;
}

}  // namespace slipscreen::run
