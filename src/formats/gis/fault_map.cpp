#include "formats/gis/fault_map.hpp"

#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <map>
#include <memory>
#include <numbers>

#include "core/util/trim.hpp"
#include "core/errors.hpp"
#include "core/geometry/azimuth.hpp"
#include "core/geometry/trace_fold.hpp"
#include "core/units/units.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "core/util/utf8.hpp"
#include "formats/gis/gdal_errors.hpp"
#include "formats/files/input_file.hpp"
#include "formats/files/path_policy.hpp"

namespace slipscreen::formats {

namespace fs = std::filesystem;

namespace {

constexpr double kDeg = std::numbers::pi / 180.0;

// Drivers a fault file may be opened with (no VRT, databases or web services).
const char* const kFaultDrivers[] = {"GPKG",       "GeoJSON",        "GeoJSONSeq", "ESRIJSON",
                                     "TopoJSON",   "ESRI Shapefile", "FlatGeobuf", "KML",
                                     "MapInfo File", "OpenFileGDB",  nullptr};

struct DatasetCloser {
  void operator()(GDALDataset* ds) const { GDALClose(GDALDataset::ToHandle(ds)); }
};

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return s;
}

bool is_line_type(OGRwkbGeometryType t) {
  switch (wkbFlatten(t)) {
    case wkbLineString: case wkbMultiLineString: case wkbCircularString:
    case wkbCompoundCurve: case wkbMultiCurve: case wkbCurve:
      return true;
    default:
      return false;
  }
}
bool is_untyped(OGRwkbGeometryType t) {
  const auto f = wkbFlatten(t);
  return f == wkbUnknown || f == wkbGeometryCollection;
}

// A text attribute as read, checked as UTF-8 without control characters (core/util/utf8.hpp).
std::string text_field(OGRFeature& f, int idx, const std::string& name, const std::string& where) {
  const std::string text = f.GetFieldAsString(idx);
  if (const auto problem = util::text_problem(text))
    throw InputError(name, util::printable(text), "UTF-8 text without control characters (" + *problem + ")", where);
  return text;
}

std::vector<std::string> field_names(OGRFeatureDefn& defn) {
  std::vector<std::string> names;
  for (int i = 0; i < defn.GetFieldCount(); ++i) names.emplace_back(defn.GetFieldDefn(i)->GetNameRef());
  return names;
}

std::string join(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
  return s.empty() ? "(none)" : s;
}

// Index of a mapped field; -1 when disabled, or optional and absent.
int mapped_field(OGRFeatureDefn& defn, const std::string& name, bool required, const std::string& role,
                 const std::string& where) {
  if (name.empty()) return -1;
  const int idx = defn.GetFieldIndex(name.c_str());
  if (idx >= 0 || !required) return idx;
  const auto names = field_names(defn);
  throw InputError(role + " field", name,
                   "a field of the layer (fields: " + join(names) + ")" + util::did_you_mean(name, names), where);
}

// A numeric attribute; nullopt when the field is null or unset (or empty text). A number is
// taken as it is; text is parsed as a number, or with `unit` as a quantity with its unit in
// that unit's field convention: an angle in degrees, a length in metres.
std::optional<double> number_field(OGRFeature& f, int idx, const std::string& name, const std::string& expected,
                                   std::optional<units::Dimension> unit, const std::string& where) {
  if (idx < 0 || !f.IsFieldSetAndNotNull(idx)) return std::nullopt;
  const OGRFieldType type = f.GetFieldDefnRef(idx)->GetType();
  if (type == OFTInteger || type == OFTInteger64 || type == OFTReal) return f.GetFieldAsDouble(idx);
  const std::string text = util::trim(text_field(f, idx, name, where));
  if (text.empty()) return std::nullopt;
  double v = 0.0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
  if (ec == std::errc() && end == text.data() + text.size()) return v;
  if (unit) {
    try {
      return units::parse(text, *unit, name) / (*unit == units::Dimension::angle ? kDeg : 1.0);
    } catch (const InputError&) {
    }
  }
  throw InputError(name, text, expected, where);
}

double strike_for(const geometry::TraceSegment& seg, std::optional<double> dip_direction, bool dips_left,
                  const std::string& field, const std::string& where) {
  if (dip_direction) {
    try {
      return geometry::strike_for_dip_direction(seg.chord_azimuth_rad, *dip_direction, field.c_str());
    } catch (const InputError& e) {
      throw e.located(where);
    }
  }
  return dips_left ? geometry::normalize_azimuth(seg.chord_azimuth_rad + std::numbers::pi) : seg.chord_azimuth_rad;
}

struct Reader {
  const fs::path& path;
  const Crs& working;
  const FaultFileOptions& opt;
  std::vector<FaultSegment> out;
  std::map<std::string, std::size_t> next_index;
  std::map<std::string, std::string> feature_of_id;  // fault id -> "FID n of layer 'x'"
  std::size_t line_features = 0;

