#pragma once
// The deterministic screen: for best-estimate inputs, every fault segment's stress state,
// critical pore-pressure increase, the pressure change reaching it from every well over time,
// each well's share of it, and the first time the change reaches the critical value.
//
// Methods (sources in the engines this composes):
//   σn, τ, slip tendency τ/(σn − p0), dilation tendency    geomech/fault_stress.hpp
//     (Jaeger, Cook & Zimmerman 2007; Morris et al. 1996; Ferrill et al. 1999)
//   Δp_crit = (σn − p0) − (τ − c)/μ                         geomech/coulomb.hpp (Hubbert & Rubey 1959)
//   Δp(x, t): Theis line sources superposed in time and space, with image wells
//                                                           hydro/pressure_field.hpp (Theis 1935)
//   A segment's Δp is the maximum over its check points (the highest Δp can sit anywhere on it).
//   First crossing: the earliest time of the tracking grid (tracking_grid.hpp, merged with the
//   output times) at which that maximum is ≥ Δp_crit; the crossing itself happened in the
//   interval ending then (at most a month long). No stress change from the pressure (κ = 0)
//   unless stress_path_kappa > 0: then the horizontal stresses follow Δσh = κ Δp, Δσv = 0
//   (Engelder & Fischer 1994) and Δp_crit is the exact root along that path
//   (geomech::critical_pressure_poroelastic); coulomb_change gives ΔCFF(Δp) on it.
//
// Symbol table: sigma_n σn, tau τ, p0 initial pore pressure, mu μ, cohesion c, dp Δp,
// dp_crit Δp_crit, strike φs, dip δ (right-hand rule, azimuths in the stress's frame).
//
// How Δp is computed (speed: a regional screen has ~1e3 segments × 3 check points × 200 wells ×
// ~250 tracked times × ~100 rate steps, too many E1 terms to sum one by one):
//   - on the tracked times (peak Δp, peak time, first crossing): similarity tables of each well
//     (hydro/similarity_table.hpp), tapped at x = r²/(4D) for every check point and
//     source (real well and images, with their signs, r clamped to r_w as in PressureField) and
//     scaled by μ/(4π k h); at the output times the exact values below replace the table values;
//   - at the output times (dp, dp_point, well_share): the exact sum of hydro::PressureField at
//     every check point that can hold the segment's maximum, i.e. whose table value is within
//     twice the table error bound (with a safety factor 2) of the highest; the others cannot.
//
// Accuracy: dp, dp_point and well_share are those of hydro::PressureField (≤ 1e-15 relative per
// term, sums to ~1e-13 relative). On the other tracked times Δp carries the table error: ≤ 1e-6
// of max_x |H_w(x, t)| per source (similarity_table.hpp; H_w is well w's similarity sum, so the
// bound is 1e-6 of the largest Δp each well makes anywhere at that time, near its own radius),
// summed over sources. peak_dp and first_crossing are therefore within that bound of the exact
// values (a crossing can move by one grid time when Δp_crit lies within it of a tracked Δp).
// Stresses to ~1e-15 × max|S|. The first-crossing time is on the grid (a month of resolution),
// not interpolated. Deterministic for any thread count.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/geometry/point.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/rate_history.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/hydro/theis.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::screen {

struct ScreenWell {
  std::string id;
  double x = 0, y = 0;   // m, working CRS
  double radius = 0.1;   // m
  hydro::RateHistory history;
};

struct ScreenSegment {
  std::string segment_id;
  double strike = 0;  // rad, right-hand rule, in the frame of the stress's SHmax azimuth
  double dip = 0;     // rad
  std::vector<geometry::Point2> check_points;  // working CRS, at least one
  std::optional<double> friction;              // the segment's own μ, else the default
};

