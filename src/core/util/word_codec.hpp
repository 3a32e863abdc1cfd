#pragma once
// A flat encoding of results as 64-bit words, for sending them between processes
// (docs/cluster.md): counts, lengths and doubles (bit for bit). The reader checks every length
// against the buffer and throws InputError naming `what` (the kind of block) on a truncated or
// malformed one. No I/O here: the run layer moves the bytes.
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <span>
#include <string>
#include <utility>
#include <vector>

#include "core/errors.hpp"

namespace slipscreen::util {

// Builds the block in place as bytes, so that taking it (bytes()) moves it out: a block of tens
// of megabytes is neither grown by copies when reserved nor copied again when sent.
class WordWriter {
 public:
  void word(std::uint64_t w) { append(&w, sizeof w); }
  void words(std::span<const std::uint64_t> v) {
    word(v.size());
    append(v.data(), v.size() * sizeof(std::uint64_t));
  }
  void doubles(std::span<const double> v) {  // bit for bit
    word(v.size());
    append(v.data(), v.size() * sizeof(double));
  }
  void floats(std::span<const float> v) {  // bit for bit, two to a word (the last one padded)
    word(v.size());
    append(v.data(), v.size() * sizeof(float));
    if (v.size() % 2 != 0) {
      const float pad = 0.0f;
      append(&pad, sizeof pad);
    }
  }
  void reserve(std::size_t words) { bytes_.reserve(words * sizeof(std::uint64_t)); }
  void sizes(std::span<const std::size_t> v) {
    word(v.size());
    for (std::size_t s : v) word(s);
  }
  // The block, moved out (the writer is left empty).
  std::vector<std::uint8_t> bytes() && { return std::move(bytes_); }

 private:
  void append(const void* p, std::size_t n) {
    const auto* b = static_cast<const std::uint8_t*>(p);
    bytes_.insert(bytes_.end(), b, b + n);
  }
  std::vector<std::uint8_t> bytes_;
};

// Reads a block in place: `bytes` must outlive the reader.
class WordReader {
 public:
  WordReader(std::span<const std::uint8_t> bytes, std::string what) : what_(std::move(what)), bytes_(bytes) {
    if (bytes.size() % sizeof(std::uint64_t) != 0) fail(std::to_string(bytes.size()) + " bytes");
    n_words_ = bytes.size() / sizeof(std::uint64_t);
  }
  std::uint64_t word() {
    if (at_ >= n_words_) fail("truncated at word " + std::to_string(at_));
    std::uint64_t w = 0;
    std::memcpy(&w, bytes_.data() + at_ * sizeof w, sizeof w);
    ++at_;
    return w;
  }
  std::size_t count() {
    const std::uint64_t n = word();
    if (n > n_words_ - at_) fail("a length of " + std::to_string(n) + " beyond the buffer");
    return static_cast<std::size_t>(n);
  }
  std::vector<std::uint64_t> words() { return read<std::uint64_t>(count()); }
  std::vector<double> doubles() { return read<double>(count()); }
  std::vector<float> floats() {
    const std::uint64_t n = word();
    if (n > 2 * (n_words_ - at_)) fail("a length of " + std::to_string(n) + " floats beyond the buffer");
    std::vector<float> v(static_cast<std::size_t>(n));
    if (n > 0) std::memcpy(v.data(), bytes_.data() + at_ * sizeof(std::uint64_t), v.size() * sizeof(float));
    at_ += (v.size() + 1) / 2;
    return v;
  }
  std::vector<std::size_t> sizes() {
    const std::vector<std::uint64_t> w = words();
    return std::vector<std::size_t>(w.begin(), w.end());
  }
  bool done() const { return at_ == n_words_; }
  [[noreturn]] void fail(const std::string& found) const { throw InputError("encoded block", found, what_); }

 private:
  // n items of 8 bytes each (n checked against the buffer by count()).
  template <class T>
  std::vector<T> read(std::size_t n) {
    static_assert(sizeof(T) == sizeof(std::uint64_t));
    std::vector<T> v(n);
    if (n > 0) std::memcpy(v.data(), bytes_.data() + at_ * sizeof(std::uint64_t), n * sizeof(T));
    at_ += n;
    return v;
  }
  std::string what_;
  std::span<const std::uint8_t> bytes_;
  std::size_t n_words_ = 0, at_ = 0;
};

}  // namespace slipscreen::util
