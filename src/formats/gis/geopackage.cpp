#include "formats/gis/geopackage.hpp"

#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <cctype>
#include <cmath>
#include <set>

#include "core/errors.hpp"
#include "core/util/civil_date.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

// Sets a thread-local GDAL configuration option for a scope and restores the previous value.
class ScopedConfig {
 public:
  ScopedConfig(const char* key, const std::optional<std::string>& value) : key_(key) {
    if (!value) return;
    active_ = true;
    if (const char* old = CPLGetThreadLocalConfigOption(key, nullptr)) old_ = old;
    CPLSetThreadLocalConfigOption(key, value->c_str());
  }
  ~ScopedConfig() {
    if (active_) CPLSetThreadLocalConfigOption(key_, old_ ? old_->c_str() : nullptr);
  }
  ScopedConfig(const ScopedConfig&) = delete;
  ScopedConfig& operator=(const ScopedConfig&) = delete;

 private:
  const char* key_;
  bool active_ = false;
  std::optional<std::string> old_;
};

std::string lower(std::string s) {
  for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

const char* type_name(FieldType t) {
  switch (t) {
    case FieldType::integer: return "integer";
    case FieldType::real: return "real";
    case FieldType::string: return "string";
    case FieldType::date: return "date (YYYY-MM-DD)";
    case FieldType::datetime: return "date and time (seconds since 1970 UTC)";
    case FieldType::boolean: return "boolean (0 or 1)";
  }
  return "?";
}

OGRFieldType ogr_type(FieldType t) {
  switch (t) {
    case FieldType::integer: return OFTInteger64;
    case FieldType::real: return OFTReal;
    case FieldType::string: return OFTString;
    case FieldType::date: return OFTDate;
    case FieldType::datetime: return OFTDateTime;
    case FieldType::boolean: return OFTInteger;
  }
  return OFTString;
}

OGRwkbGeometryType ogr_geometry(GeometryType g) {
  switch (g) {
    case GeometryType::point: return wkbPoint;
    case GeometryType::line_string: return wkbLineString;
    case GeometryType::polygon: return wkbPolygon;
    case GeometryType::multi_polygon: return wkbMultiPolygon;
  }
  return wkbUnknown;
}

// "YYYY-MM-DD" with a valid month and day (proleptic Gregorian).
bool parse_date(const std::string& s, int& y, int& m, int& d) {
  if (s.size() != 10 || s[4] != '-' || s[7] != '-') return false;
  for (int i : {0, 1, 2, 3, 5, 6, 8, 9})
    if (!std::isdigit(static_cast<unsigned char>(s[static_cast<std::size_t>(i)]))) return false;
  y = std::stoi(s.substr(0, 4));
  m = std::stoi(s.substr(5, 2));
  d = std::stoi(s.substr(8, 2));
  static constexpr int kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  if (m < 1 || m > 12) return false;
  const bool leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
  const int dim = kDays[m - 1] + (m == 2 && leap ? 1 : 0);
  return d >= 1 && d <= dim;
}

void require_finite(const std::vector<geometry::Point2>& v, const std::string& where) {
  for (const auto& p : v)
    if (!std::isfinite(p.x) || !std::isfinite(p.y))
      throw InputError("geometry", "a non-finite coordinate", "finite x and y", where);
}

std::unique_ptr<OGRLinearRing> make_ring(const std::vector<geometry::Point2>& v, const std::string& where) {
  require_finite(v, where);
  if (v.size() < 3)
    throw InputError("geometry", std::to_string(v.size()) + " vertices", "a ring of at least 3 vertices", where);
  auto ring = std::make_unique<OGRLinearRing>();
  for (const auto& p : v) ring->addPoint(p.x, p.y);
  if (!(v.front() == v.back())) ring->addPoint(v.front().x, v.front().y);
  return ring;
}

std::unique_ptr<OGRGeometry> make_geometry(GeometryType type, const VectorFeature& feature, const std::string& where) {
  if (type == GeometryType::multi_polygon) {
    if (!feature.geometry.empty())
      throw InputError("geometry", "vertices", "polygons (a multi-polygon layer takes its rings in `polygons`)", where);
    if (feature.polygons.empty()) return nullptr;
    auto multi = std::make_unique<OGRMultiPolygon>();
    for (const auto& part : feature.polygons) {
      if (part.rings.empty()) throw InputError("geometry", "a polygon without rings", "an exterior ring", where);
      auto poly = std::make_unique<OGRPolygon>();
      for (const auto& ring : part.rings) poly->addRingDirectly(make_ring(ring, where).release());
      multi->addGeometryDirectly(poly.release());
    }
    return multi;
  }
  const auto& v = feature.geometry;
  require_finite(v, where);
  switch (type) {
    case GeometryType::point: {
      if (v.size() != 1) throw InputError("geometry", std::to_string(v.size()) + " vertices", "one point", where);
      return std::make_unique<OGRPoint>(v[0].x, v[0].y);
    }
    case GeometryType::line_string: {
      if (v.size() < 2)
        throw InputError("geometry", std::to_string(v.size()) + " vertices", "a line of at least 2 vertices", where);
      auto line = std::make_unique<OGRLineString>();
      for (const auto& p : v) line->addPoint(p.x, p.y);
      return line;
    }
    case GeometryType::polygon: {
      auto poly = std::make_unique<OGRPolygon>();
      poly->addRingDirectly(make_ring(v, where).release());
      return poly;
    }
    case GeometryType::multi_polygon: break;  // handled above
  }
  return nullptr;
}

void set_value(OGRFeature& f, int idx, const FieldSpec& spec, const FieldValue& value, const std::string& where) {
  if (std::holds_alternative<std::monostate>(value)) {
    f.SetFieldNull(idx);
    return;
  }
  auto wrong = [&](const char* got) {
    throw InputError(spec.name, std::string("a value of type ") + got, std::string("a value of type ") + type_name(spec.type),
                     where);
  };
  switch (spec.type) {
    case FieldType::integer:
      if (const auto* i = std::get_if<std::int64_t>(&value)) return f.SetField(idx, static_cast<GIntBig>(*i));
      return wrong(std::holds_alternative<double>(value) ? "real" : "string");
    case FieldType::real:
      if (const auto* d = std::get_if<double>(&value)) {
        if (std::isnan(*d)) return f.SetFieldNull(idx);
        return f.SetField(idx, *d);
      }
      if (const auto* i = std::get_if<std::int64_t>(&value)) return f.SetField(idx, static_cast<double>(*i));
      return wrong("string");
    case FieldType::string:
      if (const auto* s = std::get_if<std::string>(&value)) return f.SetField(idx, s->c_str());
      return wrong(std::holds_alternative<double>(value) ? "real" : "integer");
    case FieldType::date: {
      const auto* s = std::get_if<std::string>(&value);
      if (!s) return wrong(std::holds_alternative<double>(value) ? "real" : "integer");
      int y = 0, m = 0, d = 0;
      if (!parse_date(*s, y, m, d)) throw InputError(spec.name, *s, "a date as YYYY-MM-DD", where);
      return f.SetField(idx, y, m, d);
    }
    case FieldType::datetime: {
      const auto* t = std::get_if<double>(&value);
      if (!t) return wrong(std::holds_alternative<std::int64_t>(value) ? "integer" : "string");
      if (!std::isfinite(*t) || std::fabs(*t) > 2.5e11)  // beyond years 1..9999
        throw InputError(spec.name, std::to_string(*t), "a time in seconds since 1970 (years 1 to 9999)", where);
      const auto ms_total = static_cast<std::int64_t>(std::llround(*t * 1000.0));
      std::int64_t days = ms_total / 86400000, ms = ms_total % 86400000;
      if (ms < 0) {
        ms += 86400000;
        --days;
      }
      const util::CivilDate c = util::civil_from_days(days);
      return f.SetField(idx, c.year, c.month, c.day, static_cast<int>(ms / 3600000), static_cast<int>(ms / 60000 % 60),
                        static_cast<float>(ms % 60000) / 1000.0f, 100 /* UTC */);
    }
    case FieldType::boolean: {
      const auto* i = std::get_if<std::int64_t>(&value);
      if (!i) return wrong(std::holds_alternative<double>(value) ? "real" : "string");
      if (*i != 0 && *i != 1) throw InputError(spec.name, std::to_string(*i), "0 (false) or 1 (true)", where);
      return f.SetField(idx, static_cast<int>(*i));
    }
  }
}

}  // namespace

