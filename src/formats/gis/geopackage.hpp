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
// GeoPackage DATE). A value std::monostate{} (or a NaN real) is written as NULL.
// Geometry: point = one vertex; line_string = ≥ 2 vertices; polygon = the exterior ring
// (≥ 3 vertices; it is closed if the last vertex differs from the first).
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
#include <variant>
#include <vector>

#include "core/geometry/point.hpp"
#include "formats/gis/crs.hpp"

class GDALDataset;

namespace slipscreen::formats {

enum class FieldType { integer, real, string, date };
enum class GeometryType { point, line_string, polygon };

struct FieldSpec {
  std::string name;
  FieldType type = FieldType::real;
};

// integer fields take std::int64_t; real fields take double (or std::int64_t); string and date
// fields take std::string; std::monostate is NULL.
using FieldValue = std::variant<std::monostate, std::int64_t, double, std::string>;

struct VectorFeature {
  std::vector<geometry::Point2> geometry;  // in the file's CRS
  std::vector<FieldValue> values;          // one per field, in field order
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
  // Flushes and closes the file; throws IoError if GDAL reports a failure.
  void close();

 private:
  struct Deleter {
    void operator()(GDALDataset* ds) const;
  };
  std::filesystem::path path_;
  Crs crs_;
  GeoPackageOptions options_;
  std::unique_ptr<GDALDataset, Deleter> ds_;
};

// Convenience: create, add every layer, close.
void write_geopackage(const std::filesystem::path& path, const Crs& crs, const std::vector<VectorLayer>& layers,
                      const GeoPackageOptions& options = {});

}  // namespace slipscreen::formats
