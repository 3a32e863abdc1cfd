#include "screening/run_cost.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>

#include "core/errors.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "run/run_scenario.hpp"
#include "screening/probabilistic_screen.hpp"
#include "support/run_options_fixture.hpp"
#include "support/scenario_fixture.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;
using namespace slipscreen::screening;
using slipscreen::test::TinyScenario;

namespace {

// The engines' similarity-table node count from the exact largest source-to-point distance
// (core/screen/deterministic_screen.cpp and core/probabilistic/pressure_model.cpp compute it so).
std::size_t exact_table_nodes(const PreparedRun& p, double d_min, double d_max) {
  double rw_min = 1e300, r2_max = 1.0;
  for (const auto& w : p.inputs.wells) {
    rw_min = std::min(rw_min, w.radius);
    for (const auto& src : hydro::image_wells(w.x, w.y, p.inputs.boundaries))
      for (const auto& seg : p.inputs.segments)
        for (const auto& c : seg.check_points)
          r2_max = std::max(r2_max, (c.x - src.x) * (c.x - src.x) + (c.y - src.y) * (c.y - src.y));
  }
  return hydro::SimilarityGrid{std::log(rw_min * rw_min / (4.0 * d_max)) - 0.1, std::log(r2_max / (4.0 * d_min)) + 0.1,
                               0.025}
      .node_count();
}

}  // namespace

TEST_CASE("the cost formulas, by hand for one set of sizes") {
  RunSizes z;
  z.wells = 1000, z.sources = 1000, z.segments = 100, z.check_points = 300, z.block_points = 192;
  z.output_times = 10, z.tracked_times = 120, z.lags = 3650, z.table_nodes = 1000;
  z.all_well_shares = true;
  const RunCost c = run_cost(z);
  // Arithmetic from the formulas of run_cost.hpp:
  //   results 100 × (10 × 1000 + 120 + 4 × 10) × 8 = 8 128 000 B
  //   tables  1000 × 1000 × 120 × 4 = 480 000 000 B
  //   kernel  (3650 + 1) × 1000 × 4 = 14 604 000 B (larger than one block, 192 × 25 960 = 4 984 320 B)
  //   inputs  600 × 1000 = 600 000 B
  REQUIRE(c.parts.size() == 5);
  CHECK(c.parts[0].bytes == 600000.0);
  CHECK(c.parts[1].bytes == 8128000.0 + 480000000.0 + 14604000.0);
  CHECK(c.parts[2].bytes == 0.0);  // no probabilistic screen
  CHECK(c.parts[3].bytes == 0.0);  // no raster
  CHECK(c.parts[4].bytes == 0.0);  // no screen in depth
  CHECK(c.peak_bytes == 600000.0 + 502732000.0);
  // Only the leading wells kept (no tables): results 100 × (120 + 4 × 10) × 8 = 128 000 B.
  RunSizes lean = z;
  lean.all_well_shares = false;
  CHECK(run_cost(lean).parts[1].bytes == 128000.0 + 480000000.0 + 14604000.0);
  // The screen in depth (model = "poroelastic_3d"), 900 points with their levels and 50 rate
  // steps: 100 × 10 × 48 + 900 × 64 = 105 600 B on top; 900 × 120 × 50 × 6 = 3.24e7 responses;
  // with 10 realizations of its Monte Carlo, 11 screens.
  RunSizes zd = z;
  zd.depth_points = 900, zd.rate_steps = 50;
  const RunCost cd = run_cost(zd);
  CHECK(cd.parts[4].bytes == 105600.0);
  CHECK(cd.parts[4].operations == 3.24e7 * kDepthResponseCost);  // each response costs that many E1
  CHECK(cd.peak_bytes == c.peak_bytes + 105600.0);
  zd.depth_realizations = 10;
  CHECK(run_cost(zd).parts[4].operations == 11.0 * 3.24e7 * kDepthResponseCost);
  // Twice the wells: tables, shares and inputs double; the kernel does not.
  RunSizes z2 = z;
  z2.wells = 2000, z2.sources = 2000;
  CHECK(run_cost(z2).peak_bytes > 1.9 * c.peak_bytes);
}

