#include "screening/study_area.hpp"

#include <algorithm>
#include <boost/geometry.hpp>
#include <limits>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::screening {
namespace {

std::string km(double m) { return util::number_text(m / 1000.0, 4) + " km"; }

std::string metres(double v) { return util::number_text(v, 10); }

std::string box_text(const Box& b) {
  return "x " + metres(b.xmin) + " to " + metres(b.xmax) + ", y " + metres(b.ymin) + " to " + metres(b.ymax);
}

}  // namespace

bool StudyArea::contains(double x, double y) const {
  const Box wide{faults.xmin - margin, faults.ymin - margin, faults.xmax + margin, faults.ymax + margin};
  return wide.contains(x, y) || (grid && grid->contains(x, y));
}

StudyArea study_area(const std::vector<formats::FaultSegment>& segments, const scenario::OutputGrid& grid,
                     double margin) {
  StudyArea a;
  a.margin = margin;
  const double inf = std::numeric_limits<double>::infinity();
  a.faults = {inf, inf, -inf, -inf};
  for (const auto& seg : segments)
    for (const auto& v : seg.trace.vertices) {
      a.faults.xmin = std::min(a.faults.xmin, v.x);
      a.faults.ymin = std::min(a.faults.ymin, v.y);
      a.faults.xmax = std::max(a.faults.xmax, v.x);
      a.faults.ymax = std::max(a.faults.ymax, v.y);
    }
  if (!grid.automatic_extent) a.grid = Box{grid.xmin, grid.ymin, grid.xmax, grid.ymax};
  return a;
}

FaultDistance nearest_fault(const std::vector<formats::FaultSegment>& segments, double x, double y) {
  namespace bg = boost::geometry;
  using Point = bg::model::d2::point_xy<double>;
  FaultDistance best{std::numeric_limits<double>::infinity(), ""};
  const Point p(x, y);
  for (const auto& seg : segments) {
    bg::model::linestring<Point> line;
    for (const auto& v : seg.trace.vertices) bg::append(line, Point(v.x, v.y));
    const double d = line.size() == 1 ? bg::distance(p, line.front()) : bg::distance(p, line);
    if (d < best.distance) best = {d, seg.fault_id};
  }
  return best;
}

void check_wells_in_area(const StudyArea& area, const std::vector<scenario::WellSpec>& as_given,
                         const std::vector<scenario::WellSpec>& working, const std::string& working_crs,
                         const std::vector<formats::FaultSegment>& segments) {
  for (std::size_t i = 0; i < working.size(); ++i) {
    const scenario::WellSpec& w = working[i];
    if (area.contains(w.x, w.y)) continue;
    const scenario::WellSpec& g = as_given[i];
    const FaultDistance near = nearest_fault(segments, w.x, w.y);
    std::string expected = "a place within the study area: the fault map's extent plus " + km(area.margin) + " (" +
                           box_text({area.faults.xmin - area.margin, area.faults.ymin - area.margin,
                                     area.faults.xmax + area.margin, area.faults.ymax + area.margin}) +
                           " m in " + working_crs + ")";
    if (area.grid) expected += " or the output grid's extent (" + box_text(*area.grid) + ")";
    expected += "; the well lies at (" + metres(w.x) + ", " + metres(w.y) + ") m in " + working_crs + ", " +
                km(near.distance) + " from the nearest fault (" + near.fault_id +
                "): check its coordinates, or set [wells] allow_outside = true to screen it there";
    throw InputError("location", scenario::plausible::number_as_read(g.x) + ", " +
                                     scenario::plausible::number_as_read(g.y) + " (" + g.crs + ")",
                     expected, g.source + " (well '" + g.id + "')");
  }
}

}  // namespace slipscreen::screening