struct ScreenInputs {
  geomech::AndersonianStress stress;  // at the reference depth, with the initial pore pressure
  geomech::Friction friction;         // default μ and cohesion
  hydro::TheisParameters formation;
  std::vector<hydro::Boundary> boundaries;
  std::vector<ScreenWell> wells;
  std::vector<ScreenSegment> segments;
  std::vector<double> output_times;    // s, strictly increasing
  std::vector<double> tracking_times;  // s, strictly increasing (tracking_grid); may be empty
  double stress_path_kappa = 0.0;      // κ = α(1−2ν)/(1−ν) in [0, 1]; 0: no stress change
  // Keep every well's share (well_share, crossing_share): S·K·W values, 24 GB for 20,000
  // segments, 50 output times and 3,000 wells. false: only the leading well's (leading_well,
  // leading_share, crossing_well), which is all a run without its tables reads.
  bool all_well_shares = true;
  // Bytes of similarity tables held at a time (blocks of wells, hydro::TableBuilder::blocks; the
  // results do not depend on it).
  double table_block_bytes = hydro::kTableBlockBytes;
};

struct SegmentScreen {
  double friction = 0;                 // μ used
  double normal_stress = 0;            // σn, Pa
  double effective_normal_stress = 0;  // σn − p0, Pa
  double shear_stress = 0;             // τ, Pa
  double slip_tendency = 0;            // τ / (σn − p0)
  double dilation_tendency = 0;        // (S1 − σn)/(S1 − S3)
  double rake = 0;                     // rad, NaN when τ = 0
  geomech::SlipSense sense = geomech::SlipSense::none;
  double dp_crit = 0;                  // Pa; ≤ 0: already critical before injection
  geomech::CriticalStatus status = geomech::CriticalStatus::below_failure;
  geomech::CoulombPathChange coulomb_change;  // ΔCFF(Δp) on the stress path (μΔp when κ = 0)
  std::vector<double> dp;              // Pa, per output time: max over check points (0 before injection)
  std::vector<std::size_t> dp_point;   // per output time: the check point holding the max
  std::vector<double> well_share;      // [k * wells + w]: well w's fraction of dp[k] (0 if dp = 0);
                                       // empty unless ScreenInputs::all_well_shares
  std::vector<std::size_t> leading_well;  // per output time: the well with the largest share (the
                                          // first on ties; 0 when dp = 0)
  std::vector<double> leading_share;   // per output time: that well's share (0 if dp = 0)
  std::optional<double> first_crossing;  // s; empty when never reached or already critical
  std::vector<double> crossing_share;  // per well: fraction of the exact Δp at first_crossing, at the
                                       // check point holding the maximum there (empty without a
                                       // crossing, or unless ScreenInputs::all_well_shares)
  std::size_t crossing_well = 0;       // the well with the largest such fraction (first on ties)
  double crossing_well_share = 0;      // its fraction (0 without a crossing)
  std::vector<double> tracked_dp;      // Pa, per tracked time (ScreenResult::tracked_times): max over check points
                                       // (similarity-table values, exact at the output times)
  double peak_dp = 0;                  // Pa, max over the tracking grid and output times
  double peak_time = 0;                // s (0 when no pressure at all)
};

struct ScreenResult {
  std::vector<SegmentScreen> segments;   // in input order
  std::vector<double> tracked_times;     // the grid actually searched (tracking ∪ output times)
  bool radius_clamped = false;           // some check point lay within a well radius
  std::size_t well_count = 0;            // wells screened (the range of leading_well, crossing_well)
};

// Progress callback: fraction done in [0, 1] (called from the calling thread only).
using Progress = void (*)(double fraction, void* user);

// Segments [first, end) in input order (end clamped to the segment count).
struct SegmentRange {
  std::size_t first = 0, end = static_cast<std::size_t>(-1);
};

// Throws InputError for invalid inputs (named field), as the engines do. With `only`, the
// pressure (dp, dp_point, well_share, tracked_dp, peak, first crossing and its shares) is
// computed for those segments alone and left zero (no crossing) for the others; the stresses are
// resolved for every segment, and the tables span every check point, so each segment in the
// range gets exactly the values of a whole run (how a run splits across processes,
// screen_split.hpp).
// With an active `share` the parts compute the table Δp together, each at its share of the tracked
// times for every check point, and exchange the values; every part must then call this with the
// same inputs (its own `only`).
ScreenResult deterministic_screen(const ScreenInputs& in, Progress progress = nullptr, void* user = nullptr,
                                  SegmentRange only = {}, const util::WorkShare* share = nullptr);

}  // namespace slipscreen::screen
