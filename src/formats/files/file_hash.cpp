#include "formats/files/file_hash.hpp"

#include <openssl/evp.h>

#include <array>
#include <fstream>
#include <memory>

#include "core/errors.hpp"

namespace slipscreen::formats {
namespace {

struct Digest {
  std::unique_ptr<EVP_MD_CTX, decltype(&EVP_MD_CTX_free)> ctx{EVP_MD_CTX_new(), &EVP_MD_CTX_free};
  Digest() {
    if (!ctx || EVP_DigestInit_ex(ctx.get(), EVP_sha256(), nullptr) != 1)
      throw IoError("SHA-256: OpenSSL could not initialise the digest");
  }
  void update(const void* data, std::size_t n) {
    if (EVP_DigestUpdate(ctx.get(), data, n) != 1) throw IoError("SHA-256: digest update failed");
  }
  std::string hex() {
    std::array<unsigned char, EVP_MAX_MD_SIZE> md{};
    unsigned int len = 0;
    if (EVP_DigestFinal_ex(ctx.get(), md.data(), &len) != 1) throw IoError("SHA-256: digest failed");
    static constexpr char kHex[] = "0123456789abcdef";
    std::string s;
    for (unsigned int i = 0; i < len; ++i) {
      s += kHex[md[i] >> 4];
      s += kHex[md[i] & 0xF];
    }
    return s;
  }
};

}  // namespace

std::string sha256_file(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(path.string() + ": cannot open the file to compute its SHA-256");
  Digest d;
  std::array<char, 1 << 16> buf{};
  while (in) {
    in.read(buf.data(), buf.size());
    d.update(buf.data(), static_cast<std::size_t>(in.gcount()));
  }
  if (in.bad()) throw IoError(path.string() + ": read error while computing its SHA-256");
  return d.hex();
}

std::string sha256_bytes(std::string_view bytes) {
  Digest d;
  d.update(bytes.data(), bytes.size());
  return d.hex();
}

}  // namespace slipscreen::formats
