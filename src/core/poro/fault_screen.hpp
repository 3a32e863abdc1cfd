#pragma once
// The deterministic screen of faults in depth under the 3-D poroelastic model: every fault
// segment carries check points along strike and down dip over its depth range; at each the
// Rudnicki (1986) stress and pressure changes (poro/injection_interval.hpp) are resolved on the
// fault plane and compared with the point's own distance to Coulomb failure.
//
// Sources:
//   ΔCFF = Δτ − μ (Δσn − Δp)          King, Stein & Lin (1994), BSSA 84(3); compression positive
//   Δτ = u · (ΔS n_d), Δσn = nᵀ ΔS n  the changes resolved on the plane (Jaeger, Cook &
//                                     Zimmerman 2007, ch. 2), u the slip direction of the
//                                     background stress (Wallace 1951; Bott 1959), n_d = −n
//                                     (docs/geomechanics.md, "Slip direction and rake")
//   failure when ΔCFF ≥ μ Δp_crit,  Δp_crit = (σn − p0) − (τ − c)/μ   Hubbert & Rubey (1959);
//                                     geomech/coulomb.hpp (μΔp_crit is the Coulomb margin −CFF)
//   down-dip position: a point at depth z lies (z − z_ref)/tan δ from the trace along the
//   horizontal dip direction (dip direction = strike + 90°, right-hand rule)
//
// Symbol table: dtau Δτ [Pa, positive in the slip direction], dsigma_n Δσn [Pa, compression
// positive], dp Δp [Pa], dcff ΔCFF [Pa], mu μ, dp_crit Δp_crit [Pa], strike φs, dip δ.
//
// Frame: positions are (north, east, depth) in metres — the map's grid north and east, so a
// caller with (x east, y north) passes (y, x, z) — and the strike and the stress's SHmax azimuth
// are azimuths from that same north. The point source is isotropic, so the stress change comes
// out in the same frame as the background tensor (geomech::stress_tensor_ned).
//
// Accuracy: that of poro/injection_interval.hpp (the point sums to ~1e-14 relative, the interval
// quadrature as stated there) and of the projections (~1e-15 of |ΔS|). First crossings are on
// the tracking grid (not interpolated), as in core/screen/deterministic_screen.hpp.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/geomech/coulomb.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/poro/injection_interval.hpp"

namespace slipscreen::poro {

struct CoulombChange {
  double dtau = 0;      // Δτ, Pa, in the slip direction
  double dsigma_n = 0;  // Δσn, Pa, compression positive
  double dp = 0;        // Δp, Pa
  double dcff = 0;      // Δτ − μ(Δσn − Δp), Pa
};

// The change on a plane of upward unit normal n (docs/geomechanics.md) whose background slip
// direction is `slip` (unit, in the plane: geomech::resolve(...).slip_direction).
CoulombChange coulomb_change(const Eigen::Matrix3d& dstress, double dp, const Eigen::Vector3d& n,
                             const Eigen::Vector3d& slip, double mu);

// Check points of a segment in depth: for each trace point (north, east) at the reference depth,
// `levels` points equally spaced from top to bottom (one level: the middle), moved down dip.
// InputError naming "fault depth range" unless 0 ≤ top ≤ bottom are finite, levels ≥ 1, and
// "dip" unless the dip is at least 1° when top < bottom (a flat fault has no depth range).
std::vector<Eigen::Vector3d> depth_check_points(const std::vector<Eigen::Vector2d>& trace_points, double strike,
                                                double dip, double reference_depth, double top, double bottom,
                                                int levels);

struct DepthCheckPoint {
  Eigen::Vector3d position;              // (north, east, depth), m
  geomech::AndersonianStress stress;     // background stress and p0 at the point's depth
};

struct DepthSegment {
  std::string segment_id;
  double strike = 0, dip = 0;            // rad (right-hand rule), azimuth in the frame above
  std::vector<DepthCheckPoint> points;   // at least one
  std::optional<double> friction;        // the segment's own μ, else the default
};

struct DepthScreenInputs {
  RudnickiConstants medium;
  geomech::Friction friction;            // default μ and cohesion
  std::vector<InjectionSource> wells;    // positions in the same frame
  std::vector<DepthSegment> segments;
  std::vector<double> output_times;      // s, strictly increasing
  std::vector<double> tracking_times;    // s, strictly increasing; may be empty
};

struct DepthSegmentScreen {
  double friction = 0;                   // μ used
  std::vector<double> dp_crit;           // per check point, Pa (≤ 0: already critical)
  std::vector<std::size_t> point;        // per output time: the point with the largest ΔCFF − μΔp_crit
  std::vector<CoulombChange> change;     // per output time, at that point
  bool already_critical = false;         // some point has Δp_crit ≤ 0
  std::optional<double> first_crossing;  // s: the first tracked time with ΔCFF ≥ μΔp_crit at some point
  std::optional<std::size_t> crossing_point;
  std::optional<CoulombChange> crossing_change;  // at the crossing point and time
  double peak_dcff = 0;                  // Pa, max over tracked and output times and points
  double peak_time = 0;                  // s (0 when ΔCFF never exceeds 0)
};

struct DepthScreenResult {
  std::vector<DepthSegmentScreen> segments;  // in input order
  std::vector<double> tracked_times;         // tracking ∪ output times
};

// Throws InputError for invalid inputs (named field). Cost: segments × points × (tracked and
// output times) × wells × interval points × rate steps point responses.
DepthScreenResult depth_screen(const DepthScreenInputs& in);

}  // namespace slipscreen::poro
