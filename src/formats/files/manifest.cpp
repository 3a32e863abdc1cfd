#include "formats/files/manifest.hpp"

#include <algorithm>
#include <ctime>
#include <fstream>
#include <map>
#include <string_view>
#include <tuple>

#include "core/errors.hpp"
#include "formats/files/build_info.hpp"
#include "formats/files/file_hash.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv_fields.hpp"

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

// A CSV output's header names and its count of data records (RFC 4180: a line feed inside
// quotes does not end a record).
void add_table_shape(nlohmann::json& entry, const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(path.string() + ": cannot read the table to record it in the manifest");
  std::string header;
  std::getline(in, header);
  if (!header.empty() && header.back() == '\r') header.pop_back();
  std::uint64_t records = 0;
  bool quoted = false, open_record = false;
  char c = 0;
  while (in.get(c)) {
    if (c == '"') quoted = !quoted;
    if (c == '\n' && !quoted) {
      ++records;
      open_record = false;
    } else {
      open_record = true;
    }
  }
  if (in.bad()) throw IoError(path.string() + ": cannot read the table to record it in the manifest");
  entry["columns"] = header.empty() ? std::vector<std::string>{} : split_csv_record(header);
  entry["rows"] = records + (open_record ? 1 : 0);
}

// The text standing in for streamed array i until it is written (a control character keeps it
// apart from any text of the parameters; write_manifest also checks that it occurs once).
std::string streamed_placeholder(std::size_t i) { return "\x01streamed array " + std::to_string(i) + "\x01"; }

// The manifest with each streamed array's place holding its placeholder string.
nlohmann::json manifest_skeleton(const ManifestContent& c, std::chrono::system_clock::time_point now,
                                 const std::optional<fs::path>& outputs_root) {
  if (c.caution.empty()) throw InputError("caution", "", "the screening caution text for the manifest");
  if (!c.parameters.is_object())
    throw InputError("parameters", c.parameters.type_name(), "a JSON object of resolved parameters");
  nlohmann::json j = nlohmann::json::object();
  if (!c.screens.is_object())
    throw InputError("screens", c.screens.type_name(), "a JSON object naming each screen with true or false");
  j["tool"] = build_json();
  j["tool"]["name"] = "slipscreen";
  if (!c.screens.empty()) j["screens"] = c.screens;
  j["caution"] = c.caution;
  j["command_line"] = c.command_line;
  j["parameters"] = c.parameters;
  for (std::size_t i = 0; i < c.streamed.size(); ++i) {
    const auto& at = c.streamed[i].at;
    const std::string shown = at.to_string();
    if (at.empty() || !j["parameters"].contains(at.parent_pointer()) || !j["parameters"][at.parent_pointer()].is_object())
      throw InputError("streamed parameters", shown, "a place in an object of the parameters");
    if (j["parameters"].contains(at)) throw InputError("streamed parameters", shown, "a place not already taken");
    j["parameters"][at] = streamed_placeholder(i);
  }
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
    for (const auto& [rel, full] : files) {
      nlohmann::json e = file_entry(full, rel);
      if (full.extension() == ".csv") add_table_shape(e, full);
      j["outputs"].push_back(std::move(e));
    }
  }
  return j;
}

}  // namespace

nlohmann::json manifest_json(const ManifestContent& c, std::chrono::system_clock::time_point now,
                             const std::optional<fs::path>& outputs_root) {
  nlohmann::json j = manifest_skeleton(c, now, outputs_root);
  for (const auto& a : c.streamed) {
    nlohmann::json items = nlohmann::json::array();
    for (std::size_t k = 0; k < a.count; ++k) items.push_back(a.item(k));
    j["parameters"][a.at] = std::move(items);
  }
  return j;
}

std::vector<std::string> report_files(const nlohmann::json& manifest) {
  std::vector<std::string> out;
  const auto r = manifest.find("report");
  if (r == manifest.end() || !r->is_object()) return out;
  const auto f = r->find("files");
  if (f == r->end() || !f->is_array()) return out;
  for (const auto& e : *f)
    if (e.is_string()) out.push_back(e.get<std::string>());
  return out;
}

void record_report_files(const fs::path& path, std::vector<std::string> files) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(path.string() + ": cannot read the manifest to record the report");
  nlohmann::json j = nlohmann::json::parse(in, nullptr, /*allow_exceptions=*/false);
  if (in.bad()) throw IoError(path.string() + ": cannot read the manifest to record the report");
  if (j.is_discarded() || !j.is_object()) throw InputError("manifest", path.string(), "a JSON object (a slipscreen run manifest)");
  std::sort(files.begin(), files.end());
  files.erase(std::unique(files.begin(), files.end()), files.end());
  if (files.empty()) {
    j.erase("report");
  } else {
    j["report"] = {{"written_by", kReportWrittenBy},
                   {"files", files},
                   {"note", "built from this folder's files after this manifest; listed by name without hashes "
                            "because the report shows this manifest's inputs and their hashes"}};
  }
  const fs::path temporary = path.parent_path() / (path.filename().string() + ".writing");
  write_text_file(temporary, j.dump(2) + "\n");
  std::error_code ec;
  fs::rename(temporary, path, ec);
  if (ec) {
    std::error_code ignored;
    fs::remove(temporary, ignored);
    throw IoError(path.string() + ": cannot replace the manifest: " + ec.message());
  }
}

void write_manifest(const fs::path& path, const ManifestContent& content, const std::optional<fs::path>& outputs_root) {
  const std::string text = manifest_skeleton(content, std::chrono::system_clock::now(), outputs_root).dump(2) + "\n";
  // Each placeholder, as dump() quotes it, by its place in the text: (offset, array, length).
  std::vector<std::tuple<std::size_t, std::size_t, std::size_t>> places;
  for (std::size_t i = 0; i < content.streamed.size(); ++i) {
    const std::string quoted = nlohmann::json(streamed_placeholder(i)).dump();
    const std::size_t at = text.find(quoted);
    if (at == std::string::npos || text.find(quoted, at + 1) != std::string::npos)
      throw InputError("streamed parameters", content.streamed[i].at.to_string(), "one place in the manifest's text");
    places.emplace_back(at, i, quoted.size());
  }
  std::sort(places.begin(), places.end());
  TextFileWriter out(path);
  std::size_t done = 0;
  for (const auto& [at, i, length] : places) {
    out.write(std::string_view(text).substr(done, at - done));
    const auto& a = content.streamed[i];
    // dump(2)'s layout of a non-empty array whose key's line is indented by `indent` spaces: "[",
    // each element on its own lines indented two more, "," between, and "]" at `indent`.
    const std::size_t line = text.rfind('\n', at) + 1;  // npos + 1 = 0 on the first line
    const std::size_t indent = text.find_first_not_of(' ', line) - line;
    std::string inner(indent + 3, ' ');  // a line feed and the elements' indentation
    inner.front() = '\n';
    if (a.count == 0) out.write("[]");
    for (std::size_t k = 0; k < a.count; ++k) {
      std::string item = a.item(k).dump(2);
      for (std::size_t n = item.find('\n'); n != std::string::npos; n = item.find('\n', n + inner.size()))
        item.replace(n, 1, inner);
      out.write(k == 0 ? "[" : ",");
      out.write(inner);
      out.write(item);
    }
    if (a.count > 0) {
      out.write(std::string_view(inner).substr(0, indent + 1));
      out.write("]");
    }
    done = at + length;
  }
  out.write(std::string_view(text).substr(done));
  out.close();
}

}  // namespace slipscreen::formats