  void read_layer(OGRLayer& layer) {
    const std::string layer_name = layer.GetName();
    const std::string where_layer = path.string() + " layer '" + util::printable(layer_name) + "'";
    if (const auto problem = util::text_problem(layer_name))
      throw InputError("layer name", util::printable(layer_name),
                       "UTF-8 text without control characters (" + *problem + ")", path.string());
    // A layer without features has nothing to map (an empty GeoJSON has no fields either).
    if (layer.GetFeatureCount(TRUE) == 0) return;
    const FaultAttributeMap& a = opt.attributes;
    OGRFeatureDefn& defn = *layer.GetLayerDefn();
    const int id_idx = mapped_field(defn, a.id, true, "fault id", where_layer);
    const int dip_idx = mapped_field(defn, a.dip, !a.default_dip_rad.has_value(), "dip", where_layer);
    const int dd_idx = mapped_field(defn, a.dip_direction, false, "dip direction", where_layer);
    const int side_idx = mapped_field(defn, a.dips_to, false, "dips_to", where_layer);
    const int mu_idx = mapped_field(defn, a.friction, false, "friction", where_layer);
    const int top_idx = mapped_field(defn, a.top, false, "top", where_layer);
    const int bottom_idx = mapped_field(defn, a.bottom, false, "bottom", where_layer);

    std::optional<Crs> layer_crs;
    if (const OGRSpatialReference* srs = layer.GetSpatialRef()) layer_crs = Crs::from_osr(*srs);
    else if (opt.source_crs) layer_crs = Crs::from_user_string(*opt.source_crs, "faults.crs");
    else
      throw InputError("crs", "none declared in the file",
                       "a fault file that declares its CRS, or the fault map's CRS named in the scenario",
                       where_layer);
    const Transformer to_working(*layer_crs, working);

    layer.ResetReading();
    for (std::unique_ptr<OGRFeature> f(layer.GetNextFeature()); f; f.reset(layer.GetNextFeature()))
      read_feature(*f, layer_name, where_layer, to_working, id_idx, dip_idx, dd_idx, side_idx, mu_idx, top_idx,
                   bottom_idx);
  }

  // One fault id, one feature: a second feature with the same id is most often a copy-paste
  // slip, and merging the two would give one fault the segments of another.
  void claim_id(const std::string& id, const std::string& layer_name, long long fid, const std::string& where) {
    const std::string feature = "FID " + std::to_string(fid) + " of layer '" + util::printable(layer_name) + "'";
    const auto [it, fresh] = feature_of_id.emplace(id, feature);
    if (!fresh)
      throw InputError(opt.attributes.id, id,
                       "a fault id on one feature only: " + it->second + " has it too (a fault mapped in "
                       "several pieces is one MultiLineString feature)",
                       where);
  }

  // The vertices of one part as written, each coordinate finite.
  static std::vector<geometry::Point2> part_vertices(const OGRLineString& part, const std::string& where) {
    std::vector<geometry::Point2> v;
    v.reserve(static_cast<std::size_t>(part.getNumPoints()));
    for (int i = 0; i < part.getNumPoints(); ++i) {
      const geometry::Point2 p{part.getX(i), part.getY(i)};
      if (!std::isfinite(p.x) || !std::isfinite(p.y))
        throw InputError("geometry vertex " + std::to_string(i + 1) + " of " + std::to_string(part.getNumPoints()),
                         geometry::point_text(p),
                         "finite x and y coordinates", where);
      v.push_back(p);
    }
    return v;
  }

