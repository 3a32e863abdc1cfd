#pragma once
// Checking text read from files before it goes anywhere else: valid UTF-8 (RFC 3629) and no
// control characters. Every reader of user text (CSV cells, attribute values from GDAL) calls
// text_problem() where it reads, so a bad byte is reported with its file and line, never later
// by a writer (a JSON writer refuses invalid UTF-8).
//
// Valid UTF-8 here is RFC 3629, section 4: no overlong forms, no surrogates (U+D800..U+DFFF),
// nothing above U+10FFFF. Control characters are the C0 set U+0000..U+001F and U+007F (DEL)
// except tab, line feed and carriage return; a NUL byte in a text file most often means the
// file is damaged or is not text at all.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace slipscreen::util {

// Byte offset of the first byte that does not start a valid UTF-8 sequence; nothing if valid.
std::optional<std::size_t> first_invalid_utf8(std::string_view text);

// What is wrong with `text` in words, e.g. "byte 0xE9 at position 3 is not UTF-8" or "a NUL byte
// (0x00) at position 3"; nothing when the text is valid UTF-8 without control characters
// (tab, line feed and carriage return are allowed). Positions count bytes from 1.
std::optional<std::string> text_problem(std::string_view text);

// The text as it can be shown in a message: invalid UTF-8 bytes and control characters are
// written as \xNN (tab as \t), everything else as it is.
std::string printable(std::string_view text);

}  // namespace slipscreen::util
