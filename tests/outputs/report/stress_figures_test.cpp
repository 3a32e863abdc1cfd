// The stress figures (Mohr diagrams, Δp_crit distribution, sensitivity) against the run tables
// they are drawn from: the tiny scenario (deterministic only) and the demo run (every screen).
#include "outputs/report/stress_figures.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "outputs/report/figure_checks.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"
#include "support/demo_run_fixture.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::outputs::report;
using slipscreen::test::FigureRows;
using slipscreen::test::read_rows;
using slipscreen::test::Rows;

namespace {

// Every Mohr figure's numbers against segments.csv: the circles from the principal stresses
// and p0, the segments' points, and Δp_crit's mark on the Coulomb line.
void check_mohr(const Figure& f, const Rows& seg) {
  const FigureRows d{f.data};
  std::vector<std::size_t> rows;  // segments.csv rows of this figure's segments, in file order
  std::set<std::string> ids;
  for (auto i : d.where("element", "before_injection")) ids.insert(d.at(i, "segment_id"));
  for (std::size_t i = 0; i < seg.size(); ++i)
    if (ids.count(seg.at(i, "segment_id"))) rows.push_back(i);
  REQUIRE(rows.size() == ids.size());
  const std::size_t r0 = rows.front();
  const double s1 = seg.number(r0, "s1_MPa"), s2 = seg.number(r0, "s2_MPa"), s3 = seg.number(r0, "s3_MPa"),
               p0 = seg.number(r0, "pore_pressure_MPa");
  CHECK(s1 >= s2);
  CHECK(s2 >= s3);
  // Mohr (1900): centre (Si + Sj)/2 − p, radius (Si − Sj)/2 (docs/geomechanics.md).
  const std::map<std::string, std::pair<double, double>> circles = {
      {"circle_s1_s3", {(s1 + s3) / 2 - p0, (s1 - s3) / 2}},
      {"circle_s1_s2", {(s1 + s2) / 2 - p0, (s1 - s2) / 2}},
      {"circle_s2_s3", {(s2 + s3) / 2 - p0, (s2 - s3) / 2}}};
  for (const auto& [name, cr] : circles) {
    const auto at = d.where("element", name);
    REQUIRE(at.size() == 1);
    CHECK(d.number(at[0], "sigma_n_eff_MPa") == doctest::Approx(cr.first).epsilon(1e-12));
    CHECK(d.number(at[0], "radius_MPa") == doctest::Approx(cr.second).epsilon(1e-12));
  }
  const auto before = d.where("element", "before_injection");
  const auto peak = d.where("element", "at_peak_dp");
  REQUIRE(before.size() == rows.size());
  REQUIRE(peak.size() == rows.size());
  for (std::size_t k = 0; k < rows.size(); ++k) {
    const std::size_t r = rows[k];
    CHECK(d.at(before[k], "segment_id") == seg.at(r, "segment_id"));
    CHECK(d.number(before[k], "sigma_n_eff_MPa") == doctest::Approx(seg.number(r, "sigma_n_eff_MPa")).epsilon(1e-12));
    CHECK(d.number(before[k], "tau_MPa") == doctest::Approx(seg.number(r, "tau_MPa")).epsilon(1e-12));
    // σn′ = σn − p0 in the table itself.
    CHECK(std::abs(seg.number(r, "sigma_n_MPa") - p0 - seg.number(r, "sigma_n_eff_MPa")) < 2e-4);
    CHECK(std::abs(d.number(peak[k], "sigma_n_eff_MPa") -
                   (seg.number(r, "sigma_n_eff_MPa") - seg.number(r, "peak_dp_MPa"))) < 1e-9);
    CHECK(d.number(peak[k], "dp_MPa") == doctest::Approx(seg.number(r, "peak_dp_MPa")).epsilon(1e-12));
  }
  // Δp_crit's mark lies on the Coulomb line τ = c + μσn′ (Jaeger, Cook & Zimmerman 2007): an
  // independent check of the screen's Δp_crit from the table's own σn′, τ, μ and c, to the
  // tables' rounding (4 decimals of MPa).
  for (auto i : d.where("element", "dp_crit")) {
    const auto r = *std::find_if(rows.begin(), rows.end(),
                                 [&](std::size_t x) { return seg.at(x, "segment_id") == d.at(i, "segment_id"); });
    const double mu = seg.number(r, "friction"), c = seg.number(r, "cohesion_MPa");
    CHECK(d.number(i, "dp_MPa") == doctest::Approx(seg.number(r, "dp_crit_MPa")).epsilon(1e-12));
    CHECK(std::abs(d.number(i, "tau_MPa") - (c + mu * d.number(i, "sigma_n_eff_MPa"))) < 5e-4);
  }
  CHECK(!d.where("element", "coulomb_line").empty());
}

}  // namespace