void GeoPackageWriter::Deleter::operator()(GDALDataset* ds) const { GDALClose(GDALDataset::ToHandle(ds)); }

GeoPackageWriter::GeoPackageWriter(const fs::path& path, const Crs& crs, GeoPackageOptions options)
    : path_(path), crs_(crs), options_(std::move(options)) {
  GdalErrorScope errors(path_.string());
  std::error_code ec;
  if (fs::exists(path_, ec)) errors.throw_io("the GeoPackage already exists (outputs are written to a new run folder)");
  GDALDriver* gpkg = GetGDALDriverManager()->GetDriverByName("GPKG");
  if (!gpkg) errors.throw_io("GDAL has no GPKG driver");
  ScopedConfig date("OGR_CURRENT_DATE", options_.timestamp);
  ds_.reset(gpkg->Create(path_.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr));
  if (!ds_) errors.throw_io("cannot create the GeoPackage");
}

GeoPackageWriter::~GeoPackageWriter() {
  if (!ds_) return;
  GdalErrorScope errors(path_.string());  // keep GDAL quiet; nothing can be reported here
  ScopedConfig date("OGR_CURRENT_DATE", options_.timestamp);
  ds_.reset();
}

void GeoPackageWriter::add_layer(const VectorLayer& layer) {
  const std::string where_layer = path_.string() + " layer '" + layer.name + "'";
  if (!ds_) throw IoError(where_layer + ": the GeoPackage is already closed");
  if (layer.name.empty()) throw InputError("layer name", "", "a non-empty layer name", path_.string());
  if (ds_->GetLayerByName(layer.name.c_str()) || lower(layer.name) == "layer_styles")
    throw InputError("layer name", layer.name, "a layer name not used before in this file (nor 'layer_styles')",
                     path_.string());
  std::set<std::string> names{"fid", "geom"}, aliases;
  for (const auto& f : layer.fields) {
    if (f.name.empty() || !names.insert(lower(f.name)).second)
      throw InputError("field name", f.name, "a non-empty field name, unique in the layer and not 'fid' or 'geom'",
                       where_layer);
    if (!f.alias.empty() && !aliases.insert(f.alias).second)
      throw InputError("alias of field '" + f.name + "'", f.alias, "an alias unique in the layer", where_layer);
  }

  GdalErrorScope errors(where_layer);
  ScopedConfig date("OGR_CURRENT_DATE", options_.timestamp);
  std::string description_option = "DESCRIPTION=" + layer.description;
  const char* const create_options[] = {"GEOMETRY_NAME=geom", "FID=fid", "SPATIAL_INDEX=YES",
                                        layer.description.empty() ? nullptr : description_option.c_str(), nullptr};
  // GDAL 3.6 takes a non-const CRS; hand it a copy of ours (the layer keeps its own reference).
  std::unique_ptr<OGRSpatialReference, void (*)(OGRSpatialReference*)> srs(
      crs_.osr().Clone(), [](OGRSpatialReference* s) { s->Release(); });
  OGRLayer* out = ds_->CreateLayer(layer.name.c_str(), srs.get(), ogr_geometry(layer.geometry),
                                   const_cast<char**>(create_options));
  if (!out) errors.throw_io("cannot create the layer");
  for (const auto& spec : layer.fields) {
    OGRFieldDefn defn(spec.name.c_str(), ogr_type(spec.type));
    if (spec.type == FieldType::boolean) defn.SetSubType(OFSTBoolean);
    if (!spec.alias.empty()) defn.SetAlternativeName(spec.alias.c_str());
    if (out->CreateField(&defn) != OGRERR_NONE) errors.throw_io("cannot create field '" + spec.name + "'");
  }
  errors.throw_if_error("cannot write the layer's definition");
  write_aliases(layer, errors);
  if (ds_->StartTransaction() != OGRERR_NONE) errors.throw_io("cannot start a transaction");
  try {
    for (std::size_t i = 0; i < layer.features.size(); ++i) {
      const VectorFeature& vf = layer.features[i];
      const std::string where = where_layer + " feature " + std::to_string(i);
      if (vf.values.size() != layer.fields.size())
        throw InputError("values", std::to_string(vf.values.size()),
                         std::to_string(layer.fields.size()) + " values (one per field)", where);
      OGRFeature feature(out->GetLayerDefn());
      if (auto g = make_geometry(layer.geometry, vf, where)) feature.SetGeometryDirectly(g.release());
      for (std::size_t k = 0; k < layer.fields.size(); ++k)
        set_value(feature, static_cast<int>(k), layer.fields[k], vf.values[k], where);
      if (out->CreateFeature(&feature) != OGRERR_NONE) errors.throw_io("cannot write feature " + std::to_string(i));
    }
    if (ds_->CommitTransaction() != OGRERR_NONE) errors.throw_io("cannot commit the layer's features");
  } catch (...) {
    ds_->RollbackTransaction();
    throw;
  }
  errors.throw_if_error("error while writing the layer");
  for (std::size_t i = 0; i < layer.styles.size(); ++i) styles_.push_back({layer.name, layer.styles[i], i == 0});
}

