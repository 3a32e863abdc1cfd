#include "core/util/utf8.hpp"

#include <cstdio>

namespace slipscreen::util {

namespace {

// Length of the valid UTF-8 sequence starting at text[i], or 0 when none starts there
// (RFC 3629, section 4, the table of well-formed byte sequences).
std::size_t sequence_length(std::string_view text, std::size_t i) {
  const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char b0 = byte(i);
  if (b0 < 0x80) return 1;
  std::size_t n = 0;
  unsigned char lo = 0x80, hi = 0xBF;  // range of the second byte
  if (b0 >= 0xC2 && b0 <= 0xDF) n = 2;
  else if (b0 == 0xE0) n = 3, lo = 0xA0;
  else if (b0 == 0xED) n = 3, hi = 0x9F;  // no surrogates
  else if (b0 >= 0xE1 && b0 <= 0xEF) n = 3;
  else if (b0 == 0xF0) n = 4, lo = 0x90;
  else if (b0 == 0xF4) n = 4, hi = 0x8F;  // nothing above U+10FFFF
  else if (b0 >= 0xF1 && b0 <= 0xF3) n = 4;
  else return 0;
  if (i + n > text.size()) return 0;
  if (byte(i + 1) < lo || byte(i + 1) > hi) return 0;
  for (std::size_t k = 2; k < n; ++k)
    if (byte(i + k) < 0x80 || byte(i + k) > 0xBF) return 0;
  return n;
}

bool is_control(unsigned char c) { return (c < 0x20 && c != '\t' && c != '\n' && c != '\r') || c == 0x7F; }

std::string hex_byte(unsigned char c) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "0x%02X", static_cast<unsigned>(c));
  return buf;
}

}  // namespace

std::optional<std::size_t> first_invalid_utf8(std::string_view text) {
  for (std::size_t i = 0; i < text.size();) {
    const std::size_t n = sequence_length(text, i);
    if (n == 0) return i;
    i += n;
  }
  return std::nullopt;
}

std::optional<std::string> text_problem(std::string_view text) {
  for (std::size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    if (c >= 0x20 && c < 0x7f) {  // printable ASCII: the common case, no text built
      ++i;
      continue;
    }
    const auto at = [&] { return " at position " + std::to_string(i + 1); };
    if (c == 0) return "a NUL byte (0x00)" + at();
    if (is_control(c)) return "a control character (" + hex_byte(c) + ")" + at();
    const std::size_t n = sequence_length(text, i);
    if (n == 0) return "byte " + hex_byte(c) + at() + " is not UTF-8";
    i += n;
  }
  return std::nullopt;
}

std::string printable(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (std::size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    const std::size_t n = is_control(c) ? 0 : sequence_length(text, i);
    if (c == '\t') {
      out += "\\t";
      ++i;
    } else if (n == 0) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\x%02X", static_cast<unsigned>(c));
      out += buf;
      ++i;
    } else {
      out.append(text.substr(i, n));
      i += n;
    }
  }
  return out;
}

}  // namespace slipscreen::util
