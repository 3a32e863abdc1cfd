#pragma once
// Cells of the scenario's CSV tables (wells, histories, pressure observations): one checked
// value each, with the file, line and column in the message (docs/scenario.md). Used inside this
// layer only.
#include <string_view>
#include <vector>
#include <string>

#include "core/units/units.hpp"
#include "core/util/civil_date.hpp"
#include "formats/table/csv.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

// The column named `name` (or one of `also`); InputError naming the header line otherwise.
std::size_t need_column(const formats::CsvTable& t, std::string_view name, const std::vector<std::string>& also = {});
// A plain number (a coordinate).
double cell_number(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col);
// A date (YYYY-MM-DD) or, with `month`, a month (YYYY-MM), within the plausible dates.
util::CivilDate parse_date_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col, bool month);
// A cell's quantity within its physical range (scenario/plausibility.hpp), echoed as written.
double checked_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col, units::Dimension d,
                    const plausible::Range& range);
// A coordinate cell: within the range of its CRS's kind (degrees or projected units).
double coordinate_cell(const formats::CsvTable& t, const formats::CsvRow& row, std::size_t col,
                       const plausible::Range& range);

}  // namespace slipscreen::scenario
