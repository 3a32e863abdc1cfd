// End-to-end probabilistic runs of the tiny scenario (tests/data/scenario/tiny) with an
// [uncertainty] table: the extra outputs, their consistency with the deterministic screen,
// byte-identical reruns for 1 and 2 threads, and the GeoPackage probability columns.
#include "screening/probabilistic_screen.hpp"

#include <doctest/doctest.h>

#include <gdal_priv.h>
#include <omp.h>
#include <ogrsf_frmts.h>

#include <filesystem>
#include <map>
#include <tuple>

#include "formats/table/csv.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"
#include "core/util/civil_date.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::formats;
using namespace slipscreen::scenario;
using namespace slipscreen::screening;
using namespace slipscreen::run;
using slipscreen::test::slurp;
using slipscreen::test::TinyScenario;
constexpr auto into = slipscreen::test::options_into;

namespace {

const char* kUncertainty =
    "\n[uncertainty]\nrealizations = 300\nsampler = \"latin-hypercube\"\nthresholds = [0.05, 0.5]\n"
    "[uncertainty.formation]\npermeability = \"lognormal(median=200 mD, sigma_ln=0.4)\"\n"
    "[uncertainty.faults]\nfriction = \"truncnormal(mean=0.6, sd=0.05, min=0.4, max=0.8)\"\n"
    "[uncertainty.maps]\nstrike = \"30 deg\"\ndip = \"70 deg\"\n";

// The tiny scenario with every input fixed (20 identical realizations), run into <dir>/fixed.
fs::path run_all_fixed(TinyScenario& t) {
  t.append("scenario.toml", "\n[uncertainty]\nrealizations = 20\n");
  const fs::path out = t.dir() / "fixed";
  run_scenario(load_scenario(t.scenario()), into(out));
  return out;
}

std::size_t column_of(const CsvTable& tb, const char* name) {
  const auto c = tb.column(name);
  REQUIRE(c.has_value());
  return *c;
}

}  // namespace

TEST_CASE("a scenario with [uncertainty] adds the probabilistic outputs") {
  TinyScenario t;
  t.append("scenario.toml", kUncertainty);
  const ResolvedScenario s = load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "p";
  const RunSummary r = run_scenario(s, into(out));
  REQUIRE(r.probabilistic.has_value());
  CHECK(r.probabilistic->realizations + r.probabilistic->rejected == 300);
  for (const char* f : {"segment_probability.csv", "segment_probability_summary.csv", "sensitivity.csv",
                        "median_well_shares.csv", "slip_probability_dangerous.tif", "slip_probability_oriented.tif"}) {
    CAPTURE(f);
    CHECK(std::find(r.files.begin(), r.files.end(), f) != r.files.end());
  }
  // One row per segment and output time; P non-decreasing in time and inside its interval.
  const CsvTable tidy = read_csv(out / "segment_probability.csv", "segment_probability.csv");
  CHECK(tidy.rows.size() == r.segment_count * s.output.times.size());
  const auto col = [&](const char* name) {
    const auto c = tidy.column(name);
    REQUIRE(c.has_value());
    return *c;
  };
  const std::size_t cp = col("p_slip"), lo = col("p_slip_ci_low"), hi = col("p_slip_ci_high"), sid = col("segment_id");
  for (std::size_t i = 0; i < tidy.rows.size(); ++i) {
    const double p = std::stod(tidy.rows[i].fields[cp]);
    CHECK(std::stod(tidy.rows[i].fields[lo]) <= p);
    CHECK(p <= std::stod(tidy.rows[i].fields[hi]));
    if (i > 0 && tidy.rows[i].fields[sid] == tidy.rows[i - 1].fields[sid]) CHECK(p >= std::stod(tidy.rows[i - 1].fields[cp]));
  }
  // Median well attribution: the shares of each (segment, date) group add up to 1 (6 decimals
  // per row), and every group names the same median realization on all its rows.
  const CsvTable med = read_csv(out / "median_well_shares.csv", "median_well_shares.csv");
  REQUIRE(!med.rows.empty());
  const std::size_t ms = column_of(med, "segment_id"), md = column_of(med, "date"), msh = column_of(med, "share"),
                    mr = column_of(med, "median_realization");
  std::map<std::pair<std::string, std::string>, std::pair<double, std::size_t>> groups;
  std::map<std::pair<std::string, std::string>, std::string> realization;
  for (const auto& row : med.rows) {
    const auto key = std::make_pair(row.fields[ms], row.fields[md]);
    groups[key].first += std::stod(row.fields[msh]);
    ++groups[key].second;
    const auto [it, added] = realization.emplace(key, row.fields[mr]);
    CHECK(it->second == row.fields[mr]);
  }
  for (const auto& [key, g] : groups) {
    CAPTURE(key.first);
    CAPTURE(key.second);
    CHECK(std::abs(g.first - 1.0) <= 5e-7 * static_cast<double>(g.second) + 1e-12);
  }
  // The GeoPackage fault layer carries one probability column per output time.
  GDALAllRegister();
  auto* ds = static_cast<GDALDataset*>(GDALOpenEx((out / "screen.gpkg").c_str(), GDAL_OF_VECTOR, nullptr, nullptr, nullptr));
  REQUIRE(ds != nullptr);
  OGRLayer* segs = ds->GetLayerByName("fault_segments");
  REQUIRE(segs != nullptr);
  CHECK(segs->GetLayerDefn()->GetFieldIndex("p_slip_2023_01_01") >= 0);
  CHECK(segs->GetLayerDefn()->GetFieldIndex("p_already_critical") >= 0);
  GDALClose(ds);
  // The probability rasters have one band per output time, named by date.
  auto* tif = static_cast<GDALDataset*>(GDALOpen((out / "slip_probability_dangerous.tif").c_str(), GA_ReadOnly));
  REQUIRE(tif != nullptr);
  CHECK(tif->GetRasterCount() == static_cast<int>(s.output.times.size()));
  CHECK(std::string(tif->GetRasterBand(1)->GetDescription()) == "2021-01-01");
  GDALClose(tif);
}

