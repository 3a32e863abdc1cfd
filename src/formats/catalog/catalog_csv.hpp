#pragma once
// Catalog CSV with a configurable column mapping.
//
// Mapping text: "key=column" pairs separated by ';' or ',', e.g.
//   "time=origin_time;lat=lat_deg;lon=lon_deg;depth=z;depth_unit=m;mag=ml;magtype=-;magtype_default=ML"
// Keys: time, lat, lon, x, y, crs, depth, depth_unit, mag, magtype, magtype_default, id,
// delimiter (one character, or 'tab'/'semicolon'). A column given as '-' is absent.
// With x and y the coordinates are projected (metres in `crs`, which is then required);
// otherwise lat/lon in degrees (WGS 84 unless crs says otherwise).
#include <string>
#include <string_view>

#include "formats/catalog/catalog_records.hpp"

namespace slipscreen::formats {

struct CatalogColumns {
  std::string time = "time";
  std::string latitude = "latitude";
  std::string longitude = "longitude";
  std::string x;                       // projected easting column (set with y)
  std::string y;
  std::string crs;                     // CRS of the coordinates; default EPSG:4326 for lat/lon
  std::string depth = "depth";         // optional column; empty cells mean depth unknown
  std::string depth_unit = "km";       // unit of bare depth numbers ("km", "m", "ft")
  std::string magnitude = "magnitude";
  std::string magnitude_type = "magnitude_type";  // optional column
  std::string magnitude_type_default;  // type for rows without one (e.g. "ML")
  std::string id = "id";               // optional column
  char delimiter = ',';
  // Which of the optional columns were named explicitly (then they must exist in the header).
  bool depth_explicit = false, magnitude_type_explicit = false, id_explicit = false;
};

// Parses the mapping text over the defaults. Throws InputError naming the key for unknown keys
// ("did you mean"), empty values, x without y, or x/y without crs.
CatalogColumns parse_catalog_columns(std::string_view text);

// Reads a CSV catalog. Lines starting with '#' are comments (their text, without '#', forms the
// catalog description); the first other non-empty line is the header.
CatalogReadResult read_catalog_csv(const std::string& path, const CatalogColumns& columns);

}  // namespace slipscreen::formats
