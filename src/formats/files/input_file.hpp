#pragma once
// What is wrong with a path named as an input file, in plain words, before anything opens it.
// Opening a directory "succeeds" and then reads nothing, and opening a named pipe (FIFO) waits
// for a writer that may never come: both are refused here with what the path actually is.
#include <filesystem>
#include <optional>
#include <string>

namespace slipscreen::formats {

// Nothing for a regular file (symbolic links are followed); otherwise "no such file", "it is a
// directory, not a file", "it is a named pipe, not a regular file" (also a socket, a device), or
// "cannot be examined: <reason>" (e.g. a folder on the way that may not be read).
std::optional<std::string> input_file_problem(const std::filesystem::path& path);

// Throws IoError "<display>: cannot open the file for reading (<problem>)" unless `path` is a
// regular file.
void require_input_file(const std::filesystem::path& path, const std::string& display);

}  // namespace slipscreen::formats
