#include "formats/files/input_file.hpp"

#include <doctest/doctest.h>
#include <sys/stat.h>

#include <fstream>

#include "core/errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

TEST_CASE("an input that is not a regular file is named for what it is") {
  test::TempDir dir("input-file");
  std::ofstream(dir / "wells.csv") << "id\n";
  std::filesystem::create_directory(dir / "folder.csv");
  REQUIRE(::mkfifo((dir / "pipe.csv").c_str(), 0600) == 0);

  CHECK(!formats::input_file_problem(dir / "wells.csv"));
  CHECK(formats::input_file_problem(dir / "none.csv") == std::string("no such file"));
  CHECK(formats::input_file_problem(dir / "folder.csv") == std::string("it is a directory, not a file"));
  CHECK(formats::input_file_problem(dir / "pipe.csv") == std::string("it is a named pipe, not a regular file"));
  // Nothing opens the pipe (that would wait for a writer): the check only looks at it.
  CHECK_THROWS_WITH_AS(formats::require_input_file(dir / "pipe.csv", "pipe.csv"),
                       "pipe.csv: cannot open the file for reading (it is a named pipe, not a regular file)", IoError);
  CHECK_THROWS_WITH_AS(formats::require_input_file(dir / "folder.csv", "folder.csv"),
                       "folder.csv: cannot open the file for reading (it is a directory, not a file)", IoError);
}
