#pragma once
// GeoPackage output: several vector layers in one file, ready for ogrinfo / QGIS as written.
//
//   formats::VectorLayer faults{"fault_segments", formats::GeometryType::line_string,
//                          {{"segment_id", formats::FieldType::string}, {"dp_crit_MPa", formats::FieldType::real}}};
//   faults.features.push_back({{a, b}, {std::string("F1:0"), 4.2}});
//   formats::write_geopackage(run.output("outputs.vector", "screen.gpkg"), working_crs, {faults, wells});
//
// Layout of each layer: the CRS of the file (every layer), geometry column "geom", FID column
// "fid" (1, 2, ... in the order given), an R-tree spatial index, and the fields in the order
// given. Field types: integer (64-bit), real (double), string, date ("YYYY-MM-DD", stored as a
// GeoPackage DATE), datetime (seconds since 1970-01-01 UTC, stored as a GeoPackage DATETIME,
// "YYYY-MM-DDTHH:MM:SS.sssZ"; OGR reads it as OFTDateTime), boolean (0 or 1, an OFTInteger with
// the OFSTBoolean subtype; GeoPackage BOOLEAN). A value std::monostate{} (or a NaN real) is
// written as NULL. A field's alias (its name for people, with its unit; unique in the layer) is
// set as GDAL's alternative name and written to gpkg_data_columns.name and .title (the
// GeoPackage schema extension, registered in gpkg_extensions).
// Geometry: point = one vertex; line_string = ≥ 2 vertices; polygon = the exterior ring
// (≥ 3 vertices; it is closed if the last vertex differs from the first); multi_polygon = the
// feature's `polygons` (each an exterior ring then its holes; an empty list is a NULL geometry).
//
// Styles: each of a layer's `styles` gets one row in the table `layer_styles` (the table
// QGIS reads when it opens a GeoPackage layer, created as an attributes table with QGIS's
// columns: f_table_catalog, f_table_schema, f_table_name, f_geometry_column, styleName,
// styleQML, styleSLD, useAsDefault, description, owner, ui, update_time); the first has
// useAsDefault = 1, so QGIS applies it on load, the others are offered in QGIS's style list.
// update_time is the fixed timestamp's date when one is set, else NULL.
// All features of a file are written in one transaction (fast, and a failure leaves nothing
// half-written in the file; the run folder removes the file anyway).
//
// Reproducible files: GeoPackage stores a modification time in gpkg_contents.last_change. Set
// GeoPackageOptions::timestamp (an ISO UTC time such as "2031-01-01T00:00:00Z") to fix it, so
// reruns give byte-identical files; otherwise GDAL writes the current time.
#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <variant>
#include <vector>

#include "core/geometry/point.hpp"
#include "formats/gis/crs.hpp"

class GDALDataset;

namespace slipscreen::formats {
class GdalErrorScope;
}

namespace slipscreen::formats {

enum class FieldType { integer, real, string, date, datetime, boolean };
enum class GeometryType { point, line_string, polygon, multi_polygon };

struct FieldSpec {
  FieldSpec() = default;
  FieldSpec(std::string field_name, FieldType field_type, std::string field_alias = "")
      : name(std::move(field_name)), type(field_type), alias(std::move(field_alias)) {}
  std::string name;
  FieldType type = FieldType::real;
  std::string alias;  // optional alternative name (gpkg_data_columns.name), e.g. "Δp (MPa)"
};

// integer fields take std::int64_t; real fields take double (or std::int64_t); string and date
// fields take std::string; datetime fields take double (seconds since 1970 UTC); boolean fields
// take std::int64_t 0 or 1; std::monostate is NULL.
using FieldValue = std::variant<std::monostate, std::int64_t, double, std::string>;

// A polygon as rings of vertices in the file's CRS: the exterior ring first, then its holes
// (each closed on writing if its last vertex differs from its first).
struct PolygonRings {
  std::vector<std::vector<geometry::Point2>> rings;
};

struct VectorFeature {
  VectorFeature() = default;
  VectorFeature(std::vector<geometry::Point2> vertices, std::vector<FieldValue> field_values)
      : geometry(std::move(vertices)), values(std::move(field_values)) {}
  std::vector<geometry::Point2> geometry;  // in the file's CRS (point, line_string, polygon)
  std::vector<FieldValue> values;          // one per field, in field order
  std::vector<PolygonRings> polygons;      // multi_polygon layers only
};

// A default style for a layer (a QGIS QML document), written to layer_styles.
struct LayerStyle {
  std::string name;         // styleName
  std::string qml;          // styleQML
  std::string description;  // description
};

struct VectorLayer {
  VectorLayer() = default;
  VectorLayer(std::string layer_name, GeometryType type, std::vector<FieldSpec> field_specs,
              std::string layer_description = "")
      : name(std::move(layer_name)), geometry(type), fields(std::move(field_specs)),
        description(std::move(layer_description)) {}

  std::string name;
  GeometryType geometry = GeometryType::point;
  std::vector<FieldSpec> fields;
  std::vector<VectorFeature> features;
  std::string description;  // optional: gpkg_contents.description
  std::vector<LayerStyle> styles;  // optional, for layer_styles: the first is the default
};

struct GeoPackageOptions {
  std::optional<std::string> timestamp;  // fixed gpkg_contents.last_change, for byte-identical reruns
};

class GeoPackageWriter {
 public:
  // Creates a new GeoPackage (an existing file at `path` is an IoError: outputs go to a fresh
  // run folder). Throws IoError naming the path when GDAL cannot create it.
  GeoPackageWriter(const std::filesystem::path& path, const Crs& crs, GeoPackageOptions options = {});
  ~GeoPackageWriter();  // closes the file if close() was not called (errors then go unreported)
  GeoPackageWriter(const GeoPackageWriter&) = delete;
  GeoPackageWriter& operator=(const GeoPackageWriter&) = delete;

  // Writes one layer with all its features. Throws InputError naming the layer, feature
  // (0-based index) and field for a value of the wrong type, a wrong number of values, a bad
  // date or geometry, or a duplicate / empty layer or field name.
  void add_layer(const VectorLayer& layer);
  // Writes the layer_styles rows of the styled layers, flushes and closes the file; throws
  // IoError if GDAL reports a failure.
  void close();

 private:
  struct Deleter {
    void operator()(GDALDataset* ds) const;
  };
  std::filesystem::path path_;
  Crs crs_;
  GeoPackageOptions options_;
  std::unique_ptr<GDALDataset, Deleter> ds_;
  struct StyleRow {
    std::string layer;
    LayerStyle style;
    bool is_default = false;
  };
  std::vector<StyleRow> styles_;
  void write_styles();
  void write_aliases(const VectorLayer& layer, GdalErrorScope& errors);
};

// Convenience: create, add every layer, close.
void write_geopackage(const std::filesystem::path& path, const Crs& crs, const std::vector<VectorLayer>& layers,
                      const GeoPackageOptions& options = {});

}  // namespace slipscreen::formats
