#include "screening/run_cost.hpp"

#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include <omp.h>

#include "core/errors.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/pressure_grid.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/hydro/well_function.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/screen/tracking_grid.hpp"
#include "core/stats/sampler.hpp"
#include "core/util/number_text.hpp"
#include "screening/depth_screen.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::screening {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kDay = 86400.0;
constexpr std::size_t kScreenBlock = 64;     // segments per block of the deterministic screen
constexpr double kTableStep = 0.025;         // ln x step of the similarity tables (both screens)
constexpr double kSketchBytes = 8192.0;      // one quantile sketch: about six decades at α = 0.01
constexpr double kTrackChunk = 24.0;         // tracking times per chunk of the first-crossing search
constexpr double kOrientations = 1296.0;     // the 5° grid of strikes and dips of the maps
constexpr double kCoulombOps = 20.0;         // multiply-adds of one Δp_crit
// The raster engine's defaults (core/hydro/pressure_grid.hpp): ε = 1e-4 × 1 kPa, table memory,
// the cubic Hermite factor 16 I / 384 and the union steps per matrix product.
constexpr double kGridEpsilon = 0.1;
constexpr double kGridTableBytes = 512e6;
constexpr double kHermiteFactor = 16.0 * hydro::kProfileFourthDerivativeIntegral / 384.0;
constexpr double kStepChunk = 256.0;
constexpr double kTilePixels = 256.0;

struct Bounds {
  double xmin = kInf, ymin = kInf, xmax = -kInf, ymax = -kInf;
  void take(double x, double y) {
    xmin = std::min(xmin, x), xmax = std::max(xmax, x);
    ymin = std::min(ymin, y), ymax = std::max(ymax, y);
  }
  bool empty() const { return !(xmax >= xmin); }
};

// Largest squared distance between a point of `a` and a point of `b`, from their boxes (an
// upper bound on the engines' r²_max); at least 1 m², as the engines clamp it.
double farthest2(const Bounds& a, const Bounds& b) {
  if (a.empty() || b.empty()) return 1.0;
  const double dx = std::max(a.xmax - b.xmin, b.xmax - a.xmin), dy = std::max(a.ymax - b.ymin, b.ymax - a.ymin);
  return std::max(1.0, dx * dx + dy * dy);
}

std::size_t table_nodes(double ln_lo, double ln_hi) {
  return hydro::SimilarityGrid{ln_lo, ln_hi, kTableStep}.node_count();
}

// The range of D over N realizations, bounded from every input's 0.01/N and 1 − 0.01/N quantiles
// (the extreme of N draws, Monte Carlo or Latin hypercube, lies beyond with a chance of about
// 1%) combined at their worst.
std::pair<double, double> quantile_range(const probabilistic::UncertainModel& m, std::uint64_t n) {
  const double lo = 0.01 / static_cast<double>(n), hi = 1.0 - lo;
  if (m.from_transmissivity)
    return {m.transmissivity.quantile(lo) / m.storativity.quantile(hi), m.transmissivity.quantile(hi) / m.storativity.quantile(lo)};
  const auto denominator = [&](double u) {
    return m.viscosity.quantile(u) * m.porosity.quantile(u) * m.total_compressibility.quantile(u);
  };
  return {m.permeability.quantile(lo) / denominator(hi), m.permeability.quantile(hi) / denominator(lo)};
}

// Up to this many realizations the range of D is drawn exactly as the run draws it.
constexpr std::uint64_t kDrawnRange = 1000000;

