#pragma once
// The text format of the FDSN event web service ("format=text"): one header line starting with
// '#', cells separated by '|', no quoting, e.g.
//   #EventID|Time|Latitude|Longitude|Depth/km|Author|Catalog|Contributor|ContributorID|MagType|Magnitude|MagAuthor|EventLocationName
// Time is ISO 8601 (UTC when no zone is given), latitude and longitude in degrees (WGS 84),
// depth in km. Columns are found by these names in any case, with spaces around the cells
// ignored; columns after the listed ones (e.g. EventType) are allowed. (docs/catalogs.md)
#include <string>
#include <string_view>

#include "formats/catalog/catalog_records.hpp"

namespace slipscreen::formats {

// True for a header line of this format: '#', then "EventID" as the first '|'-separated cell.
bool is_fdsn_text_header(std::string_view line);

// Reads the file. Blank lines are skipped; a '#' line after the header is a comment. Rows that
// cannot be used are collected with their line numbers and reasons. Throws IoError if the file
// cannot be read; InputError when the first line is not such a header or lacks a needed column.
CatalogReadResult read_catalog_fdsn_text(const std::string& path);

}  // namespace slipscreen::formats
