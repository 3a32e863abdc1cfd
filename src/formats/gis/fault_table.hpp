#pragma once
// A simple fault table as CSV, instead of a vector file: one straight fault per row.
//
//   # crs: EPSG:32708
//   id,x,y,strike [deg],dip [deg],length [km],friction
//   F1,501000,6120000,45,80,6,
//
// Columns: id; x and y of the fault's centre (or lon and lat, then EPSG:4326 unless stated) in
// the CRS of a "# crs:" comment line or of the region's faults.crs; strike (right-hand rule,
// azimuth from true north) and dip, with angle units in the header or cells; length with a
// length unit; optional friction; optional top and bottom, the fault's own depth range with
// length units (both or neither, 0 ≤ top < bottom ≤ max_depth_m: formats::check_fault_depth_range).
// Each fault becomes a straight trace through its centre along
// the strike (geometry::straight_trace), split into segments like a mapped trace.
#include <filesystem>
#include <string>
#include <vector>

#include "formats/gis/crs.hpp"
#include "formats/gis/fault_map.hpp"

namespace slipscreen::formats {

// True when `path` names a CSV fault table (extension .csv, any case).
bool is_fault_table(const std::filesystem::path& path);

// Throws InputError naming file, line, column and value; IoError when unreadable.
std::vector<FaultSegment> read_fault_table(const std::filesystem::path& path, const std::string& file,
                                           const Crs& working, const std::string& default_crs,
                                           double max_segment_length_m, int check_points,
                                           double max_depth_m = 15000.0);

}  // namespace slipscreen::formats
