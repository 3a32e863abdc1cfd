#include "core/stats/sampler.hpp"

#include <algorithm>
#include <cctype>
#include <numeric>
#include <set>

#include "core/errors.hpp"
#include "core/stats/random_stream.hpp"
#include "core/util/suggest.hpp"

namespace slipscreen::stats {

RealizationCount::RealizationCount(std::int64_t n, std::string_view field) : n_(0) {
  if (n < 1 || n > kMax)
    throw InputError(std::string(field), std::to_string(n), "a whole number of realizations from 1 to 100000000");
  n_ = static_cast<std::uint64_t>(n);
}

std::string_view sampling_method_name(SamplingMethod method) {
  return method == SamplingMethod::latin_hypercube ? "latin-hypercube" : "monte-carlo";
}

SamplingMethod parse_sampling_method(std::string_view text, std::string_view field) {
  std::string s(text);
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (s == "monte-carlo" || s == "mc") return SamplingMethod::monte_carlo;
  if (s == "latin-hypercube" || s == "lhs") return SamplingMethod::latin_hypercube;
  throw InputError(std::string(field), std::string(text),
                   "a sampler: 'monte-carlo' (or 'mc') or 'latin-hypercube' (or 'lhs')" +
                       util::did_you_mean(s, {"monte-carlo", "latin-hypercube", "mc", "lhs"}));
}

Sampler::Sampler(std::vector<UncertainInput> inputs, SamplingMethod method, std::uint64_t seed, RealizationCount count)
    : inputs_(std::move(inputs)), method_(method), seed_(seed), n_(count.value()) {
  std::set<std::string> names;
  for (const auto& in : inputs_) {
    if (in.name.empty()) throw InputError("uncertain input", "", "a non-empty input name");
    if (!names.insert(in.name).second)
      throw InputError("uncertain input", in.name, "each input name once (it is given twice)");
  }
  descriptor_ = SamplerDescriptor{method_, seed_, n_, inputs_.size(), kStreamVersion};
  if (method_ == SamplingMethod::latin_hypercube) {
    permutations_.resize(inputs_.size());
    for (std::size_t j = 0; j < inputs_.size(); ++j) {
      auto& p = permutations_[j];
      p.resize(n_);
      std::iota(p.begin(), p.end(), std::uint32_t{0});
      // Fisher-Yates shuffle (Knuth 1997 §3.4.2, Algorithm P), written out so that the
      // permutation is fixed by this code and Boost.Random, not by a standard library.
      RandomStream stream(seed_, j, StreamPurpose::lhs_permutation);
      for (std::uint64_t k = n_ - 1; k >= 1; --k) std::swap(p[k], p[stream.below(k + 1)]);
    }
  }
}

void Sampler::check(std::uint64_t i, std::size_t size) const {
  if (i >= n_)
    throw InputError("realization", std::to_string(i), "a realization number below " + std::to_string(n_));
  if (size != inputs_.size())
    throw InputError("sample size", std::to_string(size), "one value per input (" + std::to_string(inputs_.size()) + ")");
}

void Sampler::uniforms(std::uint64_t i, std::span<double> out) const {
  check(i, out.size());
  RandomStream stream(seed_, i, StreamPurpose::realization);
  const double n = static_cast<double>(n_);
  constexpr double kBelowOne = 1.0 - 0x1p-53;
  for (std::size_t j = 0; j < out.size(); ++j) {
    const double v = stream.uniform();
    if (method_ == SamplingMethod::monte_carlo) {
      out[j] = v;
    } else {
      // McKay, Beckman & Conover (1979): u = (π_j(i) + v) / N, one point per stratum.
      out[j] = std::min((static_cast<double>(permutations_[j][i]) + v) / n, kBelowOne);
    }
  }
}

void Sampler::draw(std::uint64_t i, std::span<double> out) const {
  uniforms(i, out);
  for (std::size_t j = 0; j < out.size(); ++j) out[j] = inputs_[j].distribution.quantile(out[j]);
}

std::vector<double> Sampler::draw(std::uint64_t i) const {
  std::vector<double> out(inputs_.size());
  draw(i, out);
  return out;
}

std::uint32_t Sampler::stratum(std::size_t j, std::uint64_t i) const {
  if (method_ != SamplingMethod::latin_hypercube)
    throw InputError("sampler", std::string(sampling_method_name(method_)), "latin-hypercube (strata exist only there)");
  if (j >= inputs_.size()) throw InputError("input", std::to_string(j), "an input number below " + std::to_string(inputs_.size()));
  if (i >= n_) throw InputError("realization", std::to_string(i), "a realization number below " + std::to_string(n_));
  return permutations_[j][i];
}

}  // namespace slipscreen::stats
