// Fuzz target: a distribution with units as written in a scenario ("lognormal(median=10 mD,
// sigma_ln=0.8)"; core/stats/distribution_text.hpp). Input: the first byte picks the field's
// dimension, the rest is the text.
// Promise checked beyond the typed errors: the canonical text of an accepted distribution parses
// back to an equal one (format_distribution's contract, used in manifests).
#include "core/stats/distribution_text.hpp"
#include "fuzz_support.hpp"

using namespace slipscreen;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size < 1) return 0;
  const units::Dimension dimension = fuzz::dimension_of(data[0]);
  const std::string_view text = fuzz::as_text(data + 1, size - 1);
  return fuzz::expect_typed_errors([&] {
    const stats::Distribution d = stats::parse_distribution(text, dimension, "fuzz");
    const std::string canonical = stats::format_distribution(d, dimension);
    stats::Distribution back = stats::Distribution::fixed(0.0);
    try {
      back = stats::parse_distribution(canonical, dimension, "fuzz (canonical text)");
    } catch (const Error& e) {
      std::fprintf(stderr, "fuzz: canonical text '%s' refused: %s\n", canonical.c_str(), e.what());
      std::abort();
    }
    fuzz::require(back == d, "parse_distribution(format_distribution(d)) == d");
  });
}
