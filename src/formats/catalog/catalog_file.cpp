#include "formats/catalog/catalog_file.hpp"

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>

#include "core/errors.hpp"
#include "formats/files/input_file.hpp"
#include "core/util/trim.hpp"
#include "formats/catalog/catalog_fdsn_text.hpp"
#include "formats/catalog/catalog_quakeml.hpp"

namespace slipscreen::formats {
namespace {

// The first non-blank line of the file (without a UTF-8 byte-order mark).
std::string first_line(const std::string& path) {
  if (auto problem = input_file_problem(path)) throw IoError("cannot read catalog file '" + path + "': " + *problem);
  std::ifstream in(path);
  if (!in) throw IoError("cannot read catalog file '" + path + "'");
  std::string line;
  bool first = true;
  while (std::getline(in, line)) {
    if (first && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);
    first = false;
    if (!util::trim(line).empty()) return line;
  }
  return "";
}

CatalogFormat by_extension_or_content(const std::string& path, const std::string& line) {
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (ext == ".csv" || ext == ".txt") return CatalogFormat::csv;
  if (ext == ".xml" || ext == ".qml" || ext == ".quakeml") return CatalogFormat::quakeml;
  const std::string t = util::trim(line);
  return !t.empty() && t[0] == '<' ? CatalogFormat::quakeml : CatalogFormat::csv;
}

// A mapping names CSV columns; the FDSN text format fixes its own.
void refuse_mapping(const CatalogColumns& columns, const std::string& path) {
  if (columns.text.empty()) return;
  throw InputError("column mapping", columns.text,
                   "no mapping for a catalog in the FDSN text format (its header fixes the columns): leave out "
                   "--columns (in a scenario: [catalog] columns)")
      .located(path);
}

}  // namespace

CatalogReadResult read_catalog(const std::string& path, CatalogFormat format, const CatalogColumns& columns,
                               bool strict) {
  CatalogReadResult r;
  if (format == CatalogFormat::quakeml) {
    r = read_catalog_quakeml(path);
  } else {
    const std::string line = first_line(path);
    if (format == CatalogFormat::automatic) format = by_extension_or_content(path, line);
    if (format == CatalogFormat::quakeml) {
      r = read_catalog_quakeml(path);
    } else if (is_fdsn_text_header(line)) {
      refuse_mapping(columns, path);
      r = read_catalog_fdsn_text(path);
    } else {
      r = read_catalog_csv(path, columns);
    }
  }
  throw_if_strict(r, strict);
  return r;
}

CatalogFormat parse_catalog_format(const std::string& text, const std::string& field) {
  if (text == "auto") return CatalogFormat::automatic;
  if (text == "csv") return CatalogFormat::csv;
  if (text == "quakeml") return CatalogFormat::quakeml;
  throw InputError(field, text, "'auto', 'csv' or 'quakeml'");
}

}  // namespace slipscreen::formats
