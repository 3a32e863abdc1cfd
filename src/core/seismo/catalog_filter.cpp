#include "core/seismo/catalog_filter.hpp"

#include <algorithm>
#include <array>
#include <boost/geometry.hpp>
#include <cctype>
#include <string_view>

#include "core/errors.hpp"
#include "core/seismo/epicentral_distance.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {
namespace {

std::string lower(std::string s) {
  for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

constexpr std::array<std::string_view, 30> kKnownTypes = {
    "m",     "mw",    "mww",  "mwc", "mwb",  "mwr",   "mwp",  "mi",   "mwi", "ml",
    "mlv",   "mlr",   "mlh",  "md",  "mc",   "mh",    "me",   "ms",   "ms_20", "ms_bb",
    "msbb",  "mb",    "mb_lg", "mblg", "mlg", "mn",   "mbc",  "mwmwp", "mdl", "mla"};

}  // namespace

bool is_known_magnitude_type(const std::string& type) {
  const std::string t = lower(type);
  return std::find(kKnownTypes.begin(), kKnownTypes.end(), t) != kKnownTypes.end();
}

bool magnitude_type_matches(const std::string& event_type, const std::string& wanted) {
  if (event_type == wanted) return true;
  const std::string a = lower(event_type), b = lower(wanted);
  if (a == "mb" || b == "mb") return false;  // mb and mB are different magnitudes
  return a == b;
}

FilterResult apply_filter(const Catalog& catalog, const CatalogFilter& f) {
  namespace bg = boost::geometry;
  using Point = bg::model::d2::point_xy<double>;
  using Polygon = bg::model::polygon<Point>;
  if (!f.polygon.empty() && f.polygon.size() < 3)
    throw InputError("region polygon", std::to_string(f.polygon.size()) + " vertices", "at least 3 vertices");
  if (!f.buffer_points.empty() && !(f.buffer_radius >= 0.0))
    throw InputError("buffer radius", util::number_text(f.buffer_radius, 6), "a distance >= 0 m");
  if (f.start && f.end && !(*f.end > *f.start))
    throw InputError("time window", "end not after start", "an end time after the start time");
  if (f.depth_min && f.depth_max && *f.depth_max < *f.depth_min)
    throw InputError("depth range", util::number_text(*f.depth_min, 6) + " m to " + util::number_text(*f.depth_max, 6) + " m",
                     "a maximum depth >= the minimum depth");
  Polygon poly;
  if (!f.polygon.empty()) {
    for (const auto& v : f.polygon) bg::append(poly.outer(), Point(v[0], v[1]));
    bg::correct(poly);  // close the ring and orient it as Boost.Geometry expects
  }
  FilterResult r;
  r.catalog.kind = catalog.kind;
  r.catalog.crs = catalog.crs;
  r.catalog.description = catalog.description;
  r.counts.input = catalog.events.size();
  for (const auto& e : catalog.events) {
    if ((f.start && e.time < *f.start) || (f.end && e.time >= *f.end)) {
      ++r.counts.outside_time;
      continue;
    }
    if (!f.polygon.empty() && !bg::covered_by(Point(e.x, e.y), poly)) {
      ++r.counts.outside_polygon;
      continue;
    }
    if (!f.buffer_points.empty()) {
      const bool near = std::any_of(f.buffer_points.begin(), f.buffer_points.end(), [&](const auto& w) {
        return epicentral_distance(catalog.kind, e.x, e.y, w[0], w[1]) <= f.buffer_radius;
      });
      if (!near) {
        ++r.counts.outside_buffer;
        continue;
      }
    }
    if (f.depth_min || f.depth_max) {
      if (!e.depth) {
        ++r.counts.missing_depth;
        continue;
      }
      if ((f.depth_min && *e.depth < *f.depth_min) || (f.depth_max && *e.depth > *f.depth_max)) {
        ++r.counts.outside_depth;
        continue;
      }
    }
    if (!f.magnitude_types.empty()) {
      if (e.magnitude_type.empty() || !is_known_magnitude_type(e.magnitude_type)) {
        if (f.strict)
          throw InputError("magnitude type", e.magnitude_type,
                           "a recognised magnitude type (Mw, ML, mb, Md, ...) when filtering by type")
              .located(e.source.empty() ? "event " + e.id : e.source);
        ++r.counts.unknown_magnitude_type;
        continue;
      }
      const bool match = std::any_of(f.magnitude_types.begin(), f.magnitude_types.end(),
                                     [&](const std::string& w) { return magnitude_type_matches(e.magnitude_type, w); });
      if (!match) {
        ++r.counts.other_magnitude_type;
        continue;
      }
    }
    if (f.min_magnitude && e.magnitude < *f.min_magnitude) {
      ++r.counts.below_magnitude;
      continue;
    }
    r.catalog.events.push_back(e);
  }
  r.counts.kept = r.catalog.events.size();
  return r;
}

}  // namespace slipscreen::seismo
