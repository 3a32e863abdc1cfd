#include "formats/files/earlier_run.hpp"

#include <algorithm>
#include <cstdint>
#include <fstream>
#include <set>
#include <vector>

#include <nlohmann/json.hpp>

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

constexpr const char* kManifest = "manifest.json";
// A manifest lists one entry per input and output; anything far larger is not one of ours.
constexpr std::uintmax_t kLargestManifest = 64u << 20;

// What a manifest says the run folder holds (relative paths, generic form).
struct Listing {
  std::set<std::string> files;
  std::set<std::string> folders;  // every parent folder of a listed file

  void add(const std::string& relative) {
    const fs::path p = fs::path(relative).lexically_normal();
    if (p.empty() || p.is_absolute() || p.has_root_name() || *p.begin() == ".." || !p.has_filename()) return;
    files.insert(p.generic_string());
    for (fs::path parent = p.parent_path(); !parent.empty(); parent = parent.parent_path())
      folders.insert(parent.generic_string());
  }
};

std::string quoted(const std::string& s) { return "'" + s + "'"; }

// Reads the manifest's listing into `listing`; returns why the folder is not a run when the
// manifest is missing or not one of ours.
std::optional<std::string> read_listing(const fs::path& folder, Listing& listing) {
  const fs::path path = folder / kManifest;
  std::error_code ec;
  if (!fs::is_regular_file(fs::symlink_status(path, ec))) return std::string("it has no manifest.json");
  const std::uintmax_t bytes = fs::file_size(path, ec);
  if (ec || bytes > kLargestManifest) return std::string("its manifest.json is not a slipscreen run manifest");
  std::ifstream in(path, std::ios::binary);
  const nlohmann::json j = nlohmann::json::parse(in, nullptr, /*allow_exceptions=*/false);
  if (j.is_discarded() || !j.is_object()) return std::string("its manifest.json is not a slipscreen run manifest");
  const auto tool = j.find("tool");
  const bool ours = tool != j.end() && tool->is_object() && tool->contains("name") && (*tool)["name"].is_string() &&
                    (*tool)["name"].get<std::string>() == kRunToolName;
  if (!ours) return std::string("its manifest.json was not written by slipscreen (no \"tool\": {\"name\": \"slipscreen\"})");
  listing.add(kManifest);
  const auto outputs = j.find("outputs");
  if (outputs != j.end() && outputs->is_array()) {
    for (const auto& entry : *outputs) {
      if (!entry.is_object()) continue;
      const auto p = entry.find("path");
      if (p != entry.end() && p->is_string()) listing.add(p->get<std::string>());
    }
  }
  // The report's files, listed by name without hashes (manifest.hpp, record_report_files).
  const auto report = j.find("report");
  if (report != j.end() && report->is_object()) {
    const auto files = report->find("files");
    if (files != report->end() && files->is_array())
      for (const auto& f : *files)
        if (f.is_string()) listing.add(f.get<std::string>());
  }
  return std::nullopt;
}

// An entry that is not part of a run: its path relative to the folder (a folder with a trailing
// '/'), and why when it is not simply unlisted.
struct Foreign {
  std::string entry;
  std::string note;  // e.g. "cannot be read: Permission denied"
};

// The first entry under `dir` (sorted, depth first) that `listing` does not account for.
std::optional<Foreign> first_foreign(const fs::path& root, const fs::path& dir, const Listing& listing) {
  std::error_code ec;
  std::vector<fs::path> entries;
  for (fs::directory_iterator it(dir, ec), end; !ec && it != end; it.increment(ec)) entries.push_back(it->path());
  if (ec) {
    const std::string here = dir == root ? std::string(".") : dir.lexically_relative(root).generic_string() + "/";
    return Foreign{here, "cannot be read: " + ec.message()};
  }
  std::sort(entries.begin(), entries.end());
  for (const fs::path& p : entries) {
    const std::string rel = p.lexically_relative(root).generic_string();
    const fs::file_status st = fs::symlink_status(p, ec);
    if (fs::is_regular_file(st) && listing.files.count(rel)) continue;
    if (fs::is_directory(st) && listing.folders.count(rel)) {
      if (auto inner = first_foreign(root, p, listing)) return inner;
      continue;
    }
    return Foreign{rel + (fs::is_directory(st) ? "/" : ""), ""};
  }
  return std::nullopt;
}

}  // namespace

std::optional<std::string> not_a_run(const fs::path& folder) {
  Listing listing;
  const std::optional<std::string> why = read_listing(folder, listing);
  const std::optional<Foreign> first = first_foreign(folder, folder, listing);
  if (!why && !first) return std::nullopt;
  if (first && !first->note.empty()) return "it holds " + quoted(first->entry) + ", which " + first->note;
  if (why) return *why + (first ? " (it holds " + quoted(first->entry) + ")" : std::string(" (it is empty)"));
  return "it holds " + quoted(first->entry) + ", which its manifest.json does not list";
}

}  // namespace slipscreen::formats
