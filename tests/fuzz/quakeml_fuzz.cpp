// Fuzz target: a QuakeML 1.2 catalog (formats/catalog/catalog_quakeml.hpp).
// Input: the XML document. Promise checked beyond the typed errors: every accepted event has
// finite numbers (the reader rejects what it cannot use, with its line).
#include "formats/catalog/catalog_file.hpp"
#include "fuzz_support.hpp"

using namespace slipscreen;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  return fuzz::expect_typed_errors([&] {
    const auto path = fuzz::write_scratch("catalog.xml", fuzz::as_text(data, size));
    const formats::CatalogReadResult r =
        formats::read_catalog(path.string(), formats::CatalogFormat::quakeml, formats::CatalogColumns{}, false);
    fuzz::require_finite_events(r.catalog);
    formats::throw_if_strict(r, true);
  });
}
