#pragma once
// Nearest mapped fault trace to each event, in projected working coordinates (metres).
//
// Source: planar point-to-polyline distance (Euclidean geometry), computed with
// Boost.Geometry's `distance(point, linestring)`; exact in the plane of the projected CRS.
// Epicentral (map) distance: depth is not used.
//
// Symbol table: segment — a fault trace as a polyline of (x, y) vertices in m; distance in m.
#include <array>
#include <cstddef>
#include <limits>
#include <vector>

#include "core/seismo/catalog.hpp"

namespace slipscreen::seismo {

using FaultTrace = std::vector<std::array<double, 2>>;

struct NearestFault {
  std::size_t segment = 0;  // index into the traces
  double distance = std::numeric_limits<double>::infinity();  // m (finite once any trace exists)
};

// For each event of a projected catalog: the index of the nearest trace and the distance.
// Throws InputError for a geographic catalog (reproject first), no traces, or a trace with
// fewer than 2 vertices. Ties keep the lower index.
std::vector<NearestFault> nearest_faults(const Catalog& catalog, const std::vector<FaultTrace>& traces);

}  // namespace slipscreen::seismo
