#include "formats/catalog/catalog_file.hpp"

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>

#include "core/errors.hpp"
#include "formats/catalog/catalog_quakeml.hpp"

namespace slipscreen::formats {

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

CatalogFormat parse_catalog_format(const std::string& text, const std::string& field) {
  if (text == "auto") return CatalogFormat::automatic;
  if (text == "csv") return CatalogFormat::csv;
  if (text == "quakeml") return CatalogFormat::quakeml;
  throw InputError(field, text, "'auto', 'csv' or 'quakeml'");
}

}  // namespace slipscreen::formats
