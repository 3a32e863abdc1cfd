// Fuzz target: a value with its unit ("2e4 bbl/d", "10 mD", "0.7 psi/ft"; core/units/units.hpp).
// Input: the first byte picks the expected dimension, the rest is the text as a user writes it.
// Promise checked beyond the typed errors: an accepted value is finite in SI.
#include <cmath>

#include "core/units/units.hpp"
#include "fuzz_support.hpp"

using namespace slipscreen;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size < 1) return 0;
  const units::Dimension dimension = fuzz::dimension_of(data[0]);
  const std::string_view text = fuzz::as_text(data + 1, size - 1);
  return fuzz::expect_typed_errors([&] {
    const double si = units::parse(text, dimension, "fuzz");
    fuzz::require(std::isfinite(si), "units::parse returns a finite SI value");
  });
}