TEST_CASE("a probability map beyond the segments' tables costs its own tables and their lag kernel") {
  RunSizes z;
  z.wells = 100, z.sources = 100, z.segments = 50, z.check_points = 150, z.faults = 10;
  z.output_times = 5, z.rate_steps = 2000, z.lags = 3000, z.realizations = 1000, z.sampled_inputs = 8;
  z.mc_times = 100, z.mc_table_nodes = 800, z.surrogate_nodes = 16, z.map_points = 400;
  RunSizes wide = z;
  wide.map_table_nodes = 1000;  // the farthest pixel needs 200 more nodes: the map builds its own
  const CostPart narrow_part = run_cost(z).parts[2], wide_part = run_cost(wide).parts[2];
  // Arithmetic from the formulas of run_cost.cpp: the kernel's 3000 lags and the tables' 2000 rate
  // steps × 100 tracking times, at 1000 nodes each.
  CHECK(wide_part.operations - narrow_part.operations == (3000.0 + 2000.0 * 100.0) * 1000.0);
  CHECK(wide_part.bytes >= narrow_part.bytes);
}

TEST_CASE("a leaky formation costs its W(u, r/B): the estimate exceeds the Theis one by the measured factors") {
  // The tiny scenario (three wells, rate histories from 2020) and the same with the leaky
  // formation of tests/data/scenario/physics_paths.toml (B = 14 km), each with a small
  // [uncertainty] on the permeability (the one formation input a leaky run may vary,
  // docs/pressure.md).
  TinyScenario t;
  const std::string uncertain = "\n[uncertainty]\nrealizations = 20\n\n[uncertainty.formation]\n"
                                "permeability = \"lognormal(median=200 mD, sigma_ln=0.3)\"\n";
  t.write("theis.toml", t.read("scenario.toml") + uncertain);
  t.write("leaky.toml", t.read("theis.toml"));
  t.replace("leaky.toml", "[region.override.formation]\n",
            "[region.override.formation]\nmodel = \"leaky\"\n"
            "leakage = { aquitard_thickness = \"20 m\", aquitard_permeability = \"0.001 mD\" }\n");
  const auto sl = scenario::load_scenario(t.dir() / "leaky.toml"), st = scenario::load_scenario(t.dir() / "theis.toml");
  REQUIRE(sl.region.formation.leaky);
  REQUIRE(!st.region.formation.leaky);
  const RunSizes zl = run_sizes(sl, prepare_run(sl, false)), zt = run_sizes(st, prepare_run(st, false));
  CHECK(zl.leaky);
  CHECK(!zt.leaky);
  // the same sizes: B changes what is evaluated, not how often
  CHECK(zl.lags == zt.lags);
  CHECK(zl.table_nodes == zt.table_nodes);
  CHECK(zl.mc_table_nodes == zt.mc_table_nodes);
  CHECK(zl.raster_cells == zt.raster_cells);
  REQUIRE(zl.realizations == 20);
  REQUIRE(zl.raster_cells > 0);
  const RunCost cl = run_cost(zl), ct = run_cost(zt);
  // deterministic screen: the lag kernel's L × n_x W at kLeakyKernelCost E1 each, and the exact
  // output-time sums, S × sources × K × steps per well, at kLeakyTermCost
  const double kernel = static_cast<double>(zl.lags) * static_cast<double>(zl.table_nodes);
  const double exact = static_cast<double>(zl.segments) * static_cast<double>(zl.sources) *
                       static_cast<double>(zl.output_times) * static_cast<double>(zl.rate_steps) /
                       static_cast<double>(zl.wells);
  CHECK(cl.parts[1].operations - ct.parts[1].operations ==
        doctest::Approx((kLeakyKernelCost - 1.0) * kernel + (kLeakyTermCost - 1.0) * exact).epsilon(1e-12));
  // probabilistic screen: its own lag kernel over the sampled range of D, and the map's (its
  // pixels reach beyond the segments' tables here)
  REQUIRE(zl.map_table_nodes > 0);
  CHECK(zl.map_table_nodes == zt.map_table_nodes);
  CHECK(cl.parts[2].operations - ct.parts[2].operations ==
        doctest::Approx((kLeakyKernelCost - 1.0) * static_cast<double>(zl.lags) *
                        static_cast<double>(zl.mc_table_nodes + zl.map_table_nodes)).epsilon(1e-12));
  // pressure raster: summed directly, one W per cell, time, source and rate step
  CHECK(cl.parts[3].operations ==
        doctest::Approx(static_cast<double>(zl.raster_cells) * exact / static_cast<double>(zl.segments) *
                        kLeakyTermCost).epsilon(1e-12));
  // the kernel is the bulk of a Theis screen's work here, so the leaky estimate is over a
  // thousand times the Theis one (not vacuous: the factors are in the estimate's total)
  CHECK(cl.operations > 1000.0 * ct.operations);
  CHECK(cost_line(cl, 0).find("leaky formation") != std::string::npos);
}

