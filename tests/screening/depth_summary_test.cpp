// The console summary of the screen in depth against the run's own tables (fault_depth.csv,
// fault_depth_probability.csv) on the fictional Corran Ridge fixture with a well close to CR-01.
#include "screening/depth_summary.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <string>

#include "formats/table/csv.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;

namespace {

const std::string& cell(const formats::CsvTable& t, std::size_t row, const char* column) {
  const auto c = t.column(column);
  REQUIRE_MESSAGE(c.has_value(), t.file << " has no column " << column);
  return t.rows[row].fields[*c];
}

}  // namespace

TEST_CASE("depth summary: first crossings and P(slip) as the tables of the same run hold them") {
  const test::TempDir dir("depth-summary");
  const fs::path data = fs::path(SLIPSCREEN_TEST_DATA) / "scenario" / "poro3d";
  const scenario::ResolvedScenario s = scenario::load_scenario(data / "physics16_depth.toml");
  const screening::RunSummary r = run::run_scenario(s, test::options_into(dir.path() / "run"));
  REQUIRE(r.depth.has_value());
  const screening::DepthSummary& d = *r.depth;
  const formats::CsvTable depth = formats::read_csv(dir.path() / "run" / "fault_depth.csv", "fault_depth.csv");
  const formats::CsvTable prob =
      formats::read_csv(dir.path() / "run" / "fault_depth_probability.csv", "fault_depth_probability.csv");
  CHECK(d.segments == 5);
  CHECK(d.realizations == 8);
  REQUIRE(d.lines.size() == d.segments);
  CHECK(d.crossing_count == 2);  // CR-01:0 and CR-01:1 (not vacuous: some cross, some do not)
  std::size_t crossings = 0;
  for (std::size_t i = 0; i < d.lines.size(); ++i) {
    const screening::DepthLine& l = d.lines[i];
    CAPTURE(l.segment_id);
    if (i > 0) CHECK(*d.lines[i - 1].p_final >= *l.p_final);  // highest P(slip) first
    double closest = INFINITY;
    for (std::size_t row = 0; row < depth.rows.size(); ++row) {
      if (cell(depth, row, "segment_id") != l.segment_id) continue;
      CHECK(cell(depth, row, "fault_id") == l.fault_id);
      closest = std::min(closest, std::stod(cell(depth, row, "coulomb_margin_MPa")));
      CHECK(cell(depth, row, "first_crossing_date") == l.first_crossing.value_or(""));
      if (l.first_crossing) {
        // the table writes 1 decimal of m and 6 of MPa
        CHECK(std::fabs(std::stod(cell(depth, row, "first_crossing_depth_m")) - l.crossing_depth) <= 0.05);
        CHECK(std::fabs(std::stod(cell(depth, row, "first_crossing_dcff_MPa")) - l.crossing_dcff / 1e6) <= 5e-7);
      } else {
        CHECK(cell(depth, row, "first_crossing_depth_m").empty());
      }
    }
    CHECK(std::fabs(closest - l.closest_margin / 1e6) <= 5e-7);
    crossings += l.first_crossing.has_value();
    // P(slip by the last date) and its interval: the table's row at 2035-01-01 (4 decimals)
    bool found = false;
    for (std::size_t row = 0; row < prob.rows.size(); ++row)
      if (cell(prob, row, "segment_id") == l.segment_id && cell(prob, row, "date") == "2035-01-01") {
        found = true;
        CHECK(std::fabs(std::stod(cell(prob, row, "p_slip")) - *l.p_final) <= 5e-5);
        CHECK(std::fabs(std::stod(cell(prob, row, "p_slip_ci_low")) - *l.ci_low) <= 5e-5);
        CHECK(std::fabs(std::stod(cell(prob, row, "p_slip_ci_high")) - *l.ci_high) <= 5e-5);
      }
    CHECK(found);
  }
  CHECK(crossings == d.crossing_count);
}
