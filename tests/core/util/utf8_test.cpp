// UTF-8 validity per RFC 3629, section 4 (the table of well-formed byte sequences); the byte
// sequences below are the standard's own boundary cases.
#include "core/util/utf8.hpp"

#include <doctest/doctest.h>

#include <string>

using slipscreen::util::first_invalid_utf8;
using slipscreen::util::printable;
using slipscreen::util::text_problem;

TEST_CASE("valid UTF-8 passes: ASCII, two-, three- and four-byte forms at their limits") {
  CHECK(!first_invalid_utf8(""));
  CHECK(!first_invalid_utf8("MW-01"));
  CHECK(!first_invalid_utf8("Pe\xC3\xB1" "a"));            // U+00F1
  CHECK(!first_invalid_utf8("\xE2\x88\x86p"));               // U+2206 (Δ-like increment sign)
  CHECK(!first_invalid_utf8("\xED\x9F\xBF"));                // U+D7FF, last before the surrogates
  CHECK(!first_invalid_utf8("\xEE\x80\x80"));                // U+E000, first after them
  CHECK(!first_invalid_utf8("\xF0\x90\x80\x80"));            // U+10000
  CHECK(!first_invalid_utf8("\xF4\x8F\xBF\xBF"));            // U+10FFFF, the last code point
  CHECK(!text_problem("F1\tname\r\n"));
}

TEST_CASE("invalid UTF-8 is found at its first byte") {
  CHECK(first_invalid_utf8("W\xE9ll") == 1u);                // Latin-1 e-acute
  CHECK(first_invalid_utf8("ab\xC0\xAF") == 2u);             // overlong '/'
  CHECK(first_invalid_utf8("\xE0\x80\xAF") == 0u);           // overlong three-byte form
  CHECK(first_invalid_utf8("x\xED\xA0\x80") == 1u);          // surrogate U+D800
  CHECK(first_invalid_utf8("\xF4\x90\x80\x80") == 0u);       // above U+10FFFF
  CHECK(first_invalid_utf8("ok\xE2\x88") == 2u);             // cut short at the end
  CHECK(first_invalid_utf8("\x80") == 0u);                   // a lone continuation byte
  CHECK(first_invalid_utf8("\xFF") == 0u);
}

TEST_CASE("text_problem says what and where in words, counting bytes from 1") {
  CHECK(text_problem("W\xE9ll") == std::string("byte 0xE9 at position 2 is not UTF-8"));
  CHECK(text_problem(std::string("W1\0x", 4)) == std::string("a NUL byte (0x00) at position 3"));
  CHECK(text_problem("a\x1b[0m") == std::string("a control character (0x1B) at position 2"));
  CHECK(text_problem("a\x7F") == std::string("a control character (0x7F) at position 2"));
}

TEST_CASE("printable escapes what cannot be shown and keeps valid text") {
  CHECK(printable("W\xE9ll") == "W\\xE9ll");
  CHECK(printable(std::string("W1\0", 3)) == "W1\\x00");
  CHECK(printable("a\tb") == "a\\tb");
  CHECK(printable("Pe\xC3\xB1" "a") == "Pe\xC3\xB1" "a");
  CHECK(!first_invalid_utf8(printable("\xFF\xFE\xC3")));     // the result is always valid UTF-8
}
