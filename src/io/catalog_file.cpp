#include "io/catalog_file.hpp"

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>

#include "core/errors.hpp"
#include "io/catalog_quakeml.hpp"

namespace slipscreen::io {

void throw_if_strict(const CatalogReadResult& r, bool strict) {
  if (!strict || r.rejected.empty()) return;
  const auto& first = r.rejected.front();
  throw InputError("record", "unusable",
                   "every record usable in strict mode; " + std::to_string(r.rejected.size()) +
                       " unusable record(s), the first: " + first.reason)
      .located(r.path + " line " + std::to_string(first.line));
}

CatalogReadResult read_catalog(const std::string& path, CatalogFormat format, const CatalogColumns& columns,
                               bool strict) {
  if (format == CatalogFormat::automatic) {
    std::string ext = std::filesystem::path(path).extension().string();
    std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    if (ext == ".csv" || ext == ".txt") format = CatalogFormat::csv;
    else if (ext == ".xml" || ext == ".qml" || ext == ".quakeml") format = CatalogFormat::quakeml;
    else {
      std::ifstream in(path);
      if (!in) throw IoError("cannot read catalog file '" + path + "'");
      char c = 0;
      while (in.get(c) && std::isspace(static_cast<unsigned char>(c))) {
      }
      format = c == '<' ? CatalogFormat::quakeml : CatalogFormat::csv;
    }
  }
  auto r = format == CatalogFormat::csv ? read_catalog_csv(path, columns) : read_catalog_quakeml(path);
  throw_if_strict(r, strict);
  return r;
}

}  // namespace slipscreen::io
