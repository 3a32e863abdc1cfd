#pragma once
// Sampling of the uncertain inputs of a realization: plain Monte Carlo or Latin hypercube.
//
// Sources:
//   Latin hypercube sampling: McKay, Beckman & Conover (1979), Technometrics 21:239-245.
//   Inversion: x = F⁻¹(u) for a uniform variate u (any textbook; Devroye 1986 ch. 2).
//   Fisher-Yates shuffle ("Algorithm P"): Knuth, TAOCP vol. 2, 3rd ed. (1997) §3.4.2.
//
// Symbol table (code name -> McKay et al. 1979):
//   realization i   the i-th sample point, 0 ≤ i < N
//   input j         the j-th input variable X_j, 0 ≤ j < K
//   N               realization count (number of strata per input)
//   permutation π_j the random permutation of {0..N−1} of input j (stratum of realization i
//                   is π_j(i))
//   jitter v_ij     the uniform variate that places the point inside its stratum
//
// Draws (the reproducibility contract; see random_stream.hpp for the streams):
//   Monte Carlo:      u_ij = v_ij, the j-th uniform of RandomStream(seed, i, realization).
//   Latin hypercube:  u_ij = (π_j(i) + v_ij) / N (clamped to ≤ 1 − 2⁻⁵³), with the same v_ij
//                     and π_j the Fisher-Yates shuffle of the identity driven by
//                     RandomStream(seed, j, lhs_permutation): for k = N−1 down to 1,
//                     swap(π[k], π[below(k + 1)]).
//   Then x_ij = F_j⁻¹(u_ij). Every input consumes one uniform, fixed ones too, so making one
//   input uncertain never shifts the draws of the others. π_j depends on (seed, j, N) alone:
//   any subset of realizations can be drawn in any order, thread or process.
// Memory: the Latin hypercube keeps K permutations of N 32-bit entries (4·K·N bytes).
#include <cstdint>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/stats/distribution.hpp"

namespace slipscreen::stats {

// A validated number of realizations: 1 ≤ n ≤ kMax.
class RealizationCount {
 public:
  static constexpr std::int64_t kMax = 100'000'000;
  // Throws InputError(field, n, "a whole number from 1 to 100000000") when out of range.
  explicit RealizationCount(std::int64_t n, std::string_view field = "realizations");
  std::uint64_t value() const noexcept { return n_; }

 private:
  std::uint64_t n_;
};

enum class SamplingMethod { monte_carlo, latin_hypercube };

// "monte-carlo" or "latin-hypercube" (the scenario's and the manifest's spelling).
std::string_view sampling_method_name(SamplingMethod method);
// Parses the names above (also "mc", "lhs"); InputError with "did you mean" otherwise.
SamplingMethod parse_sampling_method(std::string_view text, std::string_view field = "sampler");

struct UncertainInput {
  std::string name;  // e.g. "friction", "permeability"; unique within a sampler
  Distribution distribution;
};

// What the manifest records about the sampling.
struct SamplerDescriptor {
  SamplingMethod method = SamplingMethod::monte_carlo;
  std::uint64_t seed = 0;
  std::uint64_t realizations = 0;
  std::size_t inputs = 0;
  std::string_view stream = "";  // kStreamVersion
};

class Sampler {
 public:
  // Throws InputError for an empty or repeated input name.
  Sampler(std::vector<UncertainInput> inputs, SamplingMethod method, std::uint64_t seed, RealizationCount count);

  const std::vector<UncertainInput>& inputs() const noexcept { return inputs_; }
  std::size_t input_count() const noexcept { return inputs_.size(); }
  std::uint64_t realization_count() const noexcept { return n_; }
  const SamplerDescriptor& descriptor() const noexcept { return descriptor_; }

  // The uniform variates u_ij in (0, 1) of realization i, one per input in input order.
  // out.size() must equal input_count(); i < realization_count(). Thread-safe (const).
  void uniforms(std::uint64_t i, std::span<double> out) const;

  // The input values x_ij = F_j⁻¹(u_ij) (SI) of realization i. Same contract as uniforms().
  void draw(std::uint64_t i, std::span<double> out) const;
  std::vector<double> draw(std::uint64_t i) const;

  // Latin hypercube only: the stratum π_j(i) of realization i for input j.
  std::uint32_t stratum(std::size_t j, std::uint64_t i) const;

 private:
  void check(std::uint64_t i, std::size_t size) const;

  std::vector<UncertainInput> inputs_;
  SamplingMethod method_;
  std::uint64_t seed_;
  std::uint64_t n_;
  SamplerDescriptor descriptor_;
  std::vector<std::vector<std::uint32_t>> permutations_;  // LHS: π_j, one per input
};

}  // namespace slipscreen::stats