TEST_CASE("probabilistic outputs are byte-identical for reruns with 1 and 2 threads") {
  TinyScenario t;
  t.append("scenario.toml", kUncertainty);
  const ResolvedScenario s = load_scenario(t.scenario());
  const int before = omp_get_max_threads();
  omp_set_num_threads(1);
  run_scenario(s, into(t.dir() / "one"));
  omp_set_num_threads(2);
  run_scenario(s, into(t.dir() / "two"));
  omp_set_num_threads(before);
  for (const char* f : {"segment_probability.csv", "segment_probability_summary.csv", "sensitivity.csv",
                        "median_well_shares.csv", "slip_probability_dangerous.tif", "screen.gpkg", "manifest.json"}) {
    CAPTURE(f);
    CHECK(slurp(t.dir() / "one" / f) == slurp(t.dir() / "two" / f));
  }
}

TEST_CASE("all inputs fixed: the probabilistic screen agrees with the deterministic one") {
  TinyScenario t;
  const fs::path out = run_all_fixed(t);
  const CsvTable det = read_csv(out / "segments.csv", "segments.csv");
  const CsvTable pro = read_csv(out / "segment_probability_summary.csv", "segment_probability_summary.csv");
  REQUIRE(det.rows.size() == pro.rows.size());
  const std::size_t first = column_of(det, "first_crossing_date"), p = column_of(pro, "p_slip_final"),
                    crit = column_of(pro, "p_already_critical");
  for (std::size_t i = 0; i < det.rows.size(); ++i) {
    CAPTURE(i);
    const double pf = std::stod(pro.rows[i].fields[p]) + std::stod(pro.rows[i].fields[crit]);
    CHECK((pf == 0.0 || pf == 1.0));  // degenerate distributions: every realization is the same
    // Reached by the last output time in the deterministic screen <=> P = 1 (or already critical).
    CHECK((det.rows[i].fields[first].empty() ? 0.0 : 1.0) == std::stod(pro.rows[i].fields[p]));
  }
}

