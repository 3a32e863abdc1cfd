#include "formats/files/manifest.hpp"

#include <ctime>
#include <map>

#include "core/errors.hpp"
#include "formats/files/file_hash.hpp"
#include "formats/files/text_file.hpp"
#include "slipscreen/version.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

std::string utc_iso_time(std::chrono::system_clock::time_point t) {
  const std::time_t tt = std::chrono::system_clock::to_time_t(t);
  std::tm tm{};
  gmtime_r(&tt, &tm);
  char buf[32];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buf;
}

namespace {

nlohmann::json file_entry(const fs::path& path, const std::string& shown) {
  std::error_code ec;
  const auto bytes = fs::file_size(path, ec);
  if (ec) throw IoError(path.string() + ": cannot read the file to record it in the manifest: " + ec.message());
  return {{"path", shown}, {"bytes", static_cast<std::uint64_t>(bytes)}, {"sha256", sha256_file(path)}};
}

}  // namespace

nlohmann::json manifest_json(const ManifestContent& c, std::chrono::system_clock::time_point now,
                             const std::optional<fs::path>& outputs_root) {
  if (c.caution.empty()) throw InputError("caution", "", "the screening caution text for the manifest");
  if (!c.parameters.is_object())
    throw InputError("parameters", c.parameters.type_name(), "a JSON object of resolved parameters");
  nlohmann::json j = nlohmann::json::object();
  j["tool"] = {{"name", "slipscreen"}, {"version", kVersion}};
  j["caution"] = c.caution;
  j["command_line"] = c.command_line;
  j["parameters"] = c.parameters;
  if (c.seed) j["seed"] = *c.seed;
  if (c.include_timestamp) j["created_utc"] = utc_iso_time(now);
  j["inputs"] = nlohmann::json::array();
  for (const auto& in : c.inputs) {
    nlohmann::json e = file_entry(in.path, in.shown.empty() ? in.path.generic_string() : in.shown);
    e["role"] = in.role;
    j["inputs"].push_back(std::move(e));
  }
  if (outputs_root) {
    std::map<std::string, fs::path> files;  // sorted by relative path
    for (const auto& entry : fs::recursive_directory_iterator(*outputs_root)) {
      if (!entry.is_regular_file()) continue;
      const std::string rel = fs::relative(entry.path(), *outputs_root).generic_string();
      if (rel == "manifest.json") continue;
      files.emplace(rel, entry.path());
    }
    j["outputs"] = nlohmann::json::array();
    for (const auto& [rel, full] : files) j["outputs"].push_back(file_entry(full, rel));
  }
  return j;
}

void write_manifest(const fs::path& path, const ManifestContent& content, const std::optional<fs::path>& outputs_root) {
  const std::string text = manifest_json(content, std::chrono::system_clock::now(), outputs_root).dump(2) + "\n";
  write_text_file(path, text);
}

}  // namespace slipscreen::formats
