#include "formats/files/file_hash.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"

TEST_CASE("SHA-256 test vectors") {
  // FIPS 180-2, Appendix B.1 ("abc") and the well-known digest of the empty string.
  CHECK(slipscreen::formats::sha256_bytes("abc") ==
        "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(slipscreen::formats::sha256_bytes("") ==
        "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("missing file is an I/O error naming the path") {
  CHECK_THROWS_WITH_AS(slipscreen::formats::sha256_file("/nonexistent/x.csv"),
                       doctest::Contains("/nonexistent/x.csv"), slipscreen::IoError);
}