  // A trace that folds back on itself is refused (geometry/trace_fold.hpp) unless accepted.
  void check_fold(const std::vector<geometry::Point2>& working_vertices, const std::string& where) const {
    if (opt.allow_folded) return;
    const auto fold = geometry::find_fold(working_vertices);
    if (!fold) return;
    throw InputError("geometry", "the trace " + geometry::describe(*fold, working_vertices.size()) + " (working CRS)",
                     "a trace that does not fold back on itself (no turn sharper than 150 deg, no crossing); "
                     "fix the vertex order, or accept it with allow_folded = true under [faults]",
                     where);
  }

  void read_feature(OGRFeature& f, const std::string& layer_name, const std::string& where_layer,
                    const Transformer& to_working, int id_idx, int dip_idx, int dd_idx, int side_idx, int mu_idx,
                    int top_idx, int bottom_idx) {
    const FaultAttributeMap& a = opt.attributes;
    const long long fid = static_cast<long long>(f.GetFID());
    const std::string where = where_layer + " feature FID " + std::to_string(fid);

    // Geometry: (Multi)LineString, curves linearised.
    OGRGeometry* g = f.GetGeometryRef();
    if (!g || g->IsEmpty())
      throw InputError("geometry", "empty", "a LineString or MultiLineString fault trace", where);
    std::unique_ptr<OGRGeometry> linear;
    if (g->hasCurveGeometry()) {
      linear.reset(g->getLinearGeometry());
      g = linear.get();
    }
    std::vector<const OGRLineString*> parts;
    const auto type = wkbFlatten(g->getGeometryType());
    if (type == wkbLineString) {
      parts.push_back(g->toLineString());
    } else if (type == wkbMultiLineString) {
      for (const OGRLineString* part : *g->toMultiLineString()) parts.push_back(part);
    } else {
      throw InputError("geometry", OGRGeometryTypeToName(type), "a LineString or MultiLineString fault trace",
                       where);
    }
    ++line_features;

    // Attributes.
    if (!f.IsFieldSetAndNotNull(id_idx) || util::trim(f.GetFieldAsString(id_idx)).empty())
      throw InputError(a.id, "(empty)", "a fault id", where);
    const std::string id = util::trim(text_field(f, id_idx, a.id, where));
    claim_id(id, layer_name, fid, where);
    const std::string where_fault = where + " (fault '" + id + "')";
    const std::string dip_expected = "a dip in degrees, 0 < dip <= 90 (e.g. 60 or '60 deg')";
    std::optional<double> dip_deg = number_field(f, dip_idx, a.dip, dip_expected, units::Dimension::angle, where);
    double dip_rad = 0.0;
    if (dip_deg) {
      if (!(*dip_deg > 0.0 && *dip_deg <= 90.0))
        throw InputError(a.dip, util::printable(f.GetFieldAsString(dip_idx)), dip_expected, where);
      dip_rad = *dip_deg * kDeg;
    } else if (a.default_dip_rad) {
      dip_rad = *a.default_dip_rad;
    } else {
      throw InputError(a.dip, "(empty)", dip_expected, where);
    }
    std::optional<double> dip_direction;
    if (dd_idx >= 0 && f.IsFieldSetAndNotNull(dd_idx)) {
      const OGRFieldType t = f.GetFieldDefnRef(dd_idx)->GetType();
      const std::string text = util::trim(text_field(f, dd_idx, a.dip_direction, where));
      if (t == OFTInteger || t == OFTInteger64 || t == OFTReal) {
        const double v = f.GetFieldAsDouble(dd_idx);
        if (!(v >= 0.0 && v <= 360.0))
          throw InputError(a.dip_direction, text, "a dip direction in degrees from north, 0 to 360", where);
        dip_direction = geometry::normalize_azimuth(v * kDeg);
      } else if (!text.empty()) {
        try {
          dip_direction = parse_dip_direction(text, a.dip_direction);
        } catch (const InputError& e) {
          throw e.located(where);
        }
      }
    }
    bool dips_left = false;
    if (!dip_direction && side_idx >= 0 && f.IsFieldSetAndNotNull(side_idx)) {
      const std::string written = text_field(f, side_idx, a.dips_to, where);
      const std::string side = lower(util::trim(written));
      if (side == "left" || side == "l") dips_left = true;
      else if (side != "right" && side != "r" && !side.empty())
        throw InputError(a.dips_to, written,
                         "'right' or 'left' (side of the digitising direction the fault dips to)", where);
    }
    std::optional<double> friction =
        number_field(f, mu_idx, a.friction, "a friction coefficient > 0 (e.g. 0.6)", std::nullopt, where);
    if (friction && !(*friction > 0.0 && std::isfinite(*friction)))
      throw InputError(a.friction, util::printable(f.GetFieldAsString(mu_idx)), "a friction coefficient > 0 (e.g. 0.6)",
                       where);
    const char* depth_expected = "a depth in metres or with a length unit, such as 2100 or '2.1 km'";
    const std::optional<double> top = number_field(f, top_idx, a.top, depth_expected, units::Dimension::length, where);
    const std::optional<double> bottom =
        number_field(f, bottom_idx, a.bottom, depth_expected, units::Dimension::length, where);
    try {
      check_fault_depth_range(top, bottom, a.top, top_idx >= 0 ? util::printable(f.GetFieldAsString(top_idx)) : "",
                              a.bottom, bottom_idx >= 0 ? util::printable(f.GetFieldAsString(bottom_idx)) : "",
                              opt.max_depth_m);
    } catch (const InputError& e) {
      throw e.located(where);
    }

    for (std::size_t k = 0; k < parts.size(); ++k) {
      const std::string where_part =
          parts.size() == 1 ? where_fault : where_fault + " part " + std::to_string(k + 1) + " of " + std::to_string(parts.size());
      std::vector<geometry::Point2> v = part_vertices(*parts[k], where_part);
      try {
        to_working.apply(v, "trace coordinates");
      } catch (const InputError& e) {
        throw e.located(where_part);
      }
      std::vector<geometry::TraceSegment> pieces;
      try {
        const std::size_t n = geometry::segment_count(v, opt.max_segment_length_m);
        if (out.size() + n > kMaxSegmentsPerMap)
          throw InputError("segments", "more than " + std::to_string(kMaxSegmentsPerMap) + " by this trace",
                           "at most " + std::to_string(kMaxSegmentsPerMap) +
                               " segments in a fault map (a longer segment_length gives fewer)");
        check_fold(v, where_part);
        pieces = geometry::split_trace(v, opt.max_segment_length_m, opt.check_points);
      } catch (const InputError& e) {
        throw e.where().empty() ? e.located(where_part) : e;
      }
      for (auto& piece : pieces) {
        FaultSegment s;
        s.fault_id = id;
        s.index = next_index[id]++;
        s.segment_id = id + ":" + std::to_string(s.index);
        s.layer = layer_name;
        s.fid = fid;
        s.strike_rad = strike_for(piece, dip_direction, dips_left, a.dip_direction, where_fault);
        s.dip_rad = dip_rad;
        s.friction = friction;
        s.top_m = top;
        s.bottom_m = bottom;
        s.trace = std::move(piece);
        out.push_back(std::move(s));
      }
    }
  }
};

}  // namespace