// The range of D the run will sample: its own draws of the formation inputs (the sampler's first
// inputs, core/probabilistic/screen_inputs.hpp, drawn from the streams (seed, i) as the run draws
// them), D from hydro::theis_parameters; realizations the engine rejects for their hydrogeology
// are skipped, so the range holds the run's. Beyond kDrawnRange realizations, quantile_range.
std::pair<double, double> diffusivity_range(const probabilistic::UncertainModel& m, const scenario::ResolvedScenario& s,
                                            std::uint64_t n) {
  if (n > kDrawnRange) return quantile_range(m, n);
  const probabilistic::InputList l = probabilistic::make_inputs(m, {}, 0);
  const std::size_t first = m.from_transmissivity ? std::max(l.t, l.s) : std::max({l.k, l.h, l.phi, l.ct, l.mu_f});
  std::vector<stats::UncertainInput> formation(l.inputs.begin(), l.inputs.begin() + static_cast<std::ptrdiff_t>(first + 1));
  const stats::Sampler sampler(formation, s.uncertainty.sampler, s.seed,
                               stats::RealizationCount(static_cast<std::int64_t>(n), "realizations"));
  double d_min = kInf, d_max = 0.0;
  std::vector<double> v(formation.size());
  for (std::uint64_t i = 0; i < n; ++i) {
    sampler.draw(i, v);
    try {
      const double dv = m.from_transmissivity
                            ? hydro::theis_parameters(hydro::Aquifer{v[l.t], v[l.s], m.fluid_density}).diffusivity
                            : hydro::theis_parameters(hydro::Formation{v[l.k], v[l.h], v[l.mu_f], v[l.phi], v[l.ct]})
                                  .diffusivity;
      d_min = std::min(d_min, dv), d_max = std::max(d_max, dv);
    } catch (const InputError&) {
      // rejected by the engine too
    }
  }
  return d_max > 0.0 ? std::make_pair(d_min, d_max) : quantile_range(m, n);
}

// u with E1(u) = target (bisection in ln u; E1 decreases).
double e1_inverse(double target) {
  double lo = 1e-300, hi = 800.0;
  for (int i = 0; i < 200; ++i) {
    const double mid = std::sqrt(lo * hi);
    (hydro::well_function(mid) > target ? lo : hi) = mid;
  }
  return std::sqrt(lo * hi);
}

// What the wells contribute: counts, source and rate-change places and times.
struct WellPart {
  Bounds sources;
  std::vector<double> change_times;
  double rw_min = kInf;
  double qsum = 0;  // Σ over sources of max|q| (m³/s)
};

WellPart well_part(const PreparedRun& p, RunSizes& z) {
  WellPart w;
  const auto& in = p.inputs;
  z.wells = in.wells.size();
  for (const auto& well : in.wells) {
    const std::vector<hydro::ImageSource> images =
        in.boundaries.empty() ? std::vector<hydro::ImageSource>{{well.x, well.y, 1.0, 0}}
                              : hydro::image_wells(well.x, well.y, in.boundaries);
    z.sources += images.size();
    for (const auto& im : images) w.sources.take(im.x, im.y);
    const auto changes = well.history.changes();
    z.rate_steps += changes.size();
    for (const auto& c : changes) w.change_times.push_back(c.time);
    double qmax = 0;
    for (double q : well.history.rates()) qmax = std::max(qmax, std::abs(q));
    w.qsum += qmax * static_cast<double>(images.size());
    w.rw_min = std::min(w.rw_min, well.radius);
  }
  std::vector<double> steps = w.change_times;
  std::sort(steps.begin(), steps.end());
  z.union_steps = static_cast<std::size_t>(std::unique(steps.begin(), steps.end()) - steps.begin());
  return w;
}

Bounds segment_part(const PreparedRun& p, RunSizes& z) {
  Bounds points;
  const auto& segs = p.inputs.segments;
  z.segments = segs.size();
  z.faults = p.fault_count;
  for (std::size_t s0 = 0; s0 < segs.size(); s0 += kScreenBlock) {
    std::size_t block = 0;
    for (std::size_t s = s0; s < std::min(segs.size(), s0 + kScreenBlock); ++s) {
      block += segs[s].check_points.size();
      for (const auto& c : segs[s].check_points) points.take(c.x, c.y);
    }
    z.check_points += block;
    z.block_points = std::max(z.block_points, block);
  }
  return points;
}

void deterministic_part(const PreparedRun& p, const WellPart& w, const Bounds& points, RunSizes& z) {
  const auto& in = p.inputs;
  std::vector<double> tracked;
  std::merge(in.tracking_times.begin(), in.tracking_times.end(), in.output_times.begin(), in.output_times.end(),
             std::back_inserter(tracked));
  tracked.erase(std::unique(tracked.begin(), tracked.end()), tracked.end());
  z.tracked_times = tracked.size();
  if (tracked.empty() || z.wells == 0) return;
  double first = tracked.back();
  for (double t : w.change_times) first = std::min(first, t);
  z.lags = static_cast<std::size_t>(std::llround((tracked.back() - first) / kDay)) + 1;
  const double inv4d = 1.0 / (4.0 * in.formation.diffusivity);
  z.table_nodes = table_nodes(std::log(w.rw_min * w.rw_min * inv4d) - 0.1,
                              std::log(farthest2(w.sources, points) * inv4d) + 0.1);
}

