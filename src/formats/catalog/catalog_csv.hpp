#pragma once
// Catalog CSV: a header line naming the columns, one event per row. Which column holds what is
// found by the common header spellings or named by a column mapping (catalog_columns.hpp,
// docs/catalogs.md).
#include <string>

#include "formats/catalog/catalog_columns.hpp"
#include "formats/catalog/catalog_records.hpp"

namespace slipscreen::formats {

// Reads a CSV catalog. Lines starting with '#' are comments (their text, without '#', forms the
// catalog description); the first other non-empty line is the header. Throws IoError if the
// file cannot be read, InputError for a header without the columns needed.
CatalogReadResult read_catalog_csv(const std::string& path, const CatalogColumns& columns);

}  // namespace slipscreen::formats