void check_fault_depth_range(const std::optional<double>& top, const std::optional<double>& bottom,
                             const std::string& top_field, const std::string& top_written,
                             const std::string& bottom_field, const std::string& bottom_written, double max_depth_m) {
  if (!top && !bottom) return;
  if (!top) throw InputError(top_field, "(empty)", "a top with the fault's bottom (" + bottom_written + "): both or neither");
  if (!bottom)
    throw InputError(bottom_field, "(empty)", "a bottom with the fault's top (" + top_written + "): both or neither");
  const std::string range = "a depth from 0 to " + util::number_text(max_depth_m / 1000.0) + " km";
  if (!(std::isfinite(*top) && *top >= 0.0 && *top <= max_depth_m)) throw InputError(top_field, top_written, range);
  if (!(std::isfinite(*bottom) && *bottom >= 0.0 && *bottom <= max_depth_m))
    throw InputError(bottom_field, bottom_written, range);
  if (!(*top < *bottom))
    throw InputError(bottom_field, bottom_written, "a depth below the fault's top (" + top_written + ")");
}

double parse_dip_direction(const std::string& text, const std::string& field) {
  static const std::array<std::string, 16> kCompass = {"n", "nne", "ne", "ene", "e", "ese", "se", "sse",
                                                       "s", "ssw", "sw", "wsw", "w", "wnw", "nw", "nnw"};
  const std::string t = util::trim(text);
  const std::string expected = "a dip direction: degrees from north (0 to 360) or a compass point (N, NE, ..., NNW)";
  const std::string l = lower(t);
  for (std::size_t i = 0; i < kCompass.size(); ++i)
    if (l == kCompass[i]) return static_cast<double>(i) * 22.5 * kDeg;
  double deg = 0.0;
  const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), deg);
  if (ec == std::errc() && end == t.data() + t.size() && !t.empty()) {
    // plain number of degrees
  } else {
    try {
      deg = units::parse(t, units::Dimension::angle, field) / kDeg;
    } catch (const InputError&) {
      throw InputError(field, t, expected);
    }
  }
  if (!(deg >= 0.0 && deg <= 360.0)) throw InputError(field, t, expected);
  return geometry::normalize_azimuth(deg * kDeg);
}

