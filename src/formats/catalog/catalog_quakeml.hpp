#pragma once
// QuakeML 1.2 (BED) catalogs through pugixml: for each event the preferred origin and the
// preferred magnitude, found by their publicID references (preferredOriginID,
// preferredMagnitudeID); when a reference is missing or dangling the first origin / magnitude
// is used and a warning is recorded. Read: origin time, latitude, longitude, depth (metres in
// QuakeML), magnitude value and type, and the event publicID. Elements are matched by local
// name, so any namespace prefix works. Events without an origin, time, coordinates or
// magnitude value, and events of type "not existing", are rejected with their line number.
#include <string>

#include "formats/catalog/catalog_records.hpp"

namespace slipscreen::formats {

CatalogReadResult read_catalog_quakeml(const std::string& path);

}  // namespace slipscreen::formats
