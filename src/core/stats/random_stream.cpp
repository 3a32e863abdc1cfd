#include "core/stats/random_stream.hpp"

#include <array>

#include <boost/random/uniform_int_distribution.hpp>

#include "core/errors.hpp"

namespace slipscreen::stats {

RandomStream::RandomStream(std::uint64_t seed, std::uint64_t index, StreamPurpose purpose) {
  constexpr std::size_t n = boost::random::mt19937_64::state_size;  // 312 words
  std::array<std::uint32_t, 2 * n> words{};
  std::uint64_t state = stream_key(seed, purpose, index);
  for (std::size_t j = 0; j < n; ++j) {
    const std::uint64_t w = splitmix64_next(state);
    words[2 * j] = static_cast<std::uint32_t>(w);
    words[2 * j + 1] = static_cast<std::uint32_t>(w >> 32);
  }
  auto first = words.begin();
  engine_.seed(first, words.end());
}

std::uint64_t RandomStream::below(std::uint64_t n) {
  if (n == 0) throw InputError("range", "0", "at least one value to choose from");
  return boost::random::uniform_int_distribution<std::uint64_t>(0, n - 1)(engine_);
}

}  // namespace slipscreen::stats