std::vector<FaultSegment> read_fault_segments(const fs::path& path, const Crs& working, const FaultFileOptions& opt) {
  const std::string name = path.string();
  require_local_path(name, opt.allow_network, "fault file");
  if (!is_network_path(name)) {
    // A folder may be a dataset (Shapefiles, OpenFileGDB); a named pipe or device is refused
    // before GDAL waits on it.
    std::error_code ec;
    const auto problem = input_file_problem(path);
    if (problem && !fs::is_directory(path, ec)) throw IoError(name + ": cannot open the fault map (" + *problem + ")");
  }
  GdalErrorScope errors(name);
  std::unique_ptr<GDALDataset, DatasetCloser> ds(GDALDataset::Open(
      name.c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, kFaultDrivers, nullptr, nullptr));
  if (!ds)
    errors.throw_io("cannot open as a fault map (GeoPackage, GeoJSON, Shapefile, FlatGeobuf, KML, MapInfo, "
                    "OpenFileGDB)");
  // GDAL opens a file whose declared CRS PROJ does not know and falls back to a default (WGS 84
  // for GeoJSON): refused here, so no later message blames coordinates "in WGS 84".
  if (errors.has_error()) {
    const std::string gdal = errors.message();
    if (gdal.find("PROJ") != std::string::npos || gdal.find("crs") != std::string::npos ||
        gdal.find("CRS") != std::string::npos || gdal.find("SRS") != std::string::npos)
      throw InputError("crs", "declared in the file but unknown (GDAL: " + util::printable(gdal) + ")",
                       "a coordinate reference system PROJ knows, such as EPSG:32614 (the file's CRS is not "
                       "replaced by a default)",
                       name);
    errors.throw_io("error while opening the fault map");
  }

  Reader reader{path, working, opt, {}, {}, {}, 0};
  std::vector<std::string> seen;  // "name (type)" of every layer, for messages
  std::vector<OGRLayer*> layers;
  for (OGRLayer* layer : ds->GetLayers()) {
    seen.push_back(util::printable(layer->GetName()) + " (" + OGRGeometryTypeToName(wkbFlatten(layer->GetGeomType())) + ")");
    if (!opt.layer.empty()) continue;
    if (is_line_type(layer->GetGeomType()) || is_untyped(layer->GetGeomType())) layers.push_back(layer);
  }
  if (!opt.layer.empty()) {
    OGRLayer* layer = ds->GetLayerByName(opt.layer.c_str());
    if (!layer) {
      std::vector<std::string> names;
      for (OGRLayer* l : ds->GetLayers()) names.emplace_back(l->GetName());
      throw InputError("layer", opt.layer, "a layer of the file (layers: " + join(names) + ")" +
                                               util::did_you_mean(opt.layer, names), name);
    }
    if (!is_line_type(layer->GetGeomType()) && !is_untyped(layer->GetGeomType()))
      throw InputError("geometry", OGRGeometryTypeToName(wkbFlatten(layer->GetGeomType())),
                       "LineString or MultiLineString fault traces (the layer has no line geometry)",
                       name + " layer '" + opt.layer + "'");
    layers.push_back(layer);
  }
  long long features = 0;
  for (OGRLayer* layer : layers) {
    features += std::max<GIntBig>(0, layer->GetFeatureCount(TRUE));
    reader.read_layer(*layer);
  }
  errors.throw_if_error("error while reading the fault map");
  if (!layers.empty() && features == 0)
    throw InputError("features", "none: the fault map has no fault features (layers: " + join(seen) + ")",
                     "at least one LineString or MultiLineString fault trace", name);
  if (reader.line_features == 0)
    throw InputError("geometry", "no line features (layers: " + join(seen) + ")",
                     "LineString or MultiLineString fault traces", name);
  return std::move(reader.out);
}

}  // namespace slipscreen::formats