TEST_CASE("all inputs fixed: the median well attribution is the deterministic well attribution") {
  TinyScenario t;
  const fs::path out = run_all_fixed(t);
  const CsvTable det = read_csv(out / "well_shares.csv", "well_shares.csv");
  const CsvTable times = read_csv(out / "segment_times.csv", "segment_times.csv");
  const CsvTable med = read_csv(out / "median_well_shares.csv", "median_well_shares.csv");
  const auto col = column_of;
  using Key = std::tuple<std::string, std::string, std::string>;  // segment, date, well
  std::map<Key, double> det_share;
  for (const auto& r : det.rows)
    det_share[{r.fields[col(det, "segment_id")], r.fields[col(det, "date")], r.fields[col(det, "well_id")]}] =
        std::stod(r.fields[col(det, "share")]);
  std::map<std::pair<std::string, std::string>, std::string> det_point;
  for (const auto& r : times.rows)
    det_point[{r.fields[col(times, "segment_id")], r.fields[col(times, "date")]}] = r.fields[col(times, "check_point")];
  std::map<Key, double> med_share;
  for (const auto& r : med.rows) {
    const std::string seg = r.fields[col(med, "segment_id")], date = r.fields[col(med, "date")];
    CAPTURE(seg);
    CAPTURE(date);
    CHECK(r.fields[col(med, "median_realization")] == "9");  // identical realizations: rank ⌊(20 − 1)/2⌋
    CHECK(r.fields[col(med, "check_point")] == det_point.at({seg, date}));
    const std::string well = r.fields[col(med, "well_id")];
    if (well.empty()) continue;  // the row of the remaining wells
    med_share[{seg, date, well}] = std::stod(r.fields[col(med, "share")]);
  }
  REQUIRE(!med_share.empty());
  // Every well with a deterministic share of at least 1 % has its row, with the same share to the
  // table accuracy (1e-6 of the wells' near-field scale, similarity_table.hpp) and 6 decimals.
  std::size_t compared = 0;
  for (const auto& [key, share] : det_share) {
    if (share < 0.01) continue;
    CAPTURE(std::get<0>(key));
    CAPTURE(std::get<1>(key));
    CAPTURE(std::get<2>(key));
    const auto it = med_share.find(key);
    REQUIRE(it != med_share.end());
    CHECK(std::abs(it->second - share) <= 2e-6);
    ++compared;
  }
  CHECK(compared == med_share.size());
}

TEST_CASE("first dates reaching a threshold: the tracking grid's brute-force scan, never after the output dates") {
  TinyScenario t;
  t.append("scenario.toml", kUncertainty);
  const ResolvedScenario s = load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  std::vector<std::uint64_t> all(300);
  for (std::uint64_t i = 0; i < all.size(); ++i) all[i] = i;
  std::vector<std::size_t> segments(p.segments.size());
  for (std::size_t i = 0; i < segments.size(); ++i) segments[i] = i;
  const ProbabilisticRun run = run_probabilistic_screen(s, p, s.uncertainty, all, segments);
  const double n = static_cast<double>(run.result.realizations);
  const std::size_t K = s.output.times.size();
  int reached = 0, earlier = 0;
  for (std::size_t i = 0; i < segments.size(); ++i)
    for (double th : {0.01, 0.05, 0.1, 0.25, 0.5}) {
      // Brute force: every valid realization's own first crossing (the audit), counted at every
      // tracking time; injection-induced only (0 < Δp_crit < ∞).
      std::string expected;
      for (std::size_t k = 0; k < run.tracked_times.size() && expected.empty(); ++k) {
        double slipped = 0;
        for (const auto& a : run.result.audit)
          if (a.segment == i && a.dp_crit > 0 && std::isfinite(a.dp_crit) && a.first_crossing >= 0 &&
              static_cast<std::size_t>(a.first_crossing) <= k)
            ++slipped;
        if (slipped / n >= th) expected = util::format_iso_date(util::date_at(run.tracked_times[k]));
      }
      std::string at_output;
      for (std::size_t k = 0; k < K && at_output.empty(); ++k)
        if (slip_probability(run, i, k) >= th) at_output = util::format_iso_date(s.output.dates[k]);
      CAPTURE(i);
      CAPTURE(th);
      CHECK(first_date_reaching(run, i, th) == expected);
      CHECK(expected.empty() == at_output.empty());  // the grid ends at the last output time
      CHECK(expected <= at_output);                  // ISO dates order as text
      reached += !expected.empty();
      earlier += !expected.empty() && expected < at_output;
    }
  MESSAGE("thresholds reached: " << reached << ", of which before the first output date at the threshold: " << earlier);
  CHECK(reached >= 1);
}