void probabilistic_part(const scenario::ResolvedScenario& s, const PreparedRun& p, const WellPart& w,
                        const Bounds& points, RunSizes& z) {
  const scenario::UncertaintySpec& spec = s.uncertainty;
  // the 3-D model's [uncertainty] drives the screen in depth instead (depth_part)
  if (!spec.given || z.wells == 0 || z.segments == 0 || s.region.formation.poroelastic_3d) return;
  z.realizations = spec.realizations.value();
  std::vector<std::string> fault_ids;
  std::vector<std::size_t> segment_fault;
  const probabilistic::UncertainModel m = uncertain_model(s, p, spec, fault_ids, segment_fault);
  const auto own = static_cast<std::size_t>(
      std::count_if(m.well_rate_factor.begin(), m.well_rate_factor.end(), [](const auto& f) { return f.has_value(); }));
  z.sampled_inputs = probabilistic::make_inputs(m, {}, fault_ids.size()).inputs.size() + own;
  z.rate_groups = 1 + own;
  z.latin_hypercube = spec.sampler == stats::SamplingMethod::latin_hypercube;
  std::vector<double> tracked = screen::tracking_grid(w.change_times, s.output.times);
  z.mc_times = tracked.empty() ? s.output.times.size() : tracked.size();

  const auto [d_min, d_max] = diffusivity_range(m, s, z.realizations);
  const double spread = std::log(d_max / d_min);
  z.surrogate_nodes =
      spread < 1e-12 ? 1 : std::clamp<std::size_t>(static_cast<std::size_t>(std::ceil(8.0 * spread)), 4, 64);
  const double ln_lo = std::log(w.rw_min * w.rw_min / (4.0 * d_max)) - 0.1;
  const double ln_hi = std::log(farthest2(w.sources, points) / (4.0 * d_min)) + 0.1;
  z.mc_table_nodes = table_nodes(ln_lo, ln_hi);
  z.median_attribution = s.output.tables;

  if (p.grid.cell_count() == 0) return;
  const geometry::RasterGrid map =
      geometry::coarsened(p.grid, spec.map_cell_size > 0.0 ? spec.map_cell_size : p.grid.cell_size, kMapCells);
  z.map_points = map.cell_count();
  Bounds pixels;
  pixels.take(map.x_origin, map.y_origin);
  pixels.take(map.x_origin + map.columns * map.cell_size, map.y_origin - map.rows * map.cell_size);
  const double map_hi = std::max(ln_hi, std::log(farthest2(w.sources, pixels) / (4.0 * d_min)) + 0.1);
  if (map_hi > ln_hi) z.map_table_nodes = table_nodes(ln_lo, map_hi);
}

void depth_part(const scenario::ResolvedScenario& s, const PreparedRun& p, RunSizes& z) {
  const scenario::RegionSpec& r = s.region;
  if (!r.formation.poroelastic_3d) return;
  // each segment's check points at its own number of depth levels (depth_screen.hpp)
  for (std::size_t g = 0; g < p.segments.size() && g < p.inputs.segments.size(); ++g)
    z.depth_points += p.inputs.segments[g].check_points.size() *
                      static_cast<std::size_t>(depth_range(r, p.segments[g]).levels);
  if (s.uncertainty.given) z.depth_realizations = s.uncertainty.realizations.value();
}

