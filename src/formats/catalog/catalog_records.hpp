#pragma once
// What reading an earthquake catalog gives, whatever its format: the events, and the records
// that could not be used with their line numbers and reasons (nothing is dropped silently).
#include <cstddef>
#include <string>
#include <vector>

#include "core/seismo/catalog.hpp"

namespace slipscreen::formats {

struct RejectedRecord {
  std::size_t line = 0;   // 1-based line in the file
  std::string reason;     // e.g. "field 'time' = '2024-13-01': expected an ISO 8601 UTC time ..."
};

struct CatalogReadResult {
  seismo::Catalog catalog;
  std::vector<RejectedRecord> rejected;
  std::vector<std::string> warnings;  // e.g. preferred origin not found, first one used
  std::size_t records = 0;            // data records (CSV rows / QuakeML events) seen
  std::string path;
  std::string format;                 // "csv", "fdsn_text" or "quakeml"
  std::string columns;                // table formats: the columns read, as a mapping text (CatalogTableLayout::columns_used)
};

// Throws the strict-mode error for a result that has rejected records (used by both readers).
void throw_if_strict(const CatalogReadResult& result, bool strict);

}  // namespace slipscreen::formats