TEST_CASE("the sizes of the tiny scenario are those the engines use") {
  TinyScenario t;
  const auto s = scenario::load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  const RunSizes z = run_sizes(s, p);
  CHECK(z.wells == 3);
  CHECK(z.sources == 3);
  CHECK(z.segments == p.segments.size());
  CHECK(z.check_points == 3 * p.segments.size());
  CHECK(z.output_times == 3);
  CHECK(z.raster_cells == 120);  // the fixture's 12 km × 10 km grid of 1 km cells
  CHECK(z.realizations == 0);
  const screen::ScreenResult r = screen::deterministic_screen(p.inputs);
  CHECK(z.tracked_times == r.tracked_times.size());
  // Whole days from the first injection (2020-01-01) to the last output time (2023-01-01): 1096,
  // plus one (the lag kernel's rows, hydro::build_tables).
  CHECK(z.lags == 1097);
  // The estimate bounds r_max by boxes: at most ln 2 more in ln r², i.e. 28 more nodes of 0.025.
  const double d = p.inputs.formation.diffusivity;
  const std::size_t exact = exact_table_nodes(p, d, d);
  CHECK(z.table_nodes >= exact);
  CHECK(z.table_nodes <= exact + 28);
}

TEST_CASE("the probabilistic sizes bound what the run samples") {
  TinyScenario t;
  t.append("scenario.toml",
           "\n[uncertainty]\nrealizations = 300\n[uncertainty.formation]\n"
           "permeability = \"lognormal(median=200 mD, sigma_ln=0.4)\"\n[uncertainty.well.\"P1\"]\nrate_factor = \"uniform(0.8, 1.2)\"\n");
  const auto s = scenario::load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  const RunSizes z = run_sizes(s, p);
  const ProbabilisticRun run = run_probabilistic_screen(s, p, s.uncertainty);
  CHECK(z.realizations == 300);
  CHECK(z.rate_groups == 2);  // all wells, and P1 with its own factor
  CHECK(z.sampled_inputs == run.result.input_names.size() - 2);  // less the two orientation perturbations
  CHECK(z.mc_times == run.tracked_times.size());
  CHECK(z.map_points == run.map_grid.cell_count());
  // Chebyshev nodes of the engine (core/probabilistic/pressure_model.hpp): 8 per e-fold of the
  // sampled D_max/D_min, at least 4. The estimate draws D as the run does (every realization of
  // this scenario is valid), so the count is the run's.
  const double spread = std::log(run.result.diffusivity_max / run.result.diffusivity_min);
  const auto nodes = std::clamp<std::size_t>(static_cast<std::size_t>(std::ceil(8.0 * spread)), 4, 64);
  CHECK(run.result.rejected == 0);
  CHECK(z.surrogate_nodes == nodes);
  const std::size_t exact = exact_table_nodes(p, run.result.diffusivity_min, run.result.diffusivity_max);
  CHECK(z.mc_table_nodes >= exact);
  CHECK(z.mc_table_nodes <= exact + 28);
  const RunCost c = run_cost(z);
  CHECK(c.parts[2].bytes > 0.0);
  CHECK(c.parts[2].operations > 0.0);
}

