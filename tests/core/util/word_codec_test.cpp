#include "core/util/word_codec.hpp"

#include <doctest/doctest.h>

#include <bit>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <utility>
#include <vector>

#include "core/errors.hpp"

using slipscreen::InputError;
using slipscreen::util::WordReader;
using slipscreen::util::WordWriter;

TEST_CASE("encoded words read back bit for bit, in 64-bit words with lengths in front") {
  const std::vector<double> d{1.5, -0.0, std::numeric_limits<double>::quiet_NaN(), 1e-310};
  const std::vector<float> f{0.25f, -3.0f, 7.5f};  // an odd count: the last word is padded
  const std::vector<std::uint64_t> w{0, 1, ~std::uint64_t{0}};
  const std::vector<std::size_t> sz{4, 2};
  WordWriter out;
  out.reserve(3);  // less than needed: the writer grows past it
  out.word(42);
  out.doubles(d);
  out.floats(f);
  out.words(w);
  out.sizes(sz);
  const std::vector<std::uint8_t> bytes = std::move(out).bytes();
  // 1 + (1 + 4) + (1 + 2) + (1 + 3) + (1 + 2) = 16 words.
  CHECK(bytes.size() == 16 * sizeof(std::uint64_t));
  std::uint64_t pad = 1;  // the padding after the third float is zero bits
  std::memcpy(&pad, bytes.data() + 8 * 8 + 4, 4);
  CHECK((pad & 0xffffffffu) == 0);

  WordReader in(bytes, "a test block");
  CHECK(in.word() == 42);
  const std::vector<double> d2 = in.doubles();
  REQUIRE(d2.size() == d.size());
  for (std::size_t i = 0; i < d.size(); ++i) CHECK(std::bit_cast<std::uint64_t>(d2[i]) == std::bit_cast<std::uint64_t>(d[i]));
  CHECK(in.floats() == f);
  CHECK(in.words() == w);
  CHECK(in.sizes() == sz);
  CHECK(in.done());
}

TEST_CASE("a truncated or malformed block is refused, naming the kind of block") {
  WordWriter out;
  out.doubles(std::vector<double>{1.0, 2.0, 3.0});
  std::vector<std::uint8_t> bytes = std::move(out).bytes();

  std::vector<std::uint8_t> odd(bytes.begin(), bytes.end() - 3);  // not whole words
  CHECK_THROWS_WITH_AS(WordReader(odd, "a test block"), doctest::Contains("a test block"), InputError);

  std::vector<std::uint8_t> short_block(bytes.begin(), bytes.end() - 8);  // a length beyond the buffer
  WordReader cut(short_block, "a test block");
  CHECK_THROWS_WITH_AS(cut.doubles(), doctest::Contains("beyond the buffer"), InputError);

  WordReader all(bytes, "a test block");
  (void)all.doubles();
  CHECK(all.done());
  CHECK_THROWS_WITH_AS(all.word(), doctest::Contains("truncated"), InputError);

  std::vector<std::uint8_t> many_floats(8);
  const std::uint64_t n = 5;  // five floats need three more words
  std::memcpy(many_floats.data(), &n, 8);
  WordReader fl(many_floats, "a test block");
  CHECK_THROWS_WITH_AS(fl.floats(), doctest::Contains("floats beyond the buffer"), InputError);
}
