#pragma once
// What a run will cost, estimated from a prepared run before any computing (docs/scenario.md,
// "What a run costs"): the work (operations) and the peak memory of the big arrays the engines
// allocate, counted from the same sizes the engines use:
//
//   deterministic screen (core/screen/deterministic_screen.cpp)
//     similarity tables    W × n_x × G × 4 B        (one per well, single precision; built for
//                                                    every well, injecting or not)
//     lag kernel           (L + 1) × n_x × 4 B       (E1 at every node and whole-day lag)
//     results              S × (K·W + G + 2K) × 8 B  (each well's share at every output time)
//     one block of 64 segments: P_b × (W + 2·sources) × 8 B + P_b × G × 8 B
//   probabilistic screen (core/probabilistic/*)
//     realizations         N × (inputs × 8 + (2F + S + 2) × 4 + 24) B, twice while sampled,
//                          and a Latin hypercube's permutations, inputs × N × 4 B
//     similarity tables    W × n_x' × G' × 4 B and the lag kernel, over the sampled range of D
//     surrogate            P × groups × G' × n_d × 8 B (segments), M × groups × G' × n_d × 8 B (maps)
//     tracking, per thread (2K + 2⌈G'/24⌉ + 6) × N × 8 B; results S × (K + 1) sketches
//     (about 8 kB each) and the median's well attribution S × K × W × 8 B
//   screen in depth (core/poro/fault_screen.cpp), model = "poroelastic_3d" only
//     results              S × K × 48 B + P_d × 64 B; operations (1 + N_d) × P_d × G × (rate
//                          steps) × 6 point responses (6 Gauss–Legendre points per open
//                          interval; N_d realizations of its Monte Carlo), each kDepthResponseCost
//   pressure raster (core/hydro/pressure_grid.cpp)
//     values and the map   2 × C × K × 8 B; profile tables ≤ 512 MB; per thread 2 × sources ×
//                          n_r × 8 B (radial profiles of every source at one time)
//   inputs                 about 600 B per well and 120 B per rate period (wells in their
//                          several forms: scenario, working CRS, engines)
// with W wells, S segments, P check points (P_b in a block, P_d with their depth levels), K output times, G tracked times,
// L whole-day lags, n_x similarity nodes (ln x from r_w²/(4D) to r_max²/(4D), step 0.025),
// N realizations, F faults, n_d Chebyshev nodes in ln D, M map pixels, C raster cells, n_r
// radial profile nodes.
//
// Accuracy: the array sizes are exact where the engines' sizes are known before computing. The
// range of D, which sets the probabilistic screen's node counts, is drawn as the run draws it
// (the same sampler, seed and streams) up to 1e6 realizations; beyond, it is bounded by every
// input's quantiles at 0.01/N and 1 − 0.01/N (the extremes of N draws lie beyond with a chance
// of about 1%) combined at their worst. r_max is taken from the bounding boxes of the wells and check
// points (at most ln 2 more in ln r², under 30 extra similarity nodes). Small objects (strings,
// per-segment headers, the catalog) are left out. Operations count multiply-adds and E1
// evaluations alike; they rank runs and show growth, not seconds. The other functions count as
// the E1 evaluations they cost, measured (figures below):
//   leaky formation (model = "leaky"): a W(u, r/B) of the tables' lag kernel (L × n_x of them,
//     in both screens) counts kLeakyKernelCost, one of an exact sum (the deterministic screen's
//     output-time values; the pressure raster, which a leaky run sums directly at every cell,
//     time, source and rate step: C × K × sources × rate steps per well) kLeakyTermCost;
//   3-D model: a point response (Δp and the stress tensor) counts kDepthResponseCost.
#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

