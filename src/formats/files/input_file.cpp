#include "formats/files/input_file.hpp"

#include "core/errors.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

std::optional<std::string> input_file_problem(const fs::path& path) {
  std::error_code ec;
  const fs::file_status st = fs::status(path, ec);
  switch (st.type()) {
    case fs::file_type::regular: return std::nullopt;
    case fs::file_type::not_found: return std::string("no such file");
    case fs::file_type::directory: return std::string("it is a directory, not a file");
    case fs::file_type::fifo: return std::string("it is a named pipe, not a regular file");
    case fs::file_type::socket: return std::string("it is a socket, not a regular file");
    case fs::file_type::block:
    case fs::file_type::character: return std::string("it is a device, not a regular file");
    default: break;
  }
  if (ec) return "cannot be examined: " + ec.message();
  return std::string("it is not a regular file");
}

void require_input_file(const fs::path& path, const std::string& display) {
  if (const auto problem = input_file_problem(path)) throw IoError(display + ": cannot open the file for reading (" + *problem + ")");
}

}  // namespace slipscreen::formats