TEST_CASE("beyond a million realizations the range of D is bounded by quantiles") {
  TinyScenario t;
  t.append("scenario.toml",
           "\n[uncertainty]\nrealizations = 2000000\n[uncertainty.formation]\n"
           "permeability = \"lognormal(median=200 mD, sigma_ln=0.4)\"\n");
  const auto s = scenario::load_scenario(t.scenario());
  const RunSizes z = run_sizes(s, prepare_run(s, false));
  // ln(D_max/D_min) = 2 × 0.4 × z with z the standard normal quantile at 1 − 0.01/2e6 = 1 − 5e-9:
  // 5.730728869 (Python's statistics.NormalDist().inv_cdf), so 8 × 4.58458 = 36.7 → 37 nodes.
  CHECK(z.surrogate_nodes == 37);
}

TEST_CASE("wells that never inject still cost their tables: a large wells file is refused with the estimate") {
  TinyScenario t;
  std::ofstream wells(t.dir() / "wells.csv");
  wells << "# crs: EPSG:32708\nid,x,y,top [m],bottom [m],radius,status\n";
  for (int i = 0; i < 20000; ++i)  // invented wells on a 100 × 200 lattice around the faults
    wells << 'W' << i + 1 << ',' << 495000 + 50 * (i % 100) << ',' << 6115000 + 50 * (i / 100) << ",2900,3000,0.1 m,active\n";
  wells.close();
  t.replace("scenario.toml", "seed = 42", "seed = 42\nmemory_limit = \"1 GB\"");
  const auto s = scenario::load_scenario(t.scenario());
  const PreparedRun p = prepare_run(s, false);
  const RunCost c = estimate_run_cost(s, p);
  const RunSizes& z = c.sizes;
  CHECK(z.wells == 20001);
  // The deterministic tables alone: W × n_x × G × 4 bytes.
  CHECK(c.parts[1].bytes >= double(z.wells) * double(z.table_nodes) * double(z.tracked_times) * 4.0);
  CHECK(c.peak_bytes > 1e9);
  CHECK(memory_limit_bytes(s) == 1e9);
  CHECK_THROWS_WITH_AS(refuse_beyond_memory(c, memory_limit_bytes(s), s.file),
                       doctest::Contains("refused: the run would need about"), RefusedError);
  // The run refuses before any computing and leaves no folder.
  const fs::path out = t.dir() / "runs" / "big";
  CHECK_THROWS_WITH_AS(run::run_scenario(s, test::options_into(out)), doctest::Contains("more than the limit of 1 GB"),
                       RefusedError);
  CHECK_FALSE(fs::exists(out));
}

TEST_CASE("the console line and the limits") {
  RunCost c;
  c.sizes.wells = 31, c.sizes.rate_steps = 404, c.sizes.segments = 214, c.sizes.check_points = 1070;
  c.sizes.realizations = 2000, c.sizes.raster_cells = 6278;
  c.operations = 2.1e10;
  c.peak_bytes = 6.4e8;
  c.parts = {{"deterministic screen", 6.4e8, 2.1e10}};
  CHECK(cost_line(c, 2.34e10) ==
        "Estimated cost: 31 wells x 404 rate steps, 214 segments x 5 points, 2000 realizations, 6278 raster cells: "
        "~2.1e10 operations, peak memory ~640 MB (limit 23.4 GB)");
  CHECK(bytes_text(999.0) == "999 B");
  CHECK(bytes_text(1.5e12) == "1.5 TB");
  CHECK_NOTHROW(refuse_beyond_memory(c, 6.4e8, "s.toml"));  // at the limit
  CHECK_THROWS_WITH_AS(refuse_beyond_memory(c, 6.3e8, "s.toml"),
                       doctest::Contains("s.toml: refused: the run would need about 640 MB of memory (most of it for the "
                                         "deterministic screen, 640 MB), more than the limit of 630 MB"),
                       RefusedError);
  CHECK(physical_memory_bytes() > 0.0);
}
