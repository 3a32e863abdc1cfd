#pragma once
// Splitting one CSV record into fields (RFC 4180 quoting: "a,b" is one field, "" inside quotes
// is a quote). Records spanning several lines are not supported: a quote left open at the end
// of the line is an error. Fields are trimmed of surrounding spaces outside quotes.
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::formats {

// Throws InputError("CSV record", line, ...) for an unclosed quote.
std::vector<std::string> split_csv_record(std::string_view line, char delimiter = ',');

}  // namespace slipscreen::formats
