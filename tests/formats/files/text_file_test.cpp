// Checked text files (formats/files/text_file.cpp): content as given, CSV quoting, and a write
// that cannot happen is an IoError naming the file.
#include "formats/files/text_file.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"
#include "support/scenario_fixture.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

TEST_CASE("text files are written byte for byte, rows quoted as RFC 4180 asks") {
  const test::TempDir dir("text-file");
  formats::write_text_file(dir / "a.txt", std::string("x\r\ny\0z", 6));
  CHECK(test::slurp(dir / "a.txt") == std::string("x\r\ny\0z", 6));

  formats::TextFileWriter w(dir / "b.csv");
  w.row({"id", "note"});
  w.row({"W-1", "rate, planned \"high\""});
  w.write("tail\n");
  w.close();
  CHECK(test::slurp(dir / "b.csv") == "id,note\nW-1,\"rate, planned \"\"high\"\"\"\ntail\n");
}

TEST_CASE("a file that cannot be created is an I/O error naming it") {
  const test::TempDir dir("text-file-bad");
  CHECK_THROWS_WITH_AS(formats::write_text_file(dir / "no-such-folder" / "a.csv", "x"),
                       doctest::Contains("no-such-folder/a.csv"), IoError);
  CHECK_THROWS_AS(formats::TextFileWriter(dir.path()), IoError);  // a folder is not a file
}