// Aliases in gpkg_data_columns (the GeoPackage "Schema" extension, GeoPackage 1.3 §F.9): GDAL
// writes the alternative names there itself only from 3.7, so they are written here (INSERT OR
// REPLACE keeps one row when GDAL writes the same).
void GeoPackageWriter::write_aliases(const VectorLayer& layer, GdalErrorScope& errors) {
  bool any = false;
  for (const auto& f : layer.fields) any = any || !f.alias.empty();
  if (!any) return;
  const auto quote = [](const std::string& s) {
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("''") : std::string(1, c);
    return q + "'";
  };
  const auto exec = [&](const std::string& sql) {
    ds_->ExecuteSQL(sql.c_str(), nullptr, nullptr);  // statements without a result set return null
    errors.throw_if_error("cannot record the field aliases");
  };
  exec("CREATE TABLE IF NOT EXISTS gpkg_data_columns (table_name TEXT NOT NULL, column_name TEXT NOT NULL, "
       "name TEXT, title TEXT, description TEXT, mime_type TEXT, constraint_name TEXT, "
       "CONSTRAINT pk_gdc PRIMARY KEY (table_name, column_name), CONSTRAINT gdc_tn UNIQUE (table_name, name))");
  exec("CREATE TABLE IF NOT EXISTS gpkg_extensions (table_name TEXT, column_name TEXT, extension_name TEXT NOT NULL, "
       "definition TEXT NOT NULL, scope TEXT NOT NULL, "
       "CONSTRAINT ge_tce UNIQUE (table_name, column_name, extension_name))");
  exec("INSERT OR IGNORE INTO gpkg_extensions (table_name, column_name, extension_name, definition, scope) VALUES "
       "('gpkg_data_columns', NULL, 'gpkg_schema', 'http://www.geopackage.org/spec/#extension_schema', 'read-write')");
  for (const auto& f : layer.fields)
    if (!f.alias.empty())
      exec("INSERT OR REPLACE INTO gpkg_data_columns (table_name, column_name, name, title) VALUES (" +
           quote(layer.name) + ", " + quote(f.name) + ", " + quote(f.alias) + ", " + quote(f.alias) + ")");
}

