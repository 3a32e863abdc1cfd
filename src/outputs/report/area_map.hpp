#pragma once
// The area map (docs/report.md): the Δp raster at the last output time (pressure_change.tif),
// the Δp footprint contour through it (GDAL's contour generator), the fault segments coloured by
// P(slip by that time) (segment_probability.csv; the deterministic margin of segment_times.csv
// without a probabilistic screen), the wells by status with the proposed wells marked, the
// reviewed events sized by magnitude (screen.gpkg), a scale bar, a grid-north arrow and the CRS.
//
// Each fault segment is one stroked path of width kSegmentStroke (no other mark of the map uses
// that width), so the segments can be counted in the SVG.
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

inline constexpr double kSegmentStroke = 2.25;  // points

// The map, or none when the run wrote no GeoPackage (the segments' lines live there).
std::vector<Figure> area_map_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
