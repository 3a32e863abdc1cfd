#pragma once
// Independent random streams, one per realization, derived from (seed, index) alone — so a
// realization draws the same numbers whatever thread, process or order computes it.
//
// Sources:
//   SplitMix64: Steele, Lea & Flood (2014), "Fast splittable pseudorandom number generators",
//     OOPSLA '14, doi:10.1145/2660193.2660195 (constants of Vigna's splitmix64.c, mix "variant 13"
//     of Stafford 2011).
//   MT19937-64: Matsumoto & Nishimura (1998), ACM TOMACS 8:3; Nishimura (2000), ACM TOMACS
//     10:348 (64-bit version); Boost.Random's boost::random::mt19937_64.
//
// Symbol table (code name -> meaning):
//   kGolden   γ = 0x9E3779B97F4A7C15, the SplitMix64 increment (2⁶⁴/φ, odd)
//   mix64     the SplitMix64 output function (a bijection of 64-bit words)
//   seed      the run's seed (manifest); index the realization number i (or input number j)
//   purpose   P, a tag per use, so the streams of different uses never coincide
//
// Derivation (exact; part of the reproducibility contract, change only with a new version tag
// kStreamVersion):
//   h   = mix64(seed XOR (P · 0xD1B54A32D192ED03))                  (all arithmetic mod 2⁶⁴)
//   key = mix64(h + (i + 1) · γ)
//   The engine's 312 state words are the first 312 outputs of a SplitMix64 generator started
//   at state `key` (state += γ; output = mix64(state)), loaded in order with
//   mersenne_twister_engine::seed(first, last) (each 64-bit word passed as low, high 32 bits).
//   For a fixed seed and purpose, key is a bijection of i, so no two realizations share a key.
//
// Uniform variates: u = (⌊x / 2¹²⌋ + 0.5) · 2⁻⁵² for each 64-bit engine output x: 2⁵² equally
// spaced values, all exactly representable, symmetric about 1/2, in the open interval
// [2⁻⁵³, 1 − 2⁻⁵³] ⊂ (0, 1): never 0 or 1, so quantile functions never see ±infinity.
#include <cstdint>
#include <string_view>

#include <boost/random/mersenne_twister.hpp>

namespace slipscreen::stats {

inline constexpr std::string_view kStreamVersion = "splitmix64-mt19937_64/1";

// Uses of random streams (the tag P above). Values are part of the reproducibility contract.
enum class StreamPurpose : std::uint64_t {
  realization = 1,      // the sampled inputs of realization i (and LHS jitter)
  lhs_permutation = 2,  // the Latin hypercube permutation of input j
  auxiliary = 3,        // any further draws of realization i a model needs
};

// SplitMix64 output function (Steele, Lea & Flood 2014; Vigna's splitmix64.c constants).
constexpr std::uint64_t mix64(std::uint64_t z) noexcept {
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

inline constexpr std::uint64_t kGolden = 0x9E3779B97F4A7C15ULL;

// One SplitMix64 step: state += γ, returns mix64(state).
constexpr std::uint64_t splitmix64_next(std::uint64_t& state) noexcept {
  state += kGolden;
  return mix64(state);
}

// The stream key of (seed, purpose, index), as derived above.
constexpr std::uint64_t stream_key(std::uint64_t seed, StreamPurpose purpose, std::uint64_t index) noexcept {
  const std::uint64_t h = mix64(seed ^ (static_cast<std::uint64_t>(purpose) * 0xD1B54A32D192ED03ULL));
  return mix64(h + (index + 1) * kGolden);
}

// The uniform variate of one 64-bit word x: (⌊x / 2¹²⌋ + 0.5) · 2⁻⁵², exact, in
// [2⁻⁵³, 1 − 2⁻⁵³].
constexpr double open_unit_interval(std::uint64_t x) noexcept {
  return (static_cast<double>(x >> 12) + 0.5) * 0x1p-52;
}

class RandomStream {
 public:
  RandomStream(std::uint64_t seed, std::uint64_t index, StreamPurpose purpose = StreamPurpose::realization);

  // Next raw 64-bit engine output.
  std::uint64_t bits() { return engine_(); }

  // Next uniform variate in the open interval (0, 1), see above. Exact (no rounding).
  double uniform() { return open_unit_interval(engine_()); }

  // A uniform integer in [0, n) by Boost.Random's uniform_int_distribution (its algorithm is
  // fixed by Boost, unlike std::uniform_int_distribution's). Requires n ≥ 1.
  std::uint64_t below(std::uint64_t n);

 private:
  boost::random::mt19937_64 engine_;
};

}  // namespace slipscreen::stats
