#pragma once
// Which column of a catalog table (CSV, FDSN text) holds which attribute of an event, and one
// row of cells read as an event (docs/catalogs.md).
//
// Mapping text: "key=column" pairs separated by ';' or ',', e.g.
//   "time=origin_time;lat=lat_deg;lon=lon_deg;depth=z;depth_unit=m;mag=ml;magtype=-;magtype_default=ML"
// Keys: time, lat, lon, x, y, crs, depth, depth_unit, mag, magtype, magtype_default, id,
// delimiter (one character, or 'tab'/'semicolon'). An optional column (depth, magtype, id)
// given as '-' is absent. With x and y the coordinates are projected (metres in `crs`, which is
// then required); otherwise lat/lon in degrees (WGS 84 unless crs says otherwise).
//
// A column the mapping does not name is found in the header by its common spellings, in any
// case (kCommonSpellings below): time, origin_time; lat, latitude; lon, long, longitude; depth,
// depth_km; mag, magnitude; magtype, mag_type, magnitude_type; id, event_id, eventid.
// Depth numbers are kilometres unless depth_unit says otherwise.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/seismo/catalog.hpp"

namespace slipscreen::formats {

// One column of the mapping: a header name, absent ('-'), or neither (found by its spellings).
struct ColumnChoice {
  std::string name;     // "" = not named by the mapping
  bool absent = false;  // '-': the file has no such column (optional columns only)
  bool named() const { return !name.empty(); }
};

struct CatalogColumns {
  ColumnChoice time, latitude, longitude, depth, magnitude, magnitude_type, id;
  ColumnChoice x, y;                   // projected easting/northing (named together, with crs)
  std::string crs;                     // CRS of the coordinates; default EPSG:4326 for lat/lon
  std::string depth_unit = "km";       // unit of bare depth numbers ("km", "m", "ft")
  std::string magnitude_type_default;  // type for rows without one (e.g. "ML")
  char delimiter = ',';
  std::string text;                    // the mapping as given ("" = none: every column by its spellings)
  bool projected() const { return x.named(); }
};

// The header spellings found without a mapping, per attribute (matched in any case).
struct CommonSpellings {
  std::vector<std::string> time, latitude, longitude, depth, magnitude, magnitude_type, id;
  std::string fixed_by;  // "" = a mapping may name other columns; else the format that fixes the names
};
extern const CommonSpellings kCommonSpellings;

// Parses the mapping text. Throws InputError naming the key for unknown keys ("did you mean"),
// empty values, '-' for a required column, x without y, or x/y without crs.
CatalogColumns parse_catalog_columns(std::string_view text);

// Where each attribute stands in one header, and how a row of that header reads as an event.
class CatalogTableLayout {
 public:
  // `header`: the header's cells; `header_text`: the header line as written (quoted in
  // messages); `where`: "file line N" of the header. Columns the mapping names must be in the
  // header; the others are looked up by `spellings` (in any case). Throws InputError located at
  // `where` for a required column that is missing, or found under two spellings; the message
  // shows the header and the --columns key (or the scenario's [catalog] columns) that maps it.
  CatalogTableLayout(const std::vector<std::string>& header, const std::string& header_text,
                     const CatalogColumns& columns, const CommonSpellings& spellings, const std::string& where);

  // The cells of one data row as the event `e` (its source already set); otherwise the reason
  // the row is unusable.
  std::optional<std::string> read_event(const std::vector<std::string>& cells, seismo::Event& e) const;

  // "time=time; lat=latitude; lon=longitude; depth=depth (km); mag=mag; magtype=magType; id=id":
  // the header columns read, as a mapping (absent optional columns are '-').
  std::string columns_used() const;

  // Optional columns not found (e.g. "no depth column (looked for depth, depth_km): depths unknown").
  const std::vector<std::string>& notes() const { return notes_; }

 private:
  struct Column {
    std::optional<std::size_t> index;
    std::string name;  // as written in the header
  };
  CatalogColumns columns_;
  std::size_t fields_ = 0;
  double depth_factor_ = 1000.0;  // metres per unit of a bare depth number
  Column time_, lat_, lon_, x_, y_, depth_, mag_, type_, id_;
  std::vector<std::string> notes_;
};

}  // namespace slipscreen::formats
