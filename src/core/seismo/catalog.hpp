#pragma once
// Earthquake catalog as value types: events with origin time, epicentre, depth and magnitude.
// No I/O here (readers live in src/formats/catalog/).
//
// Coordinates are taken as given: a geographic catalog holds longitude/latitude in degrees
// (x = longitude, y = latitude), a projected one holds x/y in metres in the CRS named by `crs`.
// Reprojection is not done here: `reprojected` applies a transform supplied by the caller (the
// OSR layer in src/formats/gis), so the core never depends on GDAL.
#include <array>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace slipscreen::seismo {

enum class CoordinateKind {
  geographic,  // x = longitude, y = latitude, degrees
  projected,   // x, y in metres
};

struct Event {
  std::string id;                // event id (publicID in QuakeML), may be empty
  double time = 0.0;             // origin time, s since 1970-01-01T00:00:00Z (UTC, no leap seconds)
  double x = 0.0;                // longitude (deg) or easting (m)
  double y = 0.0;                // latitude (deg) or northing (m)
  std::optional<double> depth;   // hypocentral depth below the reference surface, m (positive down)
  double magnitude = 0.0;
  std::string magnitude_type;    // as given: "ML", "Mw", "mb", ...
  std::string source;            // where it was read: "catalog.csv line 12"
};

struct Catalog {
  std::vector<Event> events;
  CoordinateKind kind = CoordinateKind::geographic;
  std::string crs = "EPSG:4326";  // CRS of x/y as given by the file or the column mapping
  std::string description;        // free text from the file (e.g. "synthetic")
};

// Magnitudes, times, etc. as plain arrays for the statistics functions.
std::vector<double> magnitudes(const Catalog& c);
std::vector<double> times(const Catalog& c);

// Point transform supplied by the caller: (x, y) in the catalog's CRS -> (x, y) in the target.
using PointTransform = std::function<std::array<double, 2>(double x, double y)>;

// The catalog with every epicentre transformed; `kind` and `crs` describe the target.
Catalog reprojected(const Catalog& c, const PointTransform& transform, CoordinateKind kind, std::string crs);

}  // namespace slipscreen::seismo
