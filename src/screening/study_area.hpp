#pragma once
// The study area of a run and the check that every well lies in it (docs/scenario.md,
// "Plausible ranges"): the fault map's extent plus scenario::plausible::kStudyAreaMargin
// (50 km), or an explicit output grid's extent. A well outside it is refused, naming the well,
// its place in the working CRS and its distance to the nearest fault, unless the scenario sets
// [wells] allow_outside = true. A northing typo of 3,000 km is caught here.
//
// Distances are planar, in the projected working CRS (Boost.Geometry point-to-linestring
// distance, exact in the plane).
#include <optional>
#include <string>
#include <vector>

#include "formats/gis/fault_map.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::screening {

struct Box {
  double xmin = 0, ymin = 0, xmax = 0, ymax = 0;  // m, working CRS
  bool contains(double x, double y) const { return x >= xmin && x <= xmax && y >= ymin && y <= ymax; }
};

struct StudyArea {
  Box faults;               // the fault map's extent (every segment vertex), not yet widened
  double margin = 0;        // m, added on every side of `faults`
  std::optional<Box> grid;  // an explicit output grid's extent (working CRS)
  bool contains(double x, double y) const;
};

// The study area of fault segments in the working CRS and an output grid (its extent counts only
// when given explicitly). `segments` must not be empty.
StudyArea study_area(const std::vector<formats::FaultSegment>& segments, const scenario::OutputGrid& grid,
                     double margin);

struct FaultDistance {
  double distance = 0;  // m
  std::string fault_id;
};
// The nearest fault trace to (x, y) (working CRS); ties keep the first segment.
FaultDistance nearest_fault(const std::vector<formats::FaultSegment>& segments, double x, double y);

// Refuses (InputError, located at the well's source) the first well of `working` outside the
// area. `as_given` are the same wells in their own CRS (for the message), in the same order.
void check_wells_in_area(const StudyArea& area, const std::vector<scenario::WellSpec>& as_given,
                         const std::vector<scenario::WellSpec>& working, const std::string& working_crs,
                         const std::vector<formats::FaultSegment>& segments);

}  // namespace slipscreen::screening
