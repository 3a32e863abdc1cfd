// Fuzz target: a catalog table with its column mapping (formats/catalog/catalog_file.hpp): CSV
// (catalog_csv.hpp, catalog_columns.hpp) or, by its header line, the FDSN event text format.
// Input: "<catalog.csv>" (default columns) or "<mapping>\n%%%%\n<catalog.csv>" with the mapping
// text as written after --columns ("time=origin_time;lat=lat_deg;..."; fuzz_support.hpp).
// Promise checked beyond the typed errors: every accepted event has finite numbers (the reader
// rejects what it cannot use, with its line).
#include "formats/catalog/catalog_file.hpp"
#include "fuzz_support.hpp"

using namespace slipscreen;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const auto parts = fuzz::split_parts(fuzz::as_text(data, size), fuzz::kPartSeparator, 2);
  return fuzz::expect_typed_errors([&] {
    const formats::CatalogColumns columns =
        parts.size() > 1 ? formats::parse_catalog_columns(parts[0]) : formats::CatalogColumns{};
    const auto path = fuzz::write_scratch("catalog.csv", parts.back());
    const formats::CatalogReadResult r = formats::read_catalog(path.string(), formats::CatalogFormat::csv, columns, false);
    fuzz::require_finite_events(r.catalog);
    formats::throw_if_strict(r, true);
  });
}