// The sizes that set a run's cost.
struct RunSizes {
  std::size_t wells = 0;          // W, every well of the screen
  std::size_t sources = 0;        // wells and their image wells
  std::size_t rate_steps = 0;     // rate changes over all wells
  std::size_t rate_periods = 0;   // reported and planned periods over all wells
  std::size_t union_steps = 0;    // distinct rate-change times
  std::size_t segments = 0;       // S
  std::size_t check_points = 0;   // P
  std::size_t block_points = 0;   // P_b: most check points in one block of 64 segments
  std::size_t faults = 0;         // F
  std::size_t output_times = 0;   // K
  std::size_t tracked_times = 0;  // G, deterministic (tracking grid and output times)
  std::size_t lags = 0;           // L, whole days from the first rate change to the last tracked time
  std::size_t table_nodes = 0;    // n_x, deterministic
  bool leaky = false;             // [formation] model = "leaky": W(u, r/B) in place of E1
  bool all_well_shares = false;   // every well's share of Δp is kept (with the tables, well_shares.csv)
  // Probabilistic screen (realizations = 0: none)
  std::uint64_t realizations = 0;     // N
  std::size_t sampled_inputs = 0;
  std::size_t rate_groups = 1;
  bool latin_hypercube = false;       // the sampler keeps a permutation of N per input
  std::size_t mc_times = 0;           // G'
  std::size_t mc_table_nodes = 0;     // n_x' over the sampled range of D
  std::size_t map_table_nodes = 0;    // n_x' reaching the farthest map pixel (0: the same tables)
  std::size_t surrogate_nodes = 0;    // n_d
  std::size_t map_points = 0;         // M
  bool median_attribution = false;    // the median's well attribution (with the tables)
  // Screen in depth, [formation] model = "poroelastic_3d" (depth_points = 0: none)
  std::size_t depth_points = 0;       // check points × depth levels
  std::size_t depth_realizations = 0; // [uncertainty] realizations of the screen in depth (3-D model)
  // Pressure raster (cells = 0: none)
  std::size_t raster_cells = 0;       // C
  std::size_t profile_nodes = 0;      // n_r, the longest radial profile
  std::size_t threads = 1;
};

// The cost factors (E1 evaluations per evaluation), measured on the 2-core build machine on
// 2026-12-03 while it was shared (load average 4-5); the ratios are measured in the same run:
// - bench/leaky_kernel_bench: the lag kernel built with W(u, r/B) against the batched E1 on the
//   same grid (989 nodes, 365 daily lags, one thread): 1900-4200x over B = 1 to 100 km in three
//   runs;
// - bench/poro3d_bench: one W(u, r/B) term against one scalar Theis E1 term: 747x ("leaky
//   W(u, r/B)"); a 3-D Δp with the stress tensor against a Theis term: 3.2x.
inline constexpr double kLeakyKernelCost = 3000.0;
inline constexpr double kLeakyTermCost = 750.0;
inline constexpr double kDepthResponseCost = 3.0;

struct CostPart {
  std::string name;
  double bytes = 0;       // peak of the part's own arrays
  double operations = 0;
};

struct RunCost {
  RunSizes sizes;
  std::vector<CostPart> parts;  // inputs, deterministic screen, probabilistic screen, pressure raster
  double peak_bytes = 0;        // the largest sum of what is alive at once
  double operations = 0;
};

// The sizes of a prepared run (see the header comment for what is exact and what bounded).
RunSizes run_sizes(const scenario::ResolvedScenario& s, const PreparedRun& p);

// The cost of a run of these sizes. Pure arithmetic: the formulas of the header comment.
RunCost run_cost(const RunSizes& z);

// Both steps at once.
RunCost estimate_run_cost(const scenario::ResolvedScenario& s, const PreparedRun& p);

// The memory a run may use: the scenario's memory_limit if set, capped at the machine's
// physical memory (sysconf(_SC_PHYS_PAGES) × page size; 0 when unknown).
double physical_memory_bytes();
double memory_limit_bytes(const scenario::ResolvedScenario& s);

// Refuses (RefusedError) a run whose estimated peak memory exceeds `limit` bytes, with the
// estimate, its largest part and what to reduce.
void refuse_beyond_memory(const RunCost& cost, double limit, const std::string& file);

// The console line: "Estimated cost: 31 wells x 404 rate steps, 214 segments x 5 points, 2000
// realizations, 6278 raster cells: ~2e10 operations, peak memory ~640 MB (limit 23 GB)".
std::string cost_line(const RunCost& cost, double limit);

// Each part's memory and operations: "inputs 1.2 MB; deterministic screen 85 MB, ~3e9 operations; ...".
std::string cost_parts_text(const RunCost& cost);

// "640 MB", "23.4 GB" (decimal units).
std::string bytes_text(double bytes);

}  // namespace slipscreen::screening