void raster_part(const scenario::ResolvedScenario& s, const PreparedRun& p, const WellPart& w, RunSizes& z) {
  if (!s.output.rasters) return;
  z.raster_cells = p.grid.cell_count();
  const double c = p.inputs.formation.pressure_per_rate, d = p.inputs.formation.diffusivity;
  if (w.qsum <= 0.0 || w.change_times.empty() || s.output.times.empty()) return;
  const double u_cut = e1_inverse(0.25 * kGridEpsilon / (c * w.qsum));
  const double h = std::min(0.05, std::pow(0.5 * kGridEpsilon / (kHermiteFactor * c * w.qsum), 0.25));
  const double theta = s.output.times.back() - *std::min_element(w.change_times.begin(), w.change_times.end());
  const double rw2 = w.rw_min * w.rw_min;
  const double r2cut = std::max(4.0 * d * std::max(theta, 0.0) * u_cut, rw2);
  z.profile_nodes = static_cast<std::size_t>(std::floor((0.5 * std::log(r2cut) - 0.5 * std::log(rw2)) / h)) + 2;
}

double d(std::size_t v) { return static_cast<double>(v); }

CostPart inputs_cost(const RunSizes& z) {
  return {"inputs", 600.0 * d(z.wells) + 120.0 * d(z.rate_periods), 0.0};
}

// Deterministic screen: peak while its tables and one block are alive; `results` stay alive.
CostPart deterministic_cost(const RunSizes& z, double& results) {
  const double W = d(z.wells), G = d(z.tracked_times), K = d(z.output_times), S = d(z.segments);
  // per segment: Δp and the leading well at each output time, Δp on the tracked times, and every
  // well's share at each output time when kept (ScreenInputs::all_well_shares)
  results = S * ((z.all_well_shares ? K * W : 0.0) + G + 4.0 * K) * 8.0;
  if (z.wells == 0 || z.segments == 0) return {"deterministic screen", results, 0.0};
  const double tables = W * d(z.table_nodes) * G * 4.0;
  const double kernel = (d(z.lags) + 1.0) * d(z.table_nodes) * 4.0;
  const double block = d(z.block_points) * (W * 9.0 + d(z.sources) * 16.0 + G * 8.0);
  const double steps_per_well = d(z.rate_steps) / W;
  const double kernel_cost = z.leaky ? kLeakyKernelCost : 1.0, term_cost = z.leaky ? kLeakyTermCost : 1.0;
  const double ops = d(z.lags) * d(z.table_nodes) * kernel_cost + d(z.rate_steps) * G * d(z.table_nodes) +
                     4.0 * d(z.check_points) * d(z.sources) * G + S * d(z.sources) * K * steps_per_well * term_cost;
  return {"deterministic screen", results + tables + std::max(kernel, block), ops};
}

// Probabilistic screen: the largest of its phases (sampling, tables, tracking, maps) on top of
// the realizations; `results` stay alive.
CostPart probabilistic_cost(const RunSizes& z, double& results) {
  results = 0;
  if (z.realizations == 0) return {"probabilistic screen", 0.0, 0.0};
  const double N = d(z.realizations), W = d(z.wells), S = d(z.segments), K = d(z.output_times), G = d(z.mc_times);
  const double P = d(z.check_points), M = d(z.map_points), groups = d(z.rate_groups), nd = d(z.surrogate_nodes);
  const double chunks = std::ceil(G / kTrackChunk);
  const double matrices = N * (d(z.sampled_inputs) * 8.0 + (2.0 * d(z.faults) + S + 2.0) * 4.0);
  // The Latin hypercube keeps one permutation of N per input while sampling.
  const double permutations = z.latin_hypercube ? d(z.sampled_inputs) * N * 4.0 : 0.0;
  const double sampling = 2.0 * matrices + N * 24.0 + permutations;
  const double kept = matrices + N * 24.0;
  const double tables = W * d(z.mc_table_nodes) * G * 4.0;
  const double kernel = (d(z.lags) + 1.0) * d(z.mc_table_nodes) * 4.0;
  const double surrogate = P * groups * nd * (G + 1.0) * 8.0;
  const double draws = (2.0 * nd + 2.0 * groups) * N * 8.0;
  const double ranks = d(z.sampled_inputs) * N * 8.0;
  // the table nodes at the output times, kept for the median's attribution
  const double median = z.median_attribution ? K * W * d(z.mc_table_nodes) * 4.0 : 0.0;
  const double per_thread = (2.0 * K + 2.0 * chunks + 6.0) * N * 8.0 * d(z.threads);
  results = S * ((K + 1.0) * kSketchBytes + (d(z.sampled_inputs) + 2.0 + K) * 8.0 +
                 (z.median_attribution ? K * (W * 8.0 + 64.0) : 0.0)) +
            M * K * 16.0;
  // the map's own tables, when its farthest pixel lies beyond the segments' (and their lag kernel)
  const double map_tables = W * d(z.map_table_nodes) * G * 4.0 + (d(z.lags) + 1.0) * d(z.map_table_nodes) * 4.0;
  const double map_surrogate = M * groups * nd * (G + 1.0) * 8.0, map_draws = (2.0 * nd + groups) * N * 8.0;
  // Every table is counted, though the screens hold one block of wells' tables at a time
  // (hydro::TableBuilder): a statewide subset measured 1.5 GB against 0.43 GB with one block
  // counted (docs/cluster.md), so the estimate keeps the whole tables until that is explained.
  // The surrogates and draws live through the tracking, the map's draws at its end.
  const double models = kept + surrogate + draws + map_surrogate + median;
  const double peak = std::max({sampling, kept + tables + kernel, models + tables + map_tables,
                                models + results + ranks + map_draws + per_thread});
  const double search = nd * groups * (K + chunks + kTrackChunk);
  const double kernel_cost = z.leaky ? kLeakyKernelCost : 1.0;
  const double ops = N * (S + (M > 0 ? kOrientations : 0.0)) * kCoulombOps +
                     d(z.lags) * d(z.mc_table_nodes) * kernel_cost +
                     d(z.rate_steps) * G * d(z.mc_table_nodes) + (P + M) * d(z.sources) * nd * G +
                     (P + M) * N * search +
                     (d(z.lags) * kernel_cost + d(z.rate_steps) * G) * d(z.map_table_nodes);  // the map's tables
  return {"probabilistic screen", peak, ops};
}

