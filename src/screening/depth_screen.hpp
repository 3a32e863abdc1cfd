#pragma once
// The deterministic screen of faults in depth for a region with [formation] model =
// "poroelastic_3d" (core/poro/fault_screen.hpp; Rudnicki 1986): every segment's check points
// down dip over [faults] top..bottom, each with the in-situ stress at its own depth, the wells'
// open intervals (wells.csv top, bottom) as point sources. Writes nothing.
#include <cstddef>
#include <optional>
#include <vector>

#include "core/poro/fault_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::screening {

// Gauss–Legendre points per open interval (the error this gives: poro/injection_interval.hpp).
inline constexpr int kIntervalPoints = 6;

struct DepthScreen {
  poro::DepthScreenInputs inputs;  // as screened (the Monte Carlo engine redraws the medium and friction)
  poro::DepthScreenResult result;
  // per segment, per check point: (x, y) in the working CRS and depth, m
  std::vector<std::vector<Eigen::Vector3d>> points;
};

// A segment's depth range in the screen in depth: the fault's own (its attributes top and bottom,
// formats/gis/fault_map.hpp), else the region's [faults] top..bottom, else the reference depth
// alone; [faults] depth_levels levels where top < bottom, else one (in the middle).
struct DepthRange {
  double top = 0, bottom = 0;  // m
  int levels = 1;
};
DepthRange depth_range(const scenario::RegionSpec& region, const formats::FaultSegment& seg);

// Empty unless the region's formation is poroelastic_3d. InputError naming the region's key or
// the well when an input is out of its domain.
std::optional<DepthScreen> depth_screen(const scenario::ResolvedScenario& s, const PreparedRun& p);

}  // namespace slipscreen::screening
