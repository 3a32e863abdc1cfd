#pragma once
// SHA-256 of input files, for the run manifest (OpenSSL EVP).
#include <filesystem>
#include <string>
#include <string_view>

namespace slipscreen::formats {

// Lower-case hex SHA-256 of a file's bytes. Throws IoError when the file cannot be read.
std::string sha256_file(const std::filesystem::path& path);

// Lower-case hex SHA-256 of a byte string.
std::string sha256_bytes(std::string_view bytes);

}  // namespace slipscreen::formats