// Screen in depth: its results and per-point set-up; a point response per (point, tracked time,
// rate step, interval point).
CostPart depth_cost(const RunSizes& z) {
  if (z.depth_points == 0) return {"screen in depth", 0.0, 0.0};
  // with [uncertainty]: one more screen per realization (core/poro/depth_monte_carlo.hpp), its
  // drawn medium and a byte per (realization, segment, output time)
  const double n = d(z.depth_realizations);
  const double bytes = d(z.segments) * d(z.output_times) * (48.0 + n) + d(z.depth_points) * 64.0 + n * 64.0;
  const double ops =
      (1.0 + n) * d(z.depth_points) * d(z.tracked_times) * d(z.rate_steps) * d(kIntervalPoints) * kDepthResponseCost;
  return {"screen in depth", bytes, ops};
}

CostPart raster_cost(const RunSizes& z) {
  if (z.raster_cells == 0) return {"pressure raster", 0.0, 0.0};
  const double C = d(z.raster_cells), K = d(z.output_times), src = d(z.sources), nr = d(z.profile_nodes);
  const double values = 2.0 * C * K * 8.0 + C;
  const double tables = std::min(kGridTableBytes, K * src * nr * 16.0);
  const double steps = src * d(z.union_steps) * 8.0;
  const double per_thread = (2.0 * src * nr + 2.0 * kStepChunk * nr + kTilePixels * K) * 8.0 * d(z.threads);
  // a leaky formation is summed directly: one W per cell, output time, source and rate step
  // (screening/pressure_map.cpp)
  const double ops = z.leaky ? C * src * K * (d(z.rate_steps) / std::max(1.0, d(z.wells))) * kLeakyTermCost
                             : C * src * K * 10.0 + K * d(z.union_steps) * nr * (2.0 * src + 1.0);
  return {"pressure raster", values + tables + steps + per_thread, ops};
}

// "2.1e10"
std::string operations_text(double v) {
  if (v < 1e4) return util::number_text(std::round(v), 4);
  const int e = static_cast<int>(std::floor(std::log10(v)));
  return util::number_text(v / std::pow(10.0, e), 2) + "e" + std::to_string(e);
}

}  // namespace

RunSizes run_sizes(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  RunSizes z;
  z.threads = static_cast<std::size_t>(std::max(1, omp_get_max_threads()));
  z.output_times = s.output.times.size();
  z.leaky = s.region.formation.leaky;
  z.all_well_shares = p.inputs.all_well_shares;
  for (const auto& w : s.wells) z.rate_periods += w.periods.size();
  const WellPart w = well_part(p, z);
  const Bounds points = segment_part(p, z);
  deterministic_part(p, w, points, z);
  probabilistic_part(s, p, w, points, z);
  raster_part(s, p, w, z);
  depth_part(s, p, z);
  return z;
}

