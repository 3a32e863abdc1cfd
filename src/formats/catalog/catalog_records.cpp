#include "formats/catalog/catalog_records.hpp"

#include "core/errors.hpp"

namespace slipscreen::formats {

void throw_if_strict(const CatalogReadResult& r, bool strict) {
  if (!strict || r.rejected.empty()) return;
  const auto& first = r.rejected.front();
  throw InputError("record", "unusable",
                   "every record usable in strict mode; " + std::to_string(r.rejected.size()) +
                       " unusable record(s), the first: " + first.reason)
      .located(r.path + " line " + std::to_string(first.line));
}

}  // namespace slipscreen::formats
