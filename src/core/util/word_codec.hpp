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
#include <vector>

#include "core/errors.hpp"

namespace slipscreen::util {

class WordWriter {
 public:
  void word(std::uint64_t w) { words_.push_back(w); }
  void words(std::span<const std::uint64_t> v) {
    word(v.size());
    words_.insert(words_.end(), v.begin(), v.end());
  }
  void doubles(std::span<const double> v) {  // bit for bit (memcpy: large blocks of the surrogate)
    word(v.size());
    const std::size_t at = words_.size();
    words_.resize(at + v.size());
    if (!v.empty()) std::memcpy(words_.data() + at, v.data(), v.size() * sizeof(double));
  }
  void floats(std::span<const float> v) {  // bit for bit, two to a word (the last one padded)
    word(v.size());
    const std::size_t at = words_.size();
    words_.resize(at + (v.size() + 1) / 2, 0);
    if (!v.empty()) std::memcpy(words_.data() + at, v.data(), v.size() * sizeof(float));
  }
  void reserve(std::size_t words) { words_.reserve(words); }
  void sizes(std::span<const std::size_t> v) {
    word(v.size());
    for (std::size_t s : v) word(s);
  }
  std::vector<std::uint8_t> bytes() const {
    std::vector<std::uint8_t> b(words_.size() * sizeof(std::uint64_t));
    if (!b.empty()) std::memcpy(b.data(), words_.data(), b.size());
    return b;
  }

 private:
  std::vector<std::uint64_t> words_;
};

class WordReader {
 public:
  WordReader(std::span<const std::uint8_t> bytes, std::string what) : what_(std::move(what)) {
    if (bytes.size() % sizeof(std::uint64_t) != 0) fail(std::to_string(bytes.size()) + " bytes");
    words_.resize(bytes.size() / sizeof(std::uint64_t));
    if (!bytes.empty()) std::memcpy(words_.data(), bytes.data(), bytes.size());
  }
  std::uint64_t word() {
    if (at_ >= words_.size()) fail("truncated at word " + std::to_string(at_));
    return words_[at_++];
  }
  std::size_t count() {
    const std::uint64_t n = word();
    if (n > words_.size() - at_) fail("a length of " + std::to_string(n) + " beyond the buffer");
    return static_cast<std::size_t>(n);
  }
  std::vector<std::uint64_t> words() {
    const std::size_t n = count();
    std::vector<std::uint64_t> v(words_.begin() + static_cast<std::ptrdiff_t>(at_),
                                 words_.begin() + static_cast<std::ptrdiff_t>(at_ + n));
    at_ += n;
    return v;
  }
  std::vector<double> doubles() {
    const std::size_t n = count();
    std::vector<double> v(n);
    if (n > 0) std::memcpy(v.data(), words_.data() + at_, n * sizeof(double));
    at_ += n;
    return v;
  }
  std::vector<float> floats() {
    const std::uint64_t n = word();
    if (n > 2 * (words_.size() - at_)) fail("a length of " + std::to_string(n) + " floats beyond the buffer");
    std::vector<float> v(static_cast<std::size_t>(n));
    if (n > 0) std::memcpy(v.data(), words_.data() + at_, v.size() * sizeof(float));
    at_ += (v.size() + 1) / 2;
    return v;
  }
  std::vector<std::size_t> sizes() {
    std::vector<std::size_t> v;
    for (std::uint64_t w : words()) v.push_back(static_cast<std::size_t>(w));
    return v;
  }
  bool done() const { return at_ == words_.size(); }
  [[noreturn]] void fail(const std::string& found) const { throw InputError("encoded block", found, what_); }

 private:
  std::string what_;
  std::vector<std::uint64_t> words_;
  std::size_t at_ = 0;
};

}  // namespace slipscreen::util
