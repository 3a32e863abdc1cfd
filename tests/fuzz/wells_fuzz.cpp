// Fuzz target: the wells table and the injection histories (scenario/wells.hpp), as CSV.
// Input: "<wells.csv>" or "<wells.csv>\n%%%%\n<histories.csv>" (fuzz_support.hpp). The wells are
// read as a scenario reads them (EPSG:32708 unless the file's "# crs:" line says otherwise),
// then their histories, the continuation of active wells to 2030-01-01, and each well's rate
// history in the pressure engine's form (screening::rate_history_of), as a run prepares them.
#include <string>

#include "core/util/civil_date.hpp"
#include "formats/table/csv.hpp"
#include "fuzz_support.hpp"
#include "scenario/wells.hpp"
#include "screening/prepare.hpp"

using namespace slipscreen;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const auto parts = fuzz::split_parts(fuzz::as_text(data, size), fuzz::kPartSeparator, 2);
  return fuzz::expect_typed_errors([&] {
    std::vector<scenario::WellSpec> wells = scenario::read_wells(formats::parse_csv(parts[0], "wells.csv"), "EPSG:32708");
    if (parts.size() > 1) scenario::read_histories(formats::parse_csv(parts[1], "histories.csv"), wells);
    scenario::continue_active_wells(wells, util::to_seconds(util::CivilDate{2030, 1, 1}), "fuzz");
    for (const auto& w : wells) screening::rate_history_of(w);
  });
}
