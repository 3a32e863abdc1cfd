#pragma once
// Reading an earthquake catalog file (CSV with a column mapping, or QuakeML 1.2). Records that
// cannot be used are collected with their line numbers and reasons; with `strict` they are an
// error instead. Nothing is dropped silently.
#include <cstddef>
#include <string>
#include <vector>

#include "core/seismo/catalog.hpp"
#include "io/catalog_csv.hpp"

namespace slipscreen::io {

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
  std::string format;                 // "csv" or "quakeml"
};

enum class CatalogFormat { automatic, csv, quakeml };

// Chooses the reader by `format`, or for `automatic` by extension (.csv/.txt -> CSV,
// .xml/.qml/.quakeml -> QuakeML) and otherwise by the first character ('<' -> QuakeML).
// Throws IoError if the file cannot be read; InputError for a bad header, and in strict mode
// for the first unusable record (naming the file, line and the total count).
CatalogReadResult read_catalog(const std::string& path, CatalogFormat format, const CatalogColumns& columns,
                               bool strict);

// Throws the strict-mode error for a result that has rejected records (used by both readers).
void throw_if_strict(const CatalogReadResult& result, bool strict);

}  // namespace slipscreen::io
