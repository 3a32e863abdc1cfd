#pragma once
// Coordinate reference systems (GDAL/OSR) and reprojection into the working CRS.
//
// - A Crs is built from what a user writes: "EPSG:32614", an OGC WKT (1 or 2), a PROJ string
//   ("+proj=utm +zone=14 +datum=WGS84 +units=m"), or another authority code (ESRI:102003). File
//   names and URLs are NOT accepted (OSR's file and network look-ups are turned off).
// - Axis order is never a trap: every Crs uses OSR's OAMS_TRADITIONAL_GIS_ORDER, so a point is
//   always (x, y) = (longitude, latitude) for geographic CRSs and (easting, northing) for
//   projected ones, whatever order the authority defines (EPSG:4326 is lat/lon by definition).
// - The working CRS of a run must be projected with metre units (working_crs()).
// - A Transformer converts points from one Crs to another with PROJ (through OSR). It is not
//   thread-safe: use one per thread.
//
// Accuracy: that of PROJ for the pair (sub-millimetre for datum-free projections such as
// WGS 84 -> UTM; datum shifts without grids installed can be metres — PROJ picks the best
// operation available offline; PROJ network grids are never fetched).
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "core/geometry/point.hpp"

class OGRSpatialReference;
class OGRCoordinateTransformation;

namespace slipscreen::formats {

class Crs {
 public:
  // Parse a user string. Throws InputError(field, text, "a CRS such as ...") when OSR does not
  // know it (unknown EPSG code, malformed WKT/PROJ string, empty).
  static Crs from_user_string(std::string_view text, std::string_view field = "crs");

  // Copy of an existing OSR object (e.g. a layer's CRS); axis order is set to traditional GIS.
  static Crs from_osr(const OGRSpatialReference& srs);

  std::string name() const;            // e.g. "WGS 84 / UTM zone 14N"
  std::string wkt() const;             // WKT2 (2019), single line
  std::string authority() const;       // "EPSG:32614", or "" when OSR finds no authority code
  bool is_projected() const;
  bool is_geographic() const;
  double linear_unit_m() const;        // metres per linear unit (projected CRS), 0 otherwise
  bool same_as(const Crs& other) const;  // OSR IsSame

  const OGRSpatialReference& osr() const { return *srs_; }

 private:
  explicit Crs(std::shared_ptr<OGRSpatialReference> srs) : srs_(std::move(srs)) {}
  std::shared_ptr<OGRSpatialReference> srs_;
};

// Parse the working CRS and require it to be projected with metre units (within 1e-12).
// Throws InputError naming `field` for an unknown CRS, a geographic CRS or another unit
// (e.g. US survey feet), with an example of what would do.
Crs working_crs(std::string_view text, std::string_view field = "crs");

class Transformer {
 public:
  Transformer(const Crs& from, const Crs& to);
  ~Transformer();
  Transformer(Transformer&&) noexcept;
  Transformer& operator=(Transformer&&) noexcept;
  Transformer(const Transformer&) = delete;
  Transformer& operator=(const Transformer&) = delete;

  // True when the two CRSs are the same (points pass through unchanged).
  bool identity() const { return !ct_; }

  // Transform one point / many points in place. Throws InputError naming `field` and the
  // first point PROJ cannot transform (e.g. outside the projection's domain).
  geometry::Point2 operator()(geometry::Point2 p, std::string_view field = "coordinates") const;
  void apply(std::vector<geometry::Point2>& points, std::string_view field = "coordinates") const;

 private:
  std::unique_ptr<OGRCoordinateTransformation> ct_;
  std::string from_name_, to_name_;
};

// Meridian convergence at p (a point in the projected `crs`): the grid azimuth of true north,
// in radians, positive when true north lies clockwise (east) of grid north. A true-north
// azimuth θ_true becomes the grid azimuth θ_grid = θ_true + convergence. Evaluated numerically
// from a 1e-5° northward step on the CRS's own geographic datum (error < 1e-7 rad away from
// the poles). Throws InputError when the CRS is not projected.
double grid_convergence_rad(const Crs& crs, geometry::Point2 p);

// The same at many points of one CRS, with the two transformers made once: making a
// transformer costs far more than using it (about 0.1 s each under a sanitizer), and a fault
// map can have a million segments. Not thread-safe (holds Transformers).
class MeridianConvergence {
 public:
  explicit MeridianConvergence(const Crs& crs);
  double operator()(geometry::Point2 p) const;

 private:
  MeridianConvergence(const Crs& crs, const Crs& geographic);
  Transformer to_geo_, to_grid_;
};

}  // namespace slipscreen::formats
