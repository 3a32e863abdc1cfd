#pragma once
// Checked writing of text files: every output of a run goes through here, so that a write that
// fails (disk full, file-size limit, I/O error) is an IoError naming the file, never a file cut
// short behind an exit code of 0 (docs/exit-codes.md).
#include <filesystem>
#include <fstream>
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::formats {

// Writes `text` to `path` (binary). Throws IoError naming the path on failure.
void write_text_file(const std::filesystem::path& path, std::string_view text);

// A text file written in pieces (large tables); every piece is checked, and close() checks the
// flush. Destroying an unclosed writer leaves an incomplete file: the run folder's staging is
// then removed by the error that skipped close().
class TextFileWriter {
 public:
  explicit TextFileWriter(std::filesystem::path path);
  void write(std::string_view text);
  // One CSV record (fields quoted as needed, RFC 4180) and a line feed.
  void row(const std::vector<std::string>& fields);
  void close();

 private:
  void check(const char* what);
  std::filesystem::path path_;
  std::ofstream out_;
};

}  // namespace slipscreen::formats