RunCost run_cost(const RunSizes& z) {
  RunCost c;
  c.sizes = z;
  double det_results = 0, prob_results = 0;
  const CostPart in = inputs_cost(z);
  const CostPart det = deterministic_cost(z, det_results);
  const CostPart prob = probabilistic_cost(z, prob_results);
  const CostPart raster = raster_cost(z);
  const CostPart depth = depth_cost(z);  // runs first, its results stay alive
  c.parts = {in, det, prob, raster, depth};
  c.peak_bytes = in.bytes + depth.bytes +
                 std::max({det.bytes, det_results + prob.bytes, det_results + prob_results + raster.bytes});
  for (const auto& part : c.parts) c.operations += part.operations;
  return c;
}

RunCost estimate_run_cost(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  return run_cost(run_sizes(s, p));
}

double physical_memory_bytes() {
  const long pages = ::sysconf(_SC_PHYS_PAGES), size = ::sysconf(_SC_PAGE_SIZE);
  return pages > 0 && size > 0 ? static_cast<double>(pages) * static_cast<double>(size) : 0.0;
}

double memory_limit_bytes(const scenario::ResolvedScenario& s) {
  const double machine = physical_memory_bytes();
  if (s.memory_limit > 0) return machine > 0 ? std::min(machine, s.memory_limit) : s.memory_limit;
  return machine;
}

std::string bytes_text(double bytes) {
  static const char* const kUnits[] = {"B", "kB", "MB", "GB", "TB", "PB", "EB"};
  int u = 0;
  while (bytes >= 1000.0 && u < 6) bytes /= 1000.0, ++u;
  return util::number_text(bytes, 3) + " " + kUnits[u];
}

std::string cost_line(const RunCost& cost, double limit) {
  const RunSizes& z = cost.sizes;
  std::string line = "Estimated cost: " + std::to_string(z.wells) + " wells x " + std::to_string(z.rate_steps) +
                     " rate steps, " + std::to_string(z.segments) + " segments x " +
                     util::number_text(z.segments ? d(z.check_points) / d(z.segments) : 0.0, 3) + " points";
  if (z.realizations) line += ", " + std::to_string(z.realizations) + " realizations";
  if (z.depth_points) line += ", " + std::to_string(z.depth_points) + " points in depth";
  if (z.depth_realizations) line += " x " + std::to_string(z.depth_realizations) + " realizations";
  if (z.leaky) line += ", leaky formation";
  if (z.raster_cells) line += ", " + std::to_string(z.raster_cells) + " raster cells";
  line += ": ~" + operations_text(cost.operations) + " operations, peak memory ~" + bytes_text(cost.peak_bytes);
  if (limit > 0) line += " (limit " + bytes_text(limit) + ")";
  return line;
}

std::string cost_parts_text(const RunCost& cost) {
  std::string text;
  for (const auto& part : cost.parts) {
    if (part.bytes == 0 && part.operations == 0) continue;
    text += (text.empty() ? "" : "; ") + part.name + " " + bytes_text(part.bytes);
    if (part.operations > 0) text += ", ~" + operations_text(part.operations) + " operations";
  }
  return text;
}

void refuse_beyond_memory(const RunCost& cost, double limit, const std::string& file) {
  if (!(limit > 0) || cost.peak_bytes <= limit) return;
  const auto largest = std::max_element(cost.parts.begin(), cost.parts.end(),
                                        [](const CostPart& a, const CostPart& b) { return a.bytes < b.bytes; });
  throw RefusedError(file + ": refused: the run would need about " + bytes_text(cost.peak_bytes) +
                     " of memory (most of it for the " + largest->name + ", " + bytes_text(largest->bytes) +
                     "), more than the limit of " + bytes_text(limit) + ". " + cost_line(cost, limit) +
                     ". Fewer wells (every well costs its tables, injecting or not), segments, output times, "
                     "realizations or raster cells reduce it (docs/scenario.md, \"What a run costs\")");
}

}  // namespace slipscreen::screening
