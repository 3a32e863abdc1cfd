#pragma once
// A small RFC 4180 CSV reader that keeps line numbers for error messages.
//
// Accepted: comma separators, double-quoted fields with "" as an escaped quote, quoted fields
// spanning lines, LF or CRLF line ends, a UTF-8 byte-order mark. Extensions: lines starting
// with '#' (outside quotes, at the start of a record) are comments, kept in `comments` so that
// a file can state metadata such as "# crs: EPSG:32614"; blank lines are skipped.
// The first record is the header. Every row must have as many fields as the header.
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/units/units.hpp"

namespace slipscreen::formats {

struct CsvRow {
  std::size_t line = 0;  // 1-based line where the record starts
  std::vector<std::string> fields;
};

struct CsvTable {
  std::string file;  // name used in messages
  std::vector<std::string> header;
  std::size_t header_line = 0;
  std::vector<CsvRow> rows;
  std::vector<std::string> comments;  // comment text after '#', trimmed

  // Index of a header column, compared after trimming and ignoring ASCII case; nothing if absent.
  std::optional<std::size_t> column(std::string_view name) const;
  // "wells.csv line 4, column 3 ('top')" for messages.
  std::string where(const CsvRow& row, std::size_t col) const;
  std::string where(const CsvRow& row) const;
  // Value of a "key: value" or "key = value" comment (key compared ignoring case).
  std::optional<std::string> comment_value(std::string_view key) const;
};

// Parses CSV text. Throws InputError naming the file and line for an unterminated quote, text
// after a closing quote, a missing header, an empty or repeated header name, or a row with the
// wrong number of fields.
CsvTable parse_csv(std::string_view text, const std::string& file);

// Reads and parses a file. Throws IoError when it cannot be read.
CsvTable read_csv(const std::filesystem::path& path, const std::string& file);

// Splits a header cell "top [ft]" or "top (ft)" into name "top" and unit "ft"; unit empty if none.
struct HeaderName {
  std::string name;
  std::string unit;
};
HeaderName split_header_unit(std::string_view cell);

// A value with a unit from a CSV cell: the unit in the cell ("2300 m") or in the column header
// ("top [m]"). Throws InputError located at the cell.
double cell_quantity(const CsvTable& table, const CsvRow& row, std::size_t col, units::Dimension d);

// A CSV field for writing, quoted (RFC 4180) when it holds a comma, quote or line break.
std::string csv_field(const std::string& s);

}  // namespace slipscreen::formats