TEST_CASE("Mohr diagrams of the tiny scenario match segments.csv, most critical fault first") {
  test::TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const fs::path out = t.dir() / "runs" / "tiny";
  run::run_scenario(s, test::options_into(out));
  const auto figures = stress_figures(test::source_of(out));
  const Rows seg = read_rows(out, "segments.csv");
  std::set<std::string> faults;
  for (std::size_t i = 0; i < seg.size(); ++i) faults.insert(seg.at(i, "fault_id"));
  // No probabilistic screen: only the Mohr diagrams, one per fault (2 faults, at most 5 shown).
  REQUIRE(figures.size() == faults.size());
  // Ordered by the smallest margin over the fault's segments.
  std::vector<double> margins;
  for (const auto& f : figures) {
    CHECK(f.name.rfind("mohr_", 0) == 0);
    check_mohr(f, seg);
    double m = INFINITY;
    const FigureRows d{f.data};
    for (auto i : d.where("element", "before_injection"))
      for (std::size_t r = 0; r < seg.size(); ++r)
        if (seg.at(r, "segment_id") == d.at(i, "segment_id")) m = std::min(m, seg.number(r, "margin_MPa"));
    margins.push_back(m);
    pugi::xml_document doc;
    test::parse_svg(f, doc);
  }
  CHECK(std::is_sorted(margins.begin(), margins.end()));
}

