#include "formats/toml/toml_section.hpp"

#include <doctest/doctest.h>

#include <string>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::formats;

namespace {

using Check = Section::TableArrayCheck;

// The message of the InputError that `f` throws ("" when it throws none).
template <class F>
std::string input_error(F f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("table_array: each entry is a Section with the key path name[i] in the layer that sets it") {
  const TomlDocument doc = parse_toml_text("[[well]]\nid = \"A\"\n\n[[well]]\nid = \"B\"\n", "s.toml");
  const TomlDocument over = parse_toml_text("[[well]]\nid = \"C\"\n", "o.toml");
  const Section one({{doc.root.get(), "s.toml", "", "dir"}});
  for (const Check check : {Check::whole, Check::each_entry}) {
    const auto wells = one.table_array("well", "wells", check);
    REQUIRE(wells.size() == 2);
    CHECK(wells[1].string("id") == "B");
    CHECK(wells[1].layers().front().prefix == "well[1]");
    CHECK(wells[1].layers().front().dir == "dir");
    CHECK(input_error([&] { wells[1].fail("id", "B", "another id"); }) ==
          "s.toml line 5, column 6: field 'well[1].id' = 'B': expected another id");
    CHECK(one.table_array("boundary", "boundaries", check).empty());  // no layer has the key
  }
  // The later layer sets the key: its file, prefix and entries.
  const Section two({{doc.root.get(), "s.toml", "", "dir"}, {over.root.get(), "o.toml", "region.override", "odir"}});
  const auto wells = two.table_array("well", "wells");
  REQUIRE(wells.size() == 1);
  CHECK(wells[0].string("id") == "C");
  CHECK(wells[0].layers().front().file == "o.toml");
  CHECK(wells[0].layers().front().prefix == "region.override.well[0]");
}

TEST_CASE("table_array: anything but an array of tables is refused at the key, with what was expected") {
  const auto refused = [](const char* text, Check check) {
    const TomlDocument doc = parse_toml_text(text, "s.toml");
    const Section s({{doc.root.get(), "s.toml", "", "."}});
    return input_error([&] { s.table_array("well", "a well table [[well]]", check); });
  };
  // whole: the value as written, at the key; an empty array is refused too.
  CHECK(refused("well = 3\n", Check::whole) == "s.toml line 1, column 8: field 'well' = '3': expected a well table [[well]]");
  CHECK(refused("well = []\n", Check::whole) == "s.toml line 1, column 8: field 'well' = '[]': expected a well table [[well]]");
  CHECK(refused("well = [{ id = \"A\" }, 2]\n", Check::whole).rfind("s.toml line 1, column 8: field 'well' = '[", 0) == 0);
  // each_entry: a table shows as its header, a bad entry is named at the entry; an empty array has none.
  CHECK(refused("[well]\nid = \"A\"\n", Check::each_entry) ==
        "s.toml line 1, column 1: field 'well' = '[well]': expected a well table [[well]]");
  CHECK(refused("well = [{ id = \"A\" }, 2]\n", Check::each_entry) ==
        "s.toml line 1, column 23: field 'well[1]' = '2': expected a well table [[well]]");
  CHECK(refused("well = []\n", Check::each_entry).empty());
}

namespace {

// The message of the Error (any category) that parsing `text` throws ("" when it throws none).
std::string syntax_message(const std::string& text) {
  try {
    parse_toml_text(text, "s.toml");
  } catch (const Error& e) {
    CHECK(e.category() == ErrorCategory::input);
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("TOML syntax errors in plain words, with the line and a caret") {
  // An unclosed string: its line ends inside the string.
  const std::string open = syntax_message("title = \"fine\"\nname = \"Marrowick\nseed = 1\n");
  CHECK_MESSAGE(open.find("s.toml line 2, column 18: a string is not closed on its line: its closing quote is "
                          "missing") != std::string::npos,
                open);
  CHECK_MESSAGE(open.find("\n    name = \"Marrowick\n                     ^") != std::string::npos, open);
  CHECK(syntax_message("name = \"Marrowick").find("a string is not closed: its closing quote is missing before the end "
                                                  "of the file") != std::string::npos);
  // A TOML date that does not exist (Gregorian calendar, common practice).
  const std::string date = syntax_message("[times]\ndates = [2027-01-01, 2027-02-30]\n");
  CHECK_MESSAGE(date.find("s.toml line 2, column") != std::string::npos, date);
  CHECK_MESSAGE(date.find("the date 2027-02-30 does not exist: February 2027 has 28 days") != std::string::npos, date);
  // Anything else keeps toml++'s reason, without its "Error while parsing" frame.
  const std::string other = syntax_message("seed = = 42\n");
  CHECK_MESSAGE(other.find("s.toml line 1, column") != std::string::npos, other);
  CHECK_MESSAGE(other.find("not valid TOML: ") != std::string::npos, other);
  CHECK_MESSAGE(other.find("Error while parsing") == std::string::npos, other);
}

TEST_CASE("TOML's nan and inf are not numbers for a coordinate") {
  const TomlDocument doc = parse_toml_text("x = nan\ny = -inf\nz = 1e300\nn = 7\n", "s.toml");
  const Section s({{doc.root.get(), "s.toml", "well", "."}});
  CHECK(input_error([&] { s.number("x"); }) == "s.toml line 1, column 5: field 'well.x' = 'nan': expected a finite number "
                                                "(without quotes)");
  CHECK(input_error([&] { s.number("y"); }).find("field 'well.y' = '-inf'") != std::string::npos);
  CHECK(s.number("z") == 1e300);
  CHECK(s.number("n") == 7.0);
}
