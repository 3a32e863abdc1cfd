#include "outputs/run_readme.hpp"

#include <algorithm>
#include <map>
#include <stdexcept>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "formats/files/text_file.hpp"

namespace slipscreen::outputs {
namespace {

namespace fs = std::filesystem;

// `text` broken into lines of at most `width` characters at spaces.
std::string wrapped(const std::string& text, std::size_t width) {
  std::string out, line;
  std::size_t pos = 0;
  while (pos < text.size()) {
    auto end = text.find(' ', pos);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(pos, end - pos);
    if (!line.empty() && line.size() + 1 + word.size() > width) {
      out += line + "\n";
      line.clear();
    }
    line += (line.empty() ? "" : " ") + word;
    pos = end + 1;
  }
  return out + line + "\n";
}

std::vector<std::string> files_under(const fs::path& root) {
  std::vector<std::string> files;
  for (const auto& e : fs::recursive_directory_iterator(root))
    if (e.is_regular_file()) files.push_back(e.path().lexically_relative(root).generic_string());
  return files;
}

}  // namespace

std::string readme_text(const ReadmeContent& c, const std::vector<std::string>& listed) {
  std::map<std::string, std::string> what;
  for (const auto& f : c.files) what[fs::path(f.path).lexically_normal().generic_string()] = f.what;
  std::vector<std::string> paths = listed;
  std::sort(paths.begin(), paths.end());
  std::size_t width = 0;
  for (const auto& p : paths) width = std::max(width, p.size());

  std::string t = c.title + "\n" + std::string(c.title.size(), '=') + "\n";
  for (const auto& f : c.facts) t += f + "\n";
  t += "\nCAUTION\n" + wrapped(kScreeningCaution, 96) + "\nFILES\n";
  for (const auto& p : paths) {
    const auto it = what.find(p);
    if (it == what.end()) throw std::logic_error("README.txt: no description of the output '" + p + "'");
    t += p + std::string(width - p.size() + 2, ' ') + it->second + "\n";
  }
  if (c.oilfield_units)
    t += "\nTables are CSV (RFC 4180) with one header line and no comment lines. Column and JSON key names\n"
         "end in their unit (tables: _psi, _ft, _bbl, _bbl_per_d, _psi_per_ft, _mD, _m2_per_s, _deg, _days,\n"
         "_per_year, ...; JSON keys in SI: _Pa, _MPa, _m, _m3, _s, ...); dates and times are ISO 8601, UTC.\n";
  else
    t += "\nTables are CSV (RFC 4180) with one header line and no comment lines. Column and JSON key names\n"
         "end in their unit (_Pa, _MPa, _m, _m2_per_s, _m3, _s, _deg, _days, _per_year, ...); dates and\n"
         "times are ISO 8601, UTC.\n";
  return t;
}

void write_readme(const formats::RunFolder& folder, ReadmeContent content) {
  std::vector<std::string> listed = files_under(folder.staging());
  const std::string manifest = fs::path(content.manifest).lexically_normal().generic_string();
  for (const std::string& own : {std::string(kReadmeName), manifest})
    if (std::find(listed.begin(), listed.end(), own) != listed.end())
      throw InputError("output file name", own,
                       "a name of its own: " + own + " is also the name of the run's " +
                           (own == kReadmeName ? "description" : "manifest"));
  listed.push_back(kReadmeName);
  listed.push_back(manifest);
  content.files.push_back({kReadmeName, "this description"});
  content.files.push_back({manifest, kManifestDescription});
  formats::write_text_file(folder.output("README", kReadmeName), readme_text(content, listed));
}

}  // namespace slipscreen::outputs
