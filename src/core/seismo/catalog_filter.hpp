#pragma once
// Selecting the events of a catalog: time window, region polygon, buffer around wells, depth
// range, magnitude type and a minimum magnitude. Every exclusion is counted by reason so a
// summary can say what was left out; nothing disappears silently.
//
// Geometry is done in the catalog's own coordinates as given (see catalog.hpp): the polygon and
// the buffer points must be in the same CRS as the events. A geographic polygon is treated as
// planar in longitude/latitude (edges are straight lines in degrees; adequate for regions of a
// few degrees that do not cross the antimeridian or a pole).
#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/seismo/catalog.hpp"

namespace slipscreen::seismo {

struct CatalogFilter {
  std::optional<double> start;                  // keep time >= start (s since epoch)
  std::optional<double> end;                    // keep time < end
  std::vector<std::array<double, 2>> polygon;   // outer ring; empty: no polygon filter
  std::vector<std::array<double, 2>> buffer_points;  // wells; empty: no buffer filter
  double buffer_radius = 0.0;                   // m (geodesic for geographic catalogs)
  std::optional<double> depth_min;              // m, inclusive
  std::optional<double> depth_max;              // m, inclusive
  std::vector<std::string> magnitude_types;     // keep these types; empty: all
  std::optional<double> min_magnitude;          // keep magnitude >= this
  // Strict: an event whose magnitude type is missing or not a recognised type, met while a
  // magnitude-type filter is set, is an InputError naming the event instead of a count.
  bool strict = false;
};

struct FilterCounts {
  std::size_t input = 0;
  std::size_t kept = 0;
  std::size_t outside_time = 0;
  std::size_t outside_polygon = 0;
  std::size_t outside_buffer = 0;
  std::size_t outside_depth = 0;
  std::size_t missing_depth = 0;       // left out because a depth range was set and depth is unknown
  std::size_t other_magnitude_type = 0;
  std::size_t unknown_magnitude_type = 0;  // type missing or unrecognised, with a type filter set
  std::size_t below_magnitude = 0;
};

struct FilterResult {
  Catalog catalog;  // the events kept, in input order
  FilterCounts counts;
};

// Throws InputError for a polygon with fewer than 3 vertices, a negative buffer radius, an
// empty time window or depth range, or (strict) an unknown magnitude type located at the event.
FilterResult apply_filter(const Catalog& catalog, const CatalogFilter& filter);

// Magnitude types recognised as such (common practice; IASPEI 2013 names and the usual network
// codes: M, Mw, Mww, Mwc, Mwb, Mwr, Mwp, ML, MLv, Ml, Md, Mc, Mh, Me, Ms, Ms_20, Ms_BB, mb, mB,
// mb_Lg, mbLg, Mlg, MN, ...), compared without regard to case.
bool is_known_magnitude_type(const std::string& type);

// Does an event's type match a requested type? Exact match, or equal ignoring case except for
// the body-wave pair mb (short period) and mB (broadband), which are different magnitudes.
bool magnitude_type_matches(const std::string& event_type, const std::string& wanted);

}  // namespace slipscreen::seismo