// The table QGIS reads default styles from (QgsOgrProviderUtils; the columns QGIS creates when it
// saves a style into a GeoPackage), as an attributes table registered in gpkg_contents.
void GeoPackageWriter::write_styles() {
  if (styles_.empty()) return;
  const std::string where = path_.string() + " table 'layer_styles'";
  if (ds_->GetLayerByName("layer_styles"))
    throw InputError("layer name", "layer_styles", "a layer name other than the style table's", path_.string());
  GdalErrorScope errors(where);
  ScopedConfig date("OGR_CURRENT_DATE", options_.timestamp);
  const char* const create_options[] = {"FID=id", "DESCRIPTION=Default styles of the layers (QGIS layer_styles)",
                                        nullptr};
  OGRLayer* out = ds_->CreateLayer("layer_styles", nullptr, wkbNone, const_cast<char**>(create_options));
  if (!out) errors.throw_io("cannot create the table");
  struct Column {
    const char* name;
    OGRFieldType type;
    OGRFieldSubType subtype;
    int width;
  };
  static constexpr Column kColumns[] = {
      {"f_table_catalog", OFTString, OFSTNone, 256}, {"f_table_schema", OFTString, OFSTNone, 256},
      {"f_table_name", OFTString, OFSTNone, 256},    {"f_geometry_column", OFTString, OFSTNone, 256},
      {"styleName", OFTString, OFSTNone, 30},        {"styleQML", OFTString, OFSTNone, 0},
      {"styleSLD", OFTString, OFSTNone, 0},          {"useAsDefault", OFTInteger, OFSTBoolean, 0},
      {"description", OFTString, OFSTNone, 0},       {"owner", OFTString, OFSTNone, 30},
      {"ui", OFTString, OFSTNone, 30},               {"update_time", OFTDateTime, OFSTNone, 0}};
  for (const auto& c : kColumns) {
    OGRFieldDefn defn(c.name, c.type);
    defn.SetSubType(c.subtype);
    defn.SetWidth(c.width);
    if (out->CreateField(&defn) != OGRERR_NONE) errors.throw_io(std::string("cannot create column '") + c.name + "'");
  }
  int y = 0, m = 0, d = 0;
  const bool fixed = options_.timestamp && options_.timestamp->size() >= 10 &&
                     parse_date(options_.timestamp->substr(0, 10), y, m, d);
  if (ds_->StartTransaction() != OGRERR_NONE) errors.throw_io("cannot start a transaction");
  try {
    for (const auto& [layer, style, is_default] : styles_) {
      OGRFeature row(out->GetLayerDefn());
      row.SetField("f_table_catalog", "");
      row.SetField("f_table_schema", "");
      row.SetField("f_table_name", layer.c_str());
      row.SetField("f_geometry_column", "geom");
      row.SetField("styleName", style.name.c_str());
      row.SetField("styleQML", style.qml.c_str());
      row.SetField("styleSLD", "");
      row.SetField("useAsDefault", is_default ? 1 : 0);
      row.SetField("description", style.description.c_str());
      row.SetField("owner", "");
      row.SetField("ui", "");
      if (fixed) row.SetField("update_time", y, m, d, 0, 0, 0.0f, 100);
      else row.SetFieldNull(row.GetFieldIndex("update_time"));
      if (out->CreateFeature(&row) != OGRERR_NONE) errors.throw_io("cannot write the style of layer '" + layer + "'");
    }
    if (ds_->CommitTransaction() != OGRERR_NONE) errors.throw_io("cannot commit the styles");
  } catch (...) {
    ds_->RollbackTransaction();
    throw;
  }
  errors.throw_if_error("error while writing the styles");
}

void GeoPackageWriter::close() {
  if (!ds_) return;
  write_styles();
  GdalErrorScope errors(path_.string());
  ScopedConfig date("OGR_CURRENT_DATE", options_.timestamp);
  ds_.reset();
  errors.throw_if_error("could not finish writing the GeoPackage");
}

void write_geopackage(const fs::path& path, const Crs& crs, const std::vector<VectorLayer>& layers,
                      const GeoPackageOptions& options) {
  GeoPackageWriter writer(path, crs, options);
  for (const auto& layer : layers) writer.add_layer(layer);
  writer.close();
}

}  // namespace slipscreen::formats