TEST_CASE("stress figures of the demo run: Mohr, dp_crit distribution and sensitivity match their tables") {
  const fs::path run = test::demo_run_folder();
  const auto figures = stress_figures(test::source_of(run));
  test::write_for_viewing(figures);
  const Rows seg = read_rows(run, "segments.csv");
  std::size_t mohr = 0;
  const Figure* dist = nullptr;
  const Figure* sens = nullptr;
  for (const auto& f : figures) {
    pugi::xml_document doc;
    test::parse_svg(f, doc);
    if (f.name.rfind("mohr_", 0) == 0) {
      ++mohr;
      check_mohr(f, seg);
    }
    if (f.name == "dp_crit_distribution") dist = &f;
    if (f.name == "sensitivity") sens = &f;
  }
  CHECK(mohr == 5);
  REQUIRE(dist != nullptr);
  REQUIRE(sens != nullptr);

  SUBCASE("the dp_crit distribution is dp_crit_quantiles.csv's top five segments, row by row") {
    const Rows q = read_rows(run, "dp_crit_quantiles.csv");
    const FigureRows d{dist->data};
    const auto rows = d.where("what", "dp_crit");
    std::size_t k = 0;
    for (std::size_t i = 0; i < q.size(); ++i) {
      if (q.number(i, "rank") > 5) continue;
      REQUIRE(k < rows.size());
      CHECK(d.at(rows[k], "segment_id") == q.at(i, "segment_id"));
      CHECK(d.number(rows[k], "quantile") == doctest::Approx(q.number(i, "quantile")).epsilon(1e-12));
      CHECK(d.number(rows[k], "dp_MPa") == doctest::Approx(q.number(i, "dp_crit_MPa")).epsilon(1e-12));
      if (k > 0 && d.at(rows[k - 1], "segment_id") == d.at(rows[k], "segment_id"))
        CHECK(d.number(rows[k], "dp_MPa") >= d.number(rows[k - 1], "dp_MPa"));  // a CDF
      ++k;
    }
    CHECK(k == rows.size());
    CHECK(k == 5 * 99);
    // The same sketch as segment_probability_summary.csv's P5/P50/P95 (4 decimals there).
    const Rows sum = read_rows(run, "segment_probability_summary.csv");
    for (std::size_t i = 0; i < q.size(); ++i)
      for (const auto& [level, col] : std::map<std::string, std::string>{
               {"0.05", "dp_crit_p05_MPa"}, {"0.50", "dp_crit_p50_MPa"}, {"0.95", "dp_crit_p95_MPa"}})
        if (q.at(i, "quantile") == level)
          for (std::size_t r = 0; r < sum.size(); ++r)
            if (sum.at(r, "segment_id") == q.at(i, "segment_id"))
              CHECK(std::abs(q.number(i, "dp_crit_MPa") - sum.number(r, col)) < 1e-4);
    // Ranked by final P(slip), highest first.
    double previous = 2;
    for (std::size_t i = 0; i < q.size(); i += 99)
      for (std::size_t r = 0; r < sum.size(); ++r)
        if (sum.at(r, "segment_id") == q.at(i, "segment_id")) {
          CHECK(sum.number(r, "p_slip_final") <= previous);
          previous = sum.number(r, "p_slip_final");
        }
    // The modelled Δp: the median at the last output time of segment_probability.csv.
    const Rows p = read_rows(run, "segment_probability.csv");
    std::string last;
    for (std::size_t i = 0; i < p.size(); ++i) last = std::max(last, p.at(i, "date"));
    const auto medians = d.where("what", "dp_p50");
    CHECK(medians.size() == 5);
    for (auto m : medians) {
      CHECK(d.at(m, "date") == last);
      bool found = false;
      for (std::size_t i = 0; i < p.size(); ++i)
        if (p.at(i, "date") == last && p.at(i, "segment_id") == d.at(m, "segment_id")) {
          CHECK(d.number(m, "dp_MPa") == doctest::Approx(p.number(i, "dp_p50_MPa")).epsilon(1e-12));
          found = true;
        }
      CHECK(found);
    }
  }

  SUBCASE("the sensitivity figure holds sensitivity.csv's values of the faults it shows") {
    const Rows t = read_rows(run, "sensitivity.csv");
    const FigureRows d{sens->data};
    REQUIRE(!d.data.rows.empty());
    for (std::size_t k = 0; k < d.data.rows.size(); ++k) {
      bool found = false;
      for (std::size_t i = 0; i < t.size(); ++i)
        if (t.at(i, "segment_id") == d.at(k, "segment_id") && t.at(i, "input") == d.at(k, "input")) {
          CHECK(d.number(k, "spearman_rho") == doctest::Approx(t.number(i, "spearman_rho")).epsilon(1e-12));
          CHECK(d.number(k, "p_slip_final") == doctest::Approx(t.number(i, "p_slip_final")).epsilon(1e-12));
          found = true;
        }
      CHECK(found);
    }
    // The faults shown are those with the highest final P(slip).
    std::set<std::string> shown;
    double lowest_shown = 2;
    for (std::size_t k = 0; k < d.data.rows.size(); ++k) {
      shown.insert(d.at(k, "fault_id"));
      lowest_shown = std::min(lowest_shown, d.number(k, "p_slip_final"));
    }
    CHECK(shown.size() <= 5);
    for (std::size_t i = 0; i < t.size(); ++i)
      if (!shown.count(t.at(i, "fault_id"))) CHECK(t.number(i, "p_slip_final") <= lowest_shown);
  }
}
