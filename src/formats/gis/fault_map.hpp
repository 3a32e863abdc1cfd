#pragma once
// Fault maps from any vector file GDAL reads, as segments in the working CRS.
//
// Accepted formats (GDAL drivers): GeoPackage, GeoJSON / GeoJSONSeq / ESRIJSON / TopoJSON,
// ESRI Shapefile, FlatGeobuf, KML, MapInfo, OpenFileGDB. Other drivers (VRT, databases, web
// services, GML with remote schemas) are not offered to GDAL, so a fault file cannot make
// slipscreen read anything else. Network paths are refused unless allow_network (path_policy).
//
// Geometry: LineString and MultiLineString features (curves are linearised; Z/M are dropped).
// Each part of a MultiLineString is a separate trace of the same fault. A layer, or a file,
// without line geometry is an InputError naming the file and layer; a line layer with a
// feature of another geometry type, or none, is an InputError naming its FID.
//
// Attribute mapping (field names are case-insensitive, as in OGR; "" disables a field):
//   id             required  text or integer; the fault's id, one feature per id (a fault mapped
//                            in several pieces is one MultiLineString feature): an id on two
//                            features is an InputError naming both
//   dip            required  dip angle in degrees, 0 < dip ≤ 90 (a number, or text such as
//                            "60" or "60 deg"); may be absent when default_dip_rad is set
//   dip_direction  optional  dip direction: azimuth in degrees from north (0–360) or a compass
//                            point (N, NNE, NE, ..., NW); fixes the strike's sense
//   dips_to        optional  "right" / "left" (or R / L): side of the digitising direction the
//                            fault dips to, used when there is no dip direction
//   friction       optional  friction coefficient μ > 0 for this fault
//   top, bottom    optional  the fault's own depth range for the screen in depth (depths below
//                            the surface, positive down: a number in metres or text with a length
//                            unit such as "2.1 km"); both or neither, 0 ≤ top < bottom ≤
//                            max_depth_m (check_fault_depth_range)
// Optional fields are used when the layer has a field of that name. Without dip direction or
// dips_to, the file follows the right-hand rule: the fault dips to the right of the direction
// the line was digitised in.
//
// Checks (docs/gis.md): every coordinate is finite (named by feature, part and vertex); a trace
// that folds back on itself (geometry::find_fold: a turn of more than 150° or a crossing) is an
// InputError naming the fault and the vertex unless allow_folded; text attributes and layer
// names are UTF-8 without control characters; a layer without features is skipped, and a file
// without any is an InputError saying so; at most kMaxSegmentsPerMap segments in all.
//
// Segments: each trace is reprojected into the working CRS, then split by
// geometry::split_trace (at most max_segment_length_m, check_points per segment). A segment's
// strike is the grid azimuth of its chord in the working CRS with the sense fixed as above
// (right-hand rule). Grid north is not true north: the difference is the meridian convergence
// (formats::grid_convergence_rad), see docs/gis.md.
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "core/geometry/trace_segments.hpp"
#include "formats/gis/crs.hpp"

namespace slipscreen::formats {

// At most this many segments from one fault map (about 0.5 GB of segments): a regional review
// of thousands of faults at a few segments each stays far below it.
inline constexpr std::size_t kMaxSegmentsPerMap = 1000000;

struct FaultAttributeMap {
  std::string id = "fault_id";
  std::string dip = "dip";
  std::string dip_direction = "dip_dir";
  std::string dips_to = "dips_to";
  std::string friction = "friction";
  std::string top = "top";
  std::string bottom = "bottom";
  std::optional<double> default_dip_rad;  // used when the dip field is absent or null
};

struct FaultFileOptions {
  FaultAttributeMap attributes;
  std::string layer;                      // "" = every layer with line geometry
  std::optional<std::string> source_crs;  // CRS to assume when the file declares none
  double max_segment_length_m = 1000.0;
  int check_points = 3;
  bool allow_network = false;
  bool allow_folded = false;  // accept traces that fold back on themselves (scenario: [faults] allow_folded)
  double max_depth_m = 15000.0;  // deepest bottom of a fault's own depth range
};

struct FaultSegment {
  std::string fault_id;
  std::string segment_id;   // "<fault_id>:<index>", unique in the map
  std::size_t index = 0;    // 0-based along the fault, continuous across its features/parts
  std::string layer;
  long long fid = -1;       // OGR feature id the segment came from
  geometry::TraceSegment trace;  // geometry in the working CRS (trace.index is within its part)
  double strike_rad = 0.0;  // right-hand-rule strike, grid azimuth clockwise from north
  double dip_rad = 0.0;
  std::optional<double> friction;
  std::optional<double> top_m, bottom_m;  // the fault's own depth range (attributes top, bottom)
};

// Checks a fault's own depth range (m, positive down) as read from its fields: both or neither
// given, finite, 0 ≤ top < bottom ≤ max_depth_m. InputError naming the field, the value as
// written and what was expected (the caller adds the file and feature or line).
void check_fault_depth_range(const std::optional<double>& top, const std::optional<double>& bottom,
                             const std::string& top_field, const std::string& top_written,
                             const std::string& bottom_field, const std::string& bottom_written, double max_depth_m);

// Reads every line feature of the file (or of options.layer) and returns its segments, in file
// order. Throws IoError for a missing or unreadable file, RefusedError for a network path,
// InputError for the content (no line geometry, unknown field, bad value: each names the file,
// layer, FID and field).
std::vector<FaultSegment> read_fault_segments(const std::filesystem::path& path, const Crs& working,
                                              const FaultFileOptions& options = {});

// Parses a dip direction: degrees from north as a number ("135", "135 deg") or a 16-point
// compass name (N, NNE, ..., NNW; case-insensitive). Returns radians in [0, 2π). Throws
// InputError naming `field`.
double parse_dip_direction(const std::string& text, const std::string& field);

}  // namespace slipscreen::formats
