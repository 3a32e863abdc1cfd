#pragma once
// Reading an earthquake catalog file (CSV, the FDSN event service's text format, or QuakeML 1.2). Records that
// cannot be used are collected with their line numbers and reasons; with `strict` they are an
// error instead. Nothing is dropped silently.
#include <cstddef>
#include <string>
#include <vector>

#include "core/seismo/catalog.hpp"
#include "formats/catalog/catalog_csv.hpp"
#include "formats/catalog/catalog_records.hpp"

namespace slipscreen::formats {

enum class CatalogFormat { automatic, csv, quakeml };

// "auto", "csv" or "quakeml" as written in a scenario or on the command line. Throws InputError
// naming `field` for anything else.
CatalogFormat parse_catalog_format(const std::string& text, const std::string& field);

// Chooses the reader by `format`, or for `automatic` by extension (.csv/.txt -> CSV,
// .xml/.qml/.quakeml -> QuakeML) and otherwise by the first character ('<' -> QuakeML).
// A table ("csv") whose first line is the FDSN text header (catalog_fdsn_text.hpp) is read as
// FDSN text; a column mapping given for it is an InputError (the format fixes its columns).
// Throws IoError if the file cannot be read; InputError for a bad header, and in strict mode
// for the first unusable record (naming the file, line and the total count).
CatalogReadResult read_catalog(const std::string& path, CatalogFormat format, const CatalogColumns& columns,
                               bool strict);


}  // namespace slipscreen::formats
